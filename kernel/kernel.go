package kernel

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"log/slog"
	"os/user"
	"sync"

	"github.com/google/uuid"
)

// Config says how a kernel is reached and how it behaves. Zero fields take
// the defaults given.
type Config struct {
	Conn          ConnectionInfo
	Version       string       // implementation_version in kernel_info_reply
	InterruptMode string       // "message" (default) or "signal"; informs logs only
	Guard         Guard        // TCP bounds and size limit; see Guard
	Logger        *slog.Logger // default: discard
	Open          Opener       // default: ZMQOpener(Guard)
	QueueLen      int          // shell requests buffered while a cell runs; default 256
	ReplayWindow  int          // signatures remembered against replay; default 65536
}

// Kernel serves one Session over the five sockets of a connection file.
type Kernel struct {
	cfg     Config
	log     *slog.Logger
	sess    Session
	sign    *signer
	id      string // our session id, in every header we write
	user    string
	shell   Socket
	control Socket
	stdin   Socket
	iopub   Socket
	hb      Socket

	queue  chan *message // shell requests for the execution goroutine
	hist   history
	count  int // execution_count, owned by the execution goroutine
	abortN int // requests to abort after a stop_on_error failure; owned by the execution goroutine

	cellMu     sync.Mutex
	cellCancel context.CancelFunc // cancels the running cell; nil when idle

	done     chan struct{} // closed on shutdown
	stopOnce sync.Once
	wg       sync.WaitGroup
}

// Start binds the five sockets and serves s until a shutdown_request
// arrives or Shutdown is called; Wait blocks until then.
func Start(cfg Config, s Session) (*Kernel, error) {
	if err := cfg.Conn.Validate(); err != nil {
		return nil, err
	}
	cfg = cfg.withDefaults()
	k := &Kernel{cfg: cfg, log: cfg.Logger, sess: s, sign: newSigner(cfg.Conn.Key, cfg.ReplayWindow),
		id: uuid.NewString(), user: userName(), queue: make(chan *message, cfg.QueueLen), done: make(chan struct{})}
	if err := k.bind(); err != nil {
		return nil, err
	}
	k.wg.Add(5)
	go k.serveRouter(k.shell, "shell", k.onShell)
	go k.serveRouter(k.control, "control", k.onControl)
	go k.serveRouter(k.stdin, "stdin", func(m *message) {
		k.log.Debug("ignoring stdin message; this kernel never asks for input", "msg_type", m.Header.MsgType)
	})
	go k.serveHeartbeat()
	go k.executor()
	return k, nil
}

func (c Config) withDefaults() Config {
	if c.Logger == nil {
		c.Logger = slog.New(slog.DiscardHandler)
	}
	if c.InterruptMode == "" {
		c.InterruptMode = "message"
	}
	if c.QueueLen <= 0 {
		c.QueueLen = 256
	}
	if c.ReplayWindow <= 0 {
		c.ReplayWindow = 1 << 16
	}
	if c.Guard.Logf == nil {
		l := c.Logger
		c.Guard.Logf = func(f string, a ...any) { l.Warn(fmt.Sprintf(f, a...)) }
	}
	c.Guard = c.Guard.withDefaults()
	return c
}

func userName() string {
	if u, err := user.Current(); err == nil {
		return u.Username
	}
	return "loligo"
}

// bind opens the sockets, closing those already open if one fails.
func (k *Kernel) bind() error {
	open := k.cfg.Open
	if open == nil {
		var err error
		if open, err = ZMQOpener(k.cfg.Guard); err != nil {
			return err
		}
	}
	ci := k.cfg.Conn
	specs := []struct {
		dst  *Socket
		kind SocketKind
		name string
		port int
	}{
		{&k.shell, Router, "shell_port", ci.ShellPort}, {&k.control, Router, "control_port", ci.ControlPort},
		{&k.stdin, Router, "stdin_port", ci.StdinPort}, {&k.iopub, Pub, "iopub_port", ci.IOPubPort},
		{&k.hb, Rep, "hb_port", ci.HBPort},
	}
	for i, sp := range specs {
		s, err := open(sp.kind, ci.hostPort(sp.port))
		if err != nil {
			for _, prev := range specs[:i] {
				(*prev.dst).Close()
			}
			return fmt.Errorf("kernel: cannot listen on %s %d at %s: %v; choose a free port or let the front end pick one", sp.name, sp.port, ci.IP, err)
		}
		*sp.dst = s
	}
	return nil
}

