package kernel

import (
	"context"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"log"
	"net"
	"sync"
	"time"

	"github.com/go-zeromq/zmq4/transport"
)

// guardedTransport is TCP with the bounds of a Guard (TRANSPORT.md hazards
// 1 and 2): zmq4 runs the ZMTP handshake inside its single accept loop with
// no deadline, and writes to each PUB subscriber in turn from one goroutine.
type guardedTransport struct{ g Guard }

var _ transport.Transport = (*guardedTransport)(nil)

func (t *guardedTransport) Dial(ctx context.Context, d transport.Dialer, addr string) (net.Conn, error) {
	c, err := d.DialContext(ctx, "tcp", addr)
	if err != nil {
		return nil, err
	}
	return newGuardedConn(c, nil, t.g), nil
}

func (t *guardedTransport) Listen(ctx context.Context, addr string) (net.Listener, error) {
	l, err := net.Listen("tcp", addr)
	if err != nil {
		return nil, err
	}
	gl := &gatedListener{Listener: l, g: t.g, ready: make(chan net.Conn), done: make(chan struct{}),
		wait: make(map[net.Conn]struct{})}
	gl.wg.Add(1)
	go gl.acceptLoop()
	return gl, nil
}

func (t *guardedTransport) Addr(ep string) (string, error) {
	host, port, err := net.SplitHostPort(ep)
	if err != nil {
		return "", fmt.Errorf("kernel: bad endpoint %q: %w", ep, err)
	}
	return net.JoinHostPort(host, port), nil
}

// gatedListener accepts TCP connections on its own goroutine and hands one
// to zmq4 only once the peer's 10-byte ZMTP signature has arrived.
type gatedListener struct {
	net.Listener
	g     Guard
	ready chan net.Conn
	done  chan struct{}
	once  sync.Once
	wg    sync.WaitGroup
	mu    sync.Mutex
	wait  map[net.Conn]struct{} // connections still in greet, closed on Close
}

func (l *gatedListener) acceptLoop() {
	defer l.wg.Done()
	for {
		c, err := l.Listener.Accept()
		if err != nil {
			select {
			case <-l.done:
				return
			default:
			}
			if ne, ok := err.(net.Error); ok && ne.Timeout() {
				continue
			}
			time.Sleep(10 * time.Millisecond) // e.g. out of file descriptors
			continue
		}
		l.mu.Lock()
		l.wait[c] = struct{}{}
		l.mu.Unlock()
		l.wg.Add(1)
		go l.greet(c)
	}
}

// greet waits for the ZMTP signature (0xFF, 8 bytes, 0x7F) within the
// greeting timeout and hands the connection over with those bytes replayed.
func (l *gatedListener) greet(c net.Conn) {
	defer l.wg.Done()
	defer func() { l.mu.Lock(); delete(l.wait, c); l.mu.Unlock() }()
	var sig [10]byte
	c.SetReadDeadline(time.Now().Add(l.g.GreetingTimeout))
	_, err := io.ReadFull(c, sig[:])
	c.SetReadDeadline(time.Time{})
	if err != nil || sig[0] != 0xFF || sig[9]&1 != 1 {
		l.g.Logf("dropping TCP peer %s: no ZMTP greeting within %v", c.RemoteAddr(), l.g.GreetingTimeout)
		c.Close()
		return
	}
	gc := newGuardedConn(c, sig[:], l.g)
	select {
	case l.ready <- gc:
	case <-l.done:
		c.Close()
	}
}

func (l *gatedListener) Accept() (net.Conn, error) {
	select {
	case c := <-l.ready:
		return c, nil
	case <-l.done:
		return nil, net.ErrClosed
	}
}

func (l *gatedListener) Close() error {
	var err error
	l.once.Do(func() {
		close(l.done)
		err = l.Listener.Close()
		l.mu.Lock()
		for c := range l.wait {
			c.Close()
		}
		l.mu.Unlock()
		l.wg.Wait()
	})
	return err
}

