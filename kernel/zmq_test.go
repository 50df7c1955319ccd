package kernel_test

import (
	"bytes"
	"context"
	"encoding/json"
	"image/png"
	"net"
	"os"
	"path/filepath"
	"runtime"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/go-zeromq/zmq4"
	"github.com/loligo-lab/loligo/kernel"
	"github.com/loligo-lab/loligo/kernel/internal/fakesession"
)

// freeConn picks five free loopback ports.
func freeConn(t testing.TB) kernel.ConnectionInfo {
	var p [5]int
	for i := range p {
		l, err := net.Listen("tcp", "127.0.0.1:0")
		if err != nil {
			t.Fatal(err)
		}
		p[i] = l.Addr().(*net.TCPAddr).Port
		l.Close()
	}
	return kernel.ConnectionInfo{Transport: "tcp", IP: "127.0.0.1", ShellPort: p[0], ControlPort: p[1],
		StdinPort: p[2], IOPubPort: p[3], HBPort: p[4], Key: testKey, SignatureScheme: "hmac-sha256"}
}

// TestShutdownNoLeak: a real kernel on loopback, with a silent TCP peer
// attached, shuts down within 1 s leaving at most the one goroutine zmq4
// leaves per closed PUB socket (TRANSPORT.md hazard 7).
func TestShutdownNoLeak(t *testing.T) {
	base := runtime.NumGoroutine()
	ci := freeConn(t)
	k, err := kernel.Start(kernel.Config{Conn: ci, Version: "t"}, fakesession.New())
	if err != nil {
		t.Fatal(err)
	}
	peer, err := net.Dial("tcp", net.JoinHostPort(ci.IP, itoa(ci.ShellPort)))
	if err != nil {
		t.Fatal(err)
	}
	defer peer.Close()
	start := time.Now()
	k.Shutdown()
	k.Wait()
	for runtime.NumGoroutine() > base+1 && time.Since(start) < time.Second {
		time.Sleep(10 * time.Millisecond)
	}
	if n := runtime.NumGoroutine(); n > base+1 {
		buf := make([]byte, 1<<16)
		t.Errorf("%d goroutines after shutdown, baseline %d (+1 allowed):\n%s", n, base, buf[:runtime.Stack(buf, true)])
	}
}

// TestPortInUse: a port already taken is an error naming that port.
func TestPortInUse(t *testing.T) {
	ci := freeConn(t)
	l, err := net.Listen("tcp", net.JoinHostPort(ci.IP, itoa(ci.IOPubPort)))
	if err != nil {
		t.Fatal(err)
	}
	defer l.Close()
	_, err = kernel.Start(kernel.Config{Conn: ci}, fakesession.New())
	if err == nil || !strings.Contains(err.Error(), "iopub_port") {
		t.Fatalf("error %v, want one naming iopub_port", err)
	}
}