// Done is closed when the kernel has begun shutting down.
func (k *Kernel) Done() <-chan struct{} { return k.done }

// Wait blocks until the kernel has shut down and every goroutine it started
// has returned.
func (k *Kernel) Wait() { <-k.done; k.wg.Wait() }

// Shutdown stops the kernel: it cancels a running cell and closes the
// sockets. It is safe to call more than once and from any goroutine.
func (k *Kernel) Shutdown() {
	k.stopOnce.Do(func() {
		close(k.done)
		k.Interrupt()
		for _, s := range []Socket{k.shell, k.control, k.stdin, k.hb} {
			s.Close()
		}
		// iopub last, so that a shutdown_reply just published gets out.
		k.iopub.Close()
	})
}

// Interrupt cancels the running cell's context, if a cell is running.
func (k *Kernel) Interrupt() {
	k.cellMu.Lock()
	defer k.cellMu.Unlock()
	if k.cellCancel != nil {
		k.cellCancel()
	}
}

// serveRouter reads requests from a ROUTER socket until it is closed.
func (k *Kernel) serveRouter(s Socket, name string, handle func(*message)) {
	defer k.wg.Done()
	for {
		frames, err := s.Recv()
		if err != nil {
			if k.stopping() {
				return
			}
			k.log.Warn("receive failed; continuing", "socket", name, "err", err)
			continue
		}
		m, err := decode(frames, k.sign, k.cfg.Guard.MaxBytes)
		if err != nil {
			k.log.Warn("dropping message", "socket", name, "err", err)
			continue
		}
		k.log.Debug("request", "socket", name, "msg_type", m.Header.MsgType)
		handle(m)
	}
}

func (k *Kernel) stopping() bool {
	select {
	case <-k.done:
		return true
	default:
		return false
	}
}

// serveHeartbeat echoes every ping back unchanged.
func (k *Kernel) serveHeartbeat() {
	defer k.wg.Done()
	for {
		frames, err := k.hb.Recv()
		if err != nil {
			if k.stopping() {
				return
			}
			continue
		}
		if err := k.hb.Send(frames); err != nil && !errors.Is(err, errEmpty) {
			k.log.Debug("heartbeat echo failed", "err", err)
		}
	}
}

// reply sends a reply to req on sock.
func (k *Kernel) reply(sock Socket, req *message, msgType string, content any) {
	k.send(sock, req.Identities, req, msgType, content)
}

// publish sends msgType on iopub with req as parent (req may be nil).
func (k *Kernel) publish(req *message, msgType string, content any) {
	topic := [][]byte{[]byte("kernel." + k.id + "." + msgType)}
	k.send(k.iopub, topic, req, msgType, content)
}

func (k *Kernel) send(sock Socket, ids [][]byte, req *message, msgType string, content any) {
	var parent json.RawMessage
	if req != nil {
		parent = req.RawHeader
	}
	frames, err := encode(ids, newHeader(msgType, k.id, k.user), parent, content, k.sign)
	if err == nil {
		err = sock.Send(frames)
	}
	if err != nil && !k.stopping() {
		k.log.Warn("send failed", "msg_type", msgType, "err", err)
	}
}

// status publishes busy or idle for req.
func (k *Kernel) status(req *message, state string) {
	k.publish(req, "status", map[string]string{"execution_state": state})
}
