package kernel_test

import (
	"crypto/hmac"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"sync"
	"testing"
	"time"

	"github.com/google/uuid"
	"github.com/loligo-lab/loligo/kernel"
	"github.com/loligo-lab/loligo/kernel/internal/fakesession"
)

// fakeSocket is a Socket fed and read through channels.
type fakeSocket struct {
	in     chan [][]byte
	out    chan [][]byte
	once   sync.Once
	closed chan struct{}
}

func newFakeSocket() *fakeSocket {
	return &fakeSocket{in: make(chan [][]byte, 64), out: make(chan [][]byte, 1024), closed: make(chan struct{})}
}

func (f *fakeSocket) Recv() ([][]byte, error) {
	select {
	case m := <-f.in:
		return m, nil
	case <-f.closed:
		return nil, errors.New("fake: closed")
	}
}

func (f *fakeSocket) Send(frames [][]byte) error {
	if len(frames) == 0 {
		return errors.New("fake: empty message")
	}
	select {
	case f.out <- frames:
	case <-f.closed:
	}
	return nil
}

func (f *fakeSocket) Close() error { f.once.Do(func() { close(f.closed) }); return nil }

// rig is a kernel over fake sockets plus a client that signs with key.
type rig struct {
	t                            *testing.T
	k                            *kernel.Kernel
	key                          string
	shell, control, iopub, stdin *fakeSocket
}

const testKey = "a0436f6c-1916-498b-8eb9-e81ab9368e84" // invented

func newRig(t *testing.T) *rig {
	t.Helper()
	r := &rig{t: t, key: testKey, shell: newFakeSocket(), control: newFakeSocket(),
		iopub: newFakeSocket(), stdin: newFakeSocket()}
	socks := map[int]*fakeSocket{5001: r.shell, 5002: r.control, 5003: r.stdin, 5004: r.iopub, 5005: newFakeSocket()}
	open := func(kind kernel.SocketKind, hp string) (kernel.Socket, error) {
		for p, s := range socks {
			if hp == "127.0.0.1:"+itoa(p) {
				return s, nil
			}
		}
		return nil, errors.New("fake: no socket for " + hp)
	}
	ci := kernel.ConnectionInfo{Transport: "tcp", IP: "127.0.0.1", ShellPort: 5001, ControlPort: 5002,
		StdinPort: 5003, IOPubPort: 5004, HBPort: 5005, Key: testKey, SignatureScheme: "hmac-sha256"}
	k, err := kernel.Start(kernel.Config{Conn: ci, Version: "9.9.9", Open: open}, fakesession.New())
	if err != nil {
		t.Fatal(err)
	}
	r.k = k
	t.Cleanup(func() { k.Shutdown(); k.Wait() })
	return r
}

func itoa(n int) string { b, _ := json.Marshal(n); return string(b) }

// sign is HMAC-SHA256 over the four frames, hex encoded (messaging spec 5.3,
// "The Wire Protocol"), computed independently of the kernel's signer.
func sign(key string, parts ...[]byte) []byte {
	m := hmac.New(sha256.New, []byte(key))
	for _, p := range parts {
		m.Write(p)
	}
	return []byte(hex.EncodeToString(m.Sum(nil)))
}

// request builds a signed request of msgType with content and returns its
// frames and msg_id.
func (r *rig) request(msgType string, content any) ([][]byte, string) {
	id := uuid.NewString()
	h, _ := json.Marshal(map[string]string{"msg_id": id, "session": "client-1", "username": "tester",
		"date": "2026-01-01T00:00:00.000000Z", "msg_type": msgType, "version": "5.3"})
	c, _ := json.Marshal(content)
	parts := [][]byte{h, []byte("{}"), []byte("{}"), c}
	frames := [][]byte{[]byte("peer-1"), []byte("<IDS|MSG>"), sign(r.key, parts...)}
	return append(frames, parts...), id
}

// wireMsg is a decoded outgoing message.
type wireMsg struct {
	IDs     []string
	Header  map[string]any
	Parent  map[string]any
	Content map[string]any
	Type    string
}

func (r *rig) decode(frames [][]byte) wireMsg {
	r.t.Helper()
	d := -1
	for i, f := range frames {
		if string(f) == "<IDS|MSG>" {
			d = i
		}
	}
	if d < 0 || len(frames) < d+6 {
		r.t.Fatalf("malformed outgoing message: %q", frames)
	}
	if got, want := string(frames[d+1]), string(sign(r.key, frames[d+2:d+6]...)); got != want {
		r.t.Fatalf("outgoing signature %s, want %s", got, want)
	}
	var m wireMsg
	for _, id := range frames[:d] {
		m.IDs = append(m.IDs, string(id))
	}
	for i, dst := range []*map[string]any{&m.Header, &m.Parent, nil, &m.Content} {
		if dst != nil {
			if err := json.Unmarshal(frames[d+2+i], dst); err != nil {
				r.t.Fatalf("frame %d: %v", i, err)
			}
		}
	}
	m.Type, _ = m.Header["msg_type"].(string)
	return m
}

// next returns the next message on s within 5 s (a generous bound for a
// loaded 2-core machine; nothing here should take more than milliseconds).
func (r *rig) next(s *fakeSocket) wireMsg {
	r.t.Helper()
	select {
	case f := <-s.out:
		return r.decode(f)
	case <-time.After(5 * time.Second):
		r.t.Fatal("no message within 5 s")
	}
	return wireMsg{}
}

// quiet reports whether s stays silent for d.
func (r *rig) quiet(s *fakeSocket, d time.Duration) bool {
	select {
	case f := <-s.out:
		r.t.Logf("unexpected: %q", f)
		return false
	case <-time.After(d):
		return true
	}
}

// iopubUntilIdle collects iopub messages with parent msgID until its idle.
func (r *rig) iopubUntilIdle(msgID string) []wireMsg {
	r.t.Helper()
	var out []wireMsg
	for {
		m := r.next(r.iopub)
		if m.Parent["msg_id"] != msgID {
			continue
		}
		out = append(out, m)
		if m.Type == "status" && m.Content["execution_state"] == "idle" {
			return out
		}
	}
}
