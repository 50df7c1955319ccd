package kernel

import (
	"encoding/binary"
	"errors"
	"net"
	"testing"
	"time"

	"github.com/go-zeromq/zmq4"
)

// TestHMACVector checks the signer against RFC 4231 §4.3 (test case 2:
// key "Jefe"), the data split across the four signed frames since the
// protocol signs their concatenation.
func TestHMACVector(t *testing.T) {
	s := newSigner("Jefe", 4)
	got := s.sign([4][]byte{[]byte("what do ya"), []byte(" want "), []byte("for "), []byte("nothing?")})
	const want = "5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843" // RFC 4231 §4.3
	if string(got) != want {
		t.Fatalf("HMAC-SHA256 = %s, want %s", got, want)
	}
}

// TestReplayWindowBounded: the seen set never holds more than its window.
func TestReplayWindowBounded(t *testing.T) {
	s := newSigner("k", 8)
	for i := range 100 {
		parts := [4][]byte{{byte(i)}, nil, nil, nil}
		if err := s.verify(s.sign(parts), parts); err != nil {
			t.Fatal(err)
		}
		if len(s.seen) > 8 {
			t.Fatalf("seen set grew to %d entries, window is 8", len(s.seen))
		}
	}
	old := [4][]byte{{99}, nil, nil, nil}
	if err := s.verify(s.sign(old), old); !errors.Is(err, errReplay) {
		t.Errorf("recent replay accepted: %v", err)
	}
}

// TestDecodeSizeLimit: a message over the limit is refused with its size.
func TestDecodeSizeLimit(t *testing.T) {
	s := newSigner("", 4)
	frames, _ := encode(nil, newHeader("x_request", "s", "u"), nil, map[string]string{"pad": string(make([]byte, 2000))}, s)
	if _, err := decode(frames, s, 1000); err == nil {
		t.Fatal("oversized message accepted")
	}
	if _, err := decode(frames, s, 1<<20); err != nil {
		t.Fatalf("message within the limit refused: %v", err)
	}
}

// TestFrameScanner follows ZMTP 3.0 framing (RFC 23/ZMTP: flags bit 0 MORE,
// bit 1 LONG, bit 2 COMMAND) and cuts a declared size over the limit before
// any body arrives.
func TestFrameScanner(t *testing.T) {
	greeting := make([]byte, 64)
	long := func(flags byte, n uint64) []byte {
		b := make([]byte, 9)
		b[0] = flags | 0x02
		binary.BigEndian.PutUint64(b[1:], n)
		return b
	}
	cases := []struct {
		name   string
		stream [][]byte
		ok     bool
	}{
		{"short frames", [][]byte{greeting, {0x01, 3}, []byte("abc"), {0x00, 2}, []byte("de")}, true},
		{"command ignored in sum", [][]byte{greeting, long(0x04, 90), make([]byte, 90), {0x00, 50}, make([]byte, 50)}, true},
		{"declared huge", [][]byte{greeting, long(0x00, 1<<40)}, false},
		{"sum over limit", [][]byte{greeting, {0x01, 60}, make([]byte, 60), {0x00, 60}}, false},
	}
	for _, tc := range cases {
		s := frameScanner{skip: 64, limit: 100}
		var err error
		for _, chunk := range tc.stream {
			for i := range chunk { // byte by byte: headers may straddle reads
				if err == nil {
					err = s.feed(chunk[i : i+1])
				}
			}
		}
		if (err == nil) != tc.ok {
			t.Errorf("%s: err %v, want ok=%v", tc.name, err, tc.ok)
		}
	}
}

// cmdSocket is a zmq4.Socket whose Recv yields a ZMTP command first
// (TRANSPORT.md hazard 4: zmq4 hands a peer's PING to Recv).
type cmdSocket struct {
	zmq4.Socket
	msgs []zmq4.Msg
	sent []zmq4.Msg
}

func (c *cmdSocket) Recv() (zmq4.Msg, error) {
	if len(c.msgs) == 0 {
		return zmq4.Msg{}, errors.New("done")
	}
	m := c.msgs[0]
	c.msgs = c.msgs[1:]
	return m, nil
}

func (c *cmdSocket) Send(m zmq4.Msg) error { c.sent = append(c.sent, m); return nil }

// TestCommandsSkippedAndEmptyRefused covers hazards 3 and 4.
func TestCommandsSkippedAndEmptyRefused(t *testing.T) {
	ping := zmq4.Msg{Frames: [][]byte{[]byte("PING")}, Type: zmq4.CmdMsg}
	fake := &cmdSocket{msgs: []zmq4.Msg{ping, zmq4.NewMsgString("user")}}
	z := &zmqSocket{sock: fake}
	f, err := z.Recv()
	if err != nil || len(f) != 1 || string(f[0]) != "user" {
		t.Fatalf("Recv = %q, %v; want the user message after the command", f, err)
	}
	if err := z.Send(nil); !errors.Is(err, errEmpty) || len(fake.sent) != 0 {
		t.Errorf("empty send: err %v, %d sent", err, len(fake.sent))
	}
}

// TestSilentPeerDoesNotBlockAccept covers hazard 2 at the listener: a peer
// that says nothing is dropped after the greeting timeout, and a peer that
// greets meanwhile is handed over at once.
func TestSilentPeerDoesNotBlockAccept(t *testing.T) {
	tr := &guardedTransport{g: Guard{GreetingTimeout: 300 * time.Millisecond}.withDefaults()}
	l, err := tr.Listen(t.Context(), "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	defer l.Close()
	silent, _ := net.Dial("tcp", l.Addr().String())
	defer silent.Close()
	talker, _ := net.Dial("tcp", l.Addr().String())
	defer talker.Close()
	talker.Write([]byte{0xFF, 0, 0, 0, 0, 0, 0, 0, 1, 0x7F})
	got := make(chan net.Conn, 1)
	go func() { c, _ := l.Accept(); got <- c }()
	select {
	case c := <-got:
		buf := make([]byte, 10)
		if n, _ := c.Read(buf); n != 10 || buf[0] != 0xFF { // greeting replayed to zmq4
			t.Errorf("replayed greeting %x", buf[:n])
		}
		c.Close()
	case <-time.After(2 * time.Second): // well beyond the 300 ms the silent peer may hold
		t.Fatal("a greeting peer was not handed over while a silent one waited")
	}
	silent.SetReadDeadline(time.Now().Add(2 * time.Second))
	if _, err := silent.Read(make([]byte, 1)); err == nil {
		t.Error("silent peer was not dropped")
	}
}

// TestStalledWriterIsCut covers hazard 1 at the connection: a peer that
// stops reading is closed once a write exceeds the write timeout.
func TestStalledWriterIsCut(t *testing.T) {
	a, b := net.Pipe() // synchronous: writes block until b reads, which it never does
	defer b.Close()
	c := newGuardedConn(a, nil, Guard{WriteTimeout: 100 * time.Millisecond}.withDefaults())
	start := time.Now()
	_, err := c.Write([]byte("frame"))
	var ne net.Error
	if err == nil || (errors.As(err, &ne) && ne.Timeout()) {
		t.Fatalf("write error %v; want a non-timeout error so zmq4 drops the peer", err)
	}
	if d := time.Since(start); d > 2*time.Second {
		t.Errorf("write took %v with a 100 ms timeout", d)
	}
	if _, err := a.Write([]byte("x")); err == nil {
		t.Error("connection still open after the cut")
	}
}
