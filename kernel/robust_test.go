package kernel_test

import (
	"strings"
	"testing"
	"time"
)

// TestSignatureChecks: a message with a bad or missing signature, or a
// replayed one, is dropped (messaging spec 5.3, "The Wire Protocol":
// the signature authenticates; replays are the kernel's to refuse), while
// a good one is answered.
func TestSignatureChecks(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	good, id := r.request("kernel_info_request", map[string]any{})
	tamper := func(f func([][]byte) [][]byte) [][]byte {
		c := make([][]byte, len(good))
		for i := range good {
			c[i] = append([]byte(nil), good[i]...)
		}
		return f(c)
	}
	bad := []struct {
		name   string
		frames [][]byte
	}{
		{"wrong signature", tamper(func(f [][]byte) [][]byte { f[2][0] ^= 1; return f })},
		{"missing signature", tamper(func(f [][]byte) [][]byte { f[2] = nil; return f })},
		{"content changed", tamper(func(f [][]byte) [][]byte { f[6] = []byte(`{"x":1}`); return f })},
		{"no delimiter", tamper(func(f [][]byte) [][]byte { f[1] = []byte("<IDS>"); return f })},
		{"too few frames", tamper(func(f [][]byte) [][]byte { return f[:5] })},
	}
	for _, b := range bad {
		r.shell.in <- b.frames
	}
	r.shell.in <- good
	rep := r.next(r.shell)
	if rep.Parent["msg_id"] != id {
		t.Fatalf("first reply is to %v, want the good request %s", rep.Parent["msg_id"], id)
	}
	r.shell.in <- good // replay: same signature again
	if !r.quiet(r.shell, 200*time.Millisecond) {
		t.Error("a replayed message was answered")
	}
}

// TestMalformedAndUnknown: bad JSON, missing fields and unknown types are
// dropped or ignored and the kernel keeps serving.
func TestMalformedAndUnknown(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	for _, frames := range [][][]byte{
		r.rawRequest(`{"msg_id":"1"`, `{}`),                                     // header not JSON
		r.rawRequest(`{"msg_id":"2","msg_type":""}`, `{}`),                      // no msg_type
		r.rawRequest(`{"msg_id":"3","msg_type":"execute_request"}`, `[1,2]`),    // content not an object
		r.rawRequest(`{"msg_id":"4","msg_type":"execute_request"}`, `{"code":`), // content cut off
	} {
		r.shell.in <- frames
	}
	unk, _ := r.request("frobnicate_request", map[string]any{})
	r.shell.in <- unk
	ok, id := r.request("execute_request", map[string]any{"code": "fine"})
	r.shell.in <- ok
	if rep := r.next(r.shell); rep.Parent["msg_id"] != id || rep.Content["status"] != "ok" {
		t.Fatalf("after malformed input got %v %v", rep.Type, rep.Content)
	}
}

// rawRequest signs arbitrary header and content text.
func (r *rig) rawRequest(header, content string) [][]byte {
	parts := [][]byte{[]byte(header), []byte("{}"), []byte("{}"), []byte(content)}
	return append([][]byte{[]byte("peer-1"), []byte("<IDS|MSG>"), sign(r.key, parts...)}, parts...)
}

// TestStopOnError: executes queued behind a failing one are answered
// "aborted" (messaging spec 5.3, execute_request.stop_on_error), the rest
// of the queue still served, and the next execute after the drain runs.
func TestStopOnError(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	first, id1 := r.request("execute_request", map[string]any{"code": "sleep 0.2\nfail stop"})
	second, id2 := r.request("execute_request", map[string]any{"code": "1"})
	info, id3 := r.request("kernel_info_request", map[string]any{})
	third, id4 := r.request("complete_request", map[string]any{"code": "pr", "cursor_pos": 2})
	fourth, id5 := r.request("execute_request", map[string]any{"code": "2"})
	for _, m := range [][][]byte{first, second, info, third, fourth} {
		r.shell.in <- m
	}
	got := map[any]string{}
	for range 5 {
		m := r.next(r.shell)
		got[m.Parent["msg_id"]], _ = m.Content["status"].(string)
	}
	want := map[any]string{id1: "error", id2: "aborted", id3: "ok", id4: "ok", id5: "aborted"}
	for k, v := range want {
		if got[k] != v {
			t.Errorf("status of %v = %q, want %q", k, got[k], v)
		}
	}
	after, id6 := r.request("execute_request", map[string]any{"code": "3"})
	r.shell.in <- after
	if m := r.next(r.shell); m.Parent["msg_id"] != id6 || m.Content["status"] != "ok" {
		t.Errorf("after the drain: %v", m.Content)
	}
}

