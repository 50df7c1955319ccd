// Package kernel speaks the open Jupyter messaging protocol (version 5.3)
// for a Session it is given, over ZeroMQ sockets described by a connection
// file. It knows nothing of the language it serves.
//
//	socket   pattern  carries
//	shell    ROUTER   execute, complete, inspect, is_complete, history, comm_*
//	control  ROUTER   kernel_info, interrupt, shutdown (served while a cell runs)
//	stdin    ROUTER   bound and drained; input is never requested
//	iopub    PUB      status, execute_input, stream, display, result, error
//	hb       REP      heartbeat echo
//
// Every message is signed with HMAC-SHA256 over header, parent_header,
// metadata and content; a bad, missing or replayed signature drops the
// message. Cells run one at a time on one goroutine; an interrupt cancels
// the running cell's context and the reply's ename is "Interrupted".
// History holds this run's inputs as session 1 (see HistorySession).
//
// The zmq4 library sits behind Socket and Opener. ZMQOpener wraps its TCP
// transport (see Guard): a peer is handed to zmq4 only after its ZMTP
// greeting, writes have deadlines so one stalled subscriber cannot hold up
// iopub, and frames past the size limit close the connection before zmq4
// allocates them.
//
// ServeCommand and InstallCommand implement `loligo kernel` and
// `loligo install`. Loligo is a research tool, not for clinical use.
package kernel
