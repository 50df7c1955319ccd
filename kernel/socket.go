package kernel

import (
	"context"
	"errors"
	"fmt"
	"sync"
	"sync/atomic"
	"time"

	"github.com/go-zeromq/zmq4"
)

// SocketKind is the ZeroMQ pattern a kernel socket plays.
type SocketKind int

// The socket kinds a kernel opens.
const (
	Router SocketKind = iota // shell, control, stdin
	Pub                      // iopub
	Rep                      // heartbeat
)

// Socket is the little a kernel needs of a message socket. It keeps the
// ZeroMQ library behind one seam, so a fake can stand in for tests and the
// library can be swapped.
type Socket interface {
	// Recv returns the next user message's frames (ZMTP commands skipped).
	Recv() ([][]byte, error)
	// Send sends one multi-frame message; an empty message is refused.
	Send(frames [][]byte) error
	// Close closes the socket and unblocks Recv.
	Close() error
}

// Opener opens a socket of kind listening on host:port.
type Opener func(kind SocketKind, hostPort string) (Socket, error)

// zmqSocket adapts a zmq4 socket to Socket.
type zmqSocket struct {
	mu   sync.Mutex // zmq4 sockets are not documented as safe for concurrent Send
	sock zmq4.Socket
}

var errEmpty = errors.New("kernel: refusing to send an empty message")

func (z *zmqSocket) Recv() ([][]byte, error) {
	for {
		m, err := z.sock.Recv()
		if err != nil {
			return nil, err
		}
		// zmq4 hands a peer's PING and other ZMTP commands to Recv; they are
		// not messages of ours (TRANSPORT.md hazard 4).
		if m.Type == zmq4.CmdMsg || len(m.Frames) == 0 {
			continue
		}
		return m.Frames, nil
	}
}

func (z *zmqSocket) Send(frames [][]byte) error {
	if len(frames) == 0 {
		return errEmpty // zmq4 panics on an empty message (hazard 3)
	}
	z.mu.Lock()
	defer z.mu.Unlock()
	return z.sock.Send(zmq4.NewMsgFrom(frames...))
}

func (z *zmqSocket) Close() error { return z.sock.Close() }

// transportSeq numbers the guarded transports registered with zmq4, whose
// registry refuses a name twice.
var transportSeq atomic.Int64

// ZMQOpener returns an Opener backed by zmq4 over a guarded TCP transport:
// each connection is handed to zmq4 only after its ZMTP greeting arrives
// within greet, every write must finish within write or the peer is cut,
// and frames larger than maxBytes close the connection. ROUTER sends give
// up after sendTimeout.
func ZMQOpener(g Guard) (Opener, error) {
	name := fmt.Sprintf("loligo-tcp-%d", transportSeq.Add(1))
	if err := zmq4.RegisterTransport(name, &guardedTransport{g: g.withDefaults()}); err != nil {
		return nil, fmt.Errorf("kernel: cannot register transport: %w", err)
	}
	return func(kind SocketKind, hostPort string) (Socket, error) {
		ctx := context.Background()
		opts := []zmq4.Option{zmq4.WithTimeout(g.withDefaults().SendTimeout), zmq4.WithLogger(discardLogger())}
		var s zmq4.Socket
		switch kind {
		case Router:
			s = zmq4.NewRouter(ctx, opts...)
		case Pub:
			s = zmq4.NewPub(ctx, opts...)
		case Rep:
			s = zmq4.NewRep(ctx, opts...)
		default:
			return nil, fmt.Errorf("kernel: unknown socket kind %d", kind)
		}
		if err := s.Listen(name + "://" + hostPort); err != nil {
			s.Close()
			return nil, err
		}
		return &zmqSocket{sock: s}, nil
	}, nil
}

// Guard bounds what one TCP peer can cost the kernel. Zero fields take the
// defaults given.
type Guard struct {
	GreetingTimeout time.Duration // default 5 s: a silent peer is dropped after this
	WriteTimeout    time.Duration // default 3 s: a peer not taking a frame this long is cut
	SendTimeout     time.Duration // default 5 s: ROUTER send gives up after this
	MaxBytes        int64         // default 64 MiB: largest message accepted
	Logf            func(format string, args ...any)
}

// DefaultMaxBytes is the default size limit of one message, 64 MiB.
const DefaultMaxBytes = 64 << 20

func (g Guard) withDefaults() Guard {
	if g.GreetingTimeout <= 0 {
		g.GreetingTimeout = 5 * time.Second
	}
	if g.WriteTimeout <= 0 {
		g.WriteTimeout = 3 * time.Second
	}
	if g.SendTimeout <= 0 {
		g.SendTimeout = 5 * time.Second
	}
	if g.MaxBytes <= 0 {
		g.MaxBytes = DefaultMaxBytes
	}
	if g.Logf == nil {
		g.Logf = func(string, ...any) {}
	}
	return g
}