// TestIOPubSequence: busy, execute_input, outputs, result, idle, all with
// the request as parent (messaging spec 5.3, "Messages on the IOPub
// channel"); a silent execute publishes only status.
func TestIOPubSequence(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	req, id := r.request("execute_request", map[string]any{"code": "print a\nshow d x\nupdate d y\nclear\nresult"})
	r.shell.in <- req
	var types []string
	for _, m := range r.iopubUntilIdle(id) {
		types = append(types, m.Type)
		if m.Type == "update_display_data" && m.Content["transient"].(map[string]any)["display_id"] != "d" {
			t.Errorf("update without display_id: %v", m.Content)
		}
		if !strings.HasPrefix(m.IDs[0], "kernel.") {
			t.Errorf("iopub topic %q", m.IDs[0])
		}
	}
	want := "status execute_input stream display_data update_display_data clear_output execute_result status"
	if strings.Join(types, " ") != want {
		t.Errorf("iopub: %s\nwant   %s", strings.Join(types, " "), want)
	}
	silent, sid := r.request("execute_request", map[string]any{"code": "print hidden\nvalue", "silent": true})
	r.shell.in <- silent
	if got := r.iopubUntilIdle(sid); len(got) != 2 {
		t.Errorf("silent execute published %d messages, want 2 (busy, idle)", len(got))
	}
	if rep := r.next(r.shell); rep.Content["execution_count"].(float64) != 1 {
		t.Errorf("silent execute changed execution_count: %v", rep.Content)
	}
}

// TestComms: comm_open to an unknown target is answered by comm_close on
// iopub; comm_msg and comm_close for unknown comms are ignored.
func TestComms(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	open, id := r.request("comm_open", map[string]any{"comm_id": "c1", "target_name": "nobody", "data": map[string]any{}})
	r.shell.in <- open
	var closed bool
	for _, m := range r.iopubUntilIdle(id) {
		closed = closed || (m.Type == "comm_close" && m.Content["comm_id"] == "c1")
	}
	if !closed {
		t.Error("no comm_close for an unknown target")
	}
	for _, typ := range []string{"comm_msg", "comm_close"} {
		m, _ := r.request(typ, map[string]any{"comm_id": "zz", "data": map[string]any{}})
		r.shell.in <- m
	}
	if !r.quiet(r.shell, 100*time.Millisecond) {
		t.Error("comm_msg/comm_close got a shell reply")
	}
}

// TestStopOnErrorSparesLaterRequests: an execute the client sends after it
// has seen the error reply was not queued behind the failure and must run
// (messaging spec 5.3: stop_on_error aborts the queued executes only).
func TestStopOnErrorSparesLaterRequests(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	// The race this guards showed with the reference client on a loaded
	// machine (the reply went out before the queue was drained); repeat a
	// few times so a regression has chances to show here too.
	for i := 0; i < 20; i++ {
		fail, _ := r.request("execute_request", map[string]any{"code": "fail stop"})
		r.shell.in <- fail
		if m := r.next(r.shell); m.Content["status"] != "error" {
			t.Fatalf("failing execute: %v", m.Content)
		}
		next, id := r.request("execute_request", map[string]any{"code": "1"})
		r.shell.in <- next
		if m := r.next(r.shell); m.Parent["msg_id"] != id || m.Content["status"] != "ok" {
			t.Fatalf("try %d: the execute sent after the error reply was %v", i, m.Content["status"])
		}
	}
}