// guardedConn puts a deadline on every write (closing the connection when
// it passes, since zmq4 ignores timeout errors) and reads the ZMTP frame
// headers as they pass so that an oversized message is refused before zmq4
// allocates its body.
type guardedConn struct {
	net.Conn
	g       Guard
	prefix  []byte
	wmu     sync.Mutex
	scan    frameScanner
	closeMu sync.Once
}

func newGuardedConn(c net.Conn, prefix []byte, g Guard) *guardedConn {
	return &guardedConn{Conn: c, g: g, prefix: prefix, scan: frameScanner{skip: 64, limit: g.MaxBytes}}
}

func (c *guardedConn) Read(p []byte) (int, error) {
	var n int
	var err error
	if len(c.prefix) > 0 {
		n = copy(p, c.prefix)
		c.prefix = c.prefix[n:]
	} else {
		n, err = c.Conn.Read(p)
	}
	if serr := c.scan.feed(p[:n]); serr != nil {
		c.g.Logf("closing TCP peer %s: %v", c.RemoteAddr(), serr)
		c.Close()
		return 0, serr
	}
	return n, err
}

func (c *guardedConn) Write(p []byte) (int, error) {
	c.wmu.Lock()
	defer c.wmu.Unlock()
	c.Conn.SetWriteDeadline(time.Now().Add(c.g.WriteTimeout))
	n, err := c.Conn.Write(p)
	if err != nil {
		var ne net.Error
		if errors.As(err, &ne) && ne.Timeout() {
			c.g.Logf("closing TCP peer %s: it took no data for %v", c.RemoteAddr(), c.g.WriteTimeout)
		}
		c.Close()
		// A plain error, not a timeout, so that zmq4 drops the connection.
		return n, fmt.Errorf("kernel: write to %s failed: %s", c.RemoteAddr(), err)
	}
	return n, nil
}

// frameScanner follows ZMTP 3.0 framing (RFC 23): after the 64-byte
// greeting, each frame is a flags byte, a 1- or 8-byte size and the body.
type frameScanner struct {
	skip  int64 // bytes still to pass before the next frame header
	limit int64 // largest message, summed over its frames
	hdr   [9]byte
	nhdr  int
	msg   int64 // bytes of the current message so far
}

var errTooBig = errors.New("kernel: message exceeds the size limit; send smaller messages or raise --max-message-bytes")

func (s *frameScanner) feed(p []byte) error {
	for len(p) > 0 {
		if s.skip > 0 {
			k := min(int64(len(p)), s.skip)
			s.skip -= k
			p = p[k:]
			continue
		}
		s.hdr[s.nhdr] = p[0]
		s.nhdr++
		p = p[1:]
		if err := s.header(); err != nil {
			return err
		}
	}
	return nil
}

// header acts once a frame header is complete.
func (s *frameScanner) header() error {
	flags := s.hdr[0]
	need := 2
	if flags&0x02 != 0 {
		need = 9
	}
	if s.nhdr < need {
		return nil
	}
	size := int64(s.hdr[1])
	if need == 9 {
		u := binary.BigEndian.Uint64(s.hdr[1:9])
		if u > uint64(s.limit) {
			return errTooBig
		}
		size = int64(u)
	}
	s.nhdr = 0
	s.skip = size
	if flags&0x04 != 0 { // command frame: not part of a message
		return nil
	}
	s.msg += size
	if s.msg > s.limit {
		return errTooBig
	}
	if flags&0x01 == 0 { // last frame of the message
		s.msg = 0
	}
	return nil
}

func (c *guardedConn) Close() error {
	var err error
	c.closeMu.Do(func() { err = c.Conn.Close() })
	return err
}

// discardLogger silences zmq4's own log lines; ours say the same via Guard.Logf.
func discardLogger() *log.Logger { return log.New(io.Discard, "", 0) }