// TestInstall: --print writes nothing; --prefix writes kernel.json with the
// kernelspec fields (Jupyter kernelspec docs, "Kernel specs") and logos
// that decode at their stated sizes.
func TestInstall(t *testing.T) {
	dir := t.TempDir()
	var out, errb bytes.Buffer
	if rc := kernel.InstallCommand([]string{"--prefix", dir, "--print"}, &out, &errb); rc != 0 {
		t.Fatalf("--print: rc %d: %s", rc, errb.String())
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 0 {
		t.Fatalf("--print wrote %v", ents)
	}
	if rc := kernel.InstallCommand([]string{"--prefix", dir, "--name", "sq", "--display-name", "Squid"}, &out, &errb); rc != 0 {
		t.Fatalf("install: rc %d: %s", rc, errb.String())
	}
	spec := filepath.Join(dir, "share", "jupyter", "kernels", "sq")
	var ks kernel.KernelSpec
	data, _ := os.ReadFile(filepath.Join(spec, "kernel.json"))
	if err := json.Unmarshal(data, &ks); err != nil {
		t.Fatal(err)
	}
	if !filepath.IsAbs(ks.Argv[0]) || !slices.Equal(ks.Argv[1:], []string{"kernel", "--connection-file", "{connection_file}"}) ||
		ks.DisplayName != "Squid" || ks.Language != "loligo" || ks.InterruptMode != "message" {
		t.Errorf("kernel.json: %+v", ks)
	}
	for _, n := range []int{32, 64} {
		f, err := os.Open(filepath.Join(spec, "logo-"+itoa(n)+"x"+itoa(n)+".png"))
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(f)
		f.Close()
		if err != nil || img.Bounds().Dx() != n || img.Bounds().Dy() != n {
			t.Errorf("logo %d: %v %v", n, err, img.Bounds())
		}
	}
	if rc := kernel.InstallCommand([]string{"--user", "--prefix", dir}, &out, &errb); rc == 0 {
		t.Error("--user with --prefix accepted")
	}
}

// goClient is a minimal Jupyter client over zmq4 for the benchmark.
type goClient struct {
	shell zmq4.Socket
	iopub zmq4.Socket
	r     *rig // for signing and decoding
}

func dialClient(b testing.TB, ci kernel.ConnectionInfo) *goClient {
	ctx := context.Background()
	c := &goClient{shell: zmq4.NewDealer(ctx), iopub: zmq4.NewSub(ctx), r: &rig{key: testKey}}
	if t, ok := b.(*testing.T); ok {
		c.r.t = t
	}
	addr := func(p int) string { return "tcp://" + net.JoinHostPort(ci.IP, itoa(p)) }
	if err := c.shell.Dial(addr(ci.ShellPort)); err != nil {
		b.Fatal(err)
	}
	if err := c.iopub.Dial(addr(ci.IOPubPort)); err != nil {
		b.Fatal(err)
	}
	c.iopub.SetOption(zmq4.OptionSubscribe, "")
	return c
}

// roundTrip sends one execute and waits for its reply and idle.
func (c *goClient) roundTrip(b testing.TB, code string) {
	frames, id := c.r.request("execute_request", map[string]any{"code": code})
	if err := c.shell.Send(zmq4.NewMsgFrom(frames[1:]...)); err != nil {
		b.Fatal(err)
	}
	if _, err := c.shell.Recv(); err != nil {
		b.Fatal(err)
	}
	for {
		m, err := c.iopub.Recv()
		if err != nil {
			b.Fatal(err)
		}
		if bytes.Contains(m.Frames[len(m.Frames)-3], []byte(id)) && bytes.Contains(m.Frames[len(m.Frames)-1], []byte(`"idle"`)) {
			return
		}
	}
}

// BenchmarkExecuteRoundTrip measures one trivial execute over loopback with
// a Go client: request, reply and idle; it reports the median and p99.
func BenchmarkExecuteRoundTrip(b *testing.B) {
	ci := freeConn(b)
	k, err := kernel.Start(kernel.Config{Conn: ci, Version: "bench"}, fakesession.New())
	if err != nil {
		b.Fatal(err)
	}
	defer func() { k.Shutdown(); k.Wait() }()
	c := dialClient(b, ci)
	defer c.shell.Close()
	defer c.iopub.Close()
	time.Sleep(200 * time.Millisecond) // PUB slow joiner (hazard 6): let the subscription arrive
	c.roundTrip(b, "warm")
	var rtt []time.Duration
	b.ResetTimer()
	for b.Loop() {
		t0 := time.Now()
		c.roundTrip(b, "1")
		rtt = append(rtt, time.Since(t0))
	}
	slices.Sort(rtt)
	b.ReportMetric(float64(rtt[len(rtt)/2].Microseconds())/1000, "median-ms")
	b.ReportMetric(float64(rtt[(len(rtt)-1)*99/100].Microseconds())/1000, "p99-ms")
}
