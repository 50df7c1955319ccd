package kernel_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/loligo-lab/loligo/kernel"
)

// TestHistory: tail, range and search (glob, unique, n) over this run's
// inputs, numbered with session 1 (messaging spec 5.3, "History").
func TestHistory(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	for _, code := range []string{"alpha 1", "beta", "alpha 1", "alpha 2"} {
		req, _ := r.request("execute_request", map[string]any{"code": code})
		r.shell.in <- req
		r.next(r.shell)
	}
	cases := []struct {
		name string
		req  map[string]any
		want string // inputs joined by '|'
	}{
		{"tail", map[string]any{"hist_access_type": "tail", "n": 2}, "alpha 1|alpha 2"},
		{"range", map[string]any{"hist_access_type": "range", "session": 1, "start": 2, "stop": 4}, "beta|alpha 1"},
		{"range session 0", map[string]any{"hist_access_type": "range", "session": 0, "start": 1, "stop": 2}, "alpha 1"},
		{"range other session", map[string]any{"hist_access_type": "range", "session": 7, "start": 1}, ""},
		{"search", map[string]any{"hist_access_type": "search", "pattern": "alpha*"}, "alpha 1|alpha 1|alpha 2"},
		{"search unique", map[string]any{"hist_access_type": "search", "pattern": "al?ha*", "unique": true}, "alpha 1|alpha 2"},
		{"search n", map[string]any{"hist_access_type": "search", "pattern": "*", "n": 1}, "alpha 2"},
	}
	for _, tc := range cases {
		req, _ := r.request("history_request", tc.req)
		r.shell.in <- req
		rep := r.next(r.shell)
		var got []string
		for _, e := range rep.Content["history"].([]any) {
			item := e.([]any)
			if item[0].(float64) != kernel.HistorySession {
				t.Errorf("%s: session %v", tc.name, item[0])
			}
			got = append(got, item[2].(string))
		}
		if strings.Join(got, "|") != tc.want {
			t.Errorf("%s: got %q, want %q", tc.name, strings.Join(got, "|"), tc.want)
		}
	}
}

// TestControlWhileBusy: control answers kernel_info and interrupt while a
// cell runs; the cell ends "Interrupted" and the next cell runs.
func TestControlWhileBusy(t *testing.T) {
	t.Parallel()
	r := newRig(t)
	long, id := r.request("execute_request", map[string]any{"code": "sleep 30"})
	r.shell.in <- long
	for m := r.next(r.iopub); m.Type != "execute_input"; m = r.next(r.iopub) {
	}
	info, _ := r.request("kernel_info_request", map[string]any{})
	r.control.in <- info
	if m := r.next(r.control); m.Type != "kernel_info_reply" {
		t.Fatalf("control answered %s", m.Type)
	}
	intr, _ := r.request("interrupt_request", map[string]any{})
	r.control.in <- intr
	if m := r.next(r.control); m.Type != "interrupt_reply" || m.Content["status"] != "ok" {
		t.Fatalf("interrupt reply %v %v", m.Type, m.Content)
	}
	rep := r.next(r.shell)
	if rep.Parent["msg_id"] != id || rep.Content["ename"] != "Interrupted" {
		t.Fatalf("interrupted cell replied %v", rep.Content)
	}
	next, _ := r.request("execute_request", map[string]any{"code": "again"})
	r.shell.in <- next
	if rep := r.next(r.shell); rep.Content["status"] != "ok" || rep.Content["execution_count"].(float64) != 2 {
		t.Errorf("after interrupt: %v", rep.Content)
	}
}

// TestShutdownOnControl: shutdown_reply on control, then the kernel stops.
func TestShutdownOnControl(t *testing.T) {
	t.Parallel()
	for _, restart := range []bool{false, true} {
		r := newRig(t)
		req, _ := r.request("shutdown_request", map[string]any{"restart": restart})
		r.control.in <- req
		rep := r.next(r.control)
		if rep.Type != "shutdown_reply" || rep.Content["restart"] != restart {
			t.Fatalf("got %s %v", rep.Type, rep.Content)
		}
		select {
		case <-r.k.Done():
		case <-time.After(time.Second): // the brief's bound: exit within 1 s
			t.Fatal("kernel did not stop within 1 s")
		}
	}
}

// TestConnectionFileErrors: each bad field gets an error naming it.
func TestConnectionFileErrors(t *testing.T) {
	t.Parallel()
	good := `"transport":"tcp","ip":"127.0.0.1","shell_port":1,"control_port":2,"stdin_port":3,"iopub_port":4,"hb_port":5,"key":"k"`
	cases := []struct{ name, body, want string }{
		{"scheme", `{` + good + `,"signature_scheme":"hmac-md5"}`, "signature_scheme"},
		{"transport", `{"transport":"ipc","ip":"127.0.0.1"}`, "transport"},
		{"ip", strings.Replace(`{`+good+`,"signature_scheme":"hmac-sha256"}`, "127.0.0.1", "localhost:1", 1), "ip"},
		{"missing port", strings.Replace(`{`+good+`,"signature_scheme":"hmac-sha256"}`, `"hb_port":5`, `"hb_port":0`, 1), "hb_port"},
		{"json", `{"transport":`, "not valid JSON"},
		{"ok", `{` + good + `,"signature_scheme":"hmac-sha256"}`, ""},
	}
	dir := t.TempDir()
	for _, tc := range cases {
		p := filepath.Join(dir, strings.ReplaceAll(tc.name, " ", "_")+".json")
		os.WriteFile(p, []byte(tc.body), 0o600)
		_, err := kernel.ReadConnectionFile(p)
		switch {
		case tc.want == "" && err != nil:
			t.Errorf("%s: %v", tc.name, err)
		case tc.want != "" && (err == nil || !strings.Contains(err.Error(), tc.want) || !strings.HasPrefix(err.Error(), "kernel: ")):
			t.Errorf("%s: error %v, want one naming %q", tc.name, err, tc.want)
		}
	}
}
