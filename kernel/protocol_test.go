package kernel_test

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"testing"
	"time"
)

var update = flag.Bool("update", false, "rewrite the golden reply files in testdata/golden")

// TestReplyShapes sends each request type over fake sockets and compares
// the reply content with a golden JSON file. The goldens were recorded and
// then checked by hand against the messaging spec 5.3 ("Messages on the
// shell (ROUTER/DEALER) channel"): field names, types and status values.
func TestReplyShapes(t *testing.T) {
	cases := []struct {
		name, msgType, replyType string
		content                  map[string]any
	}{
		{"kernel_info", "kernel_info_request", "kernel_info_reply", map[string]any{}},
		{"execute_ok", "execute_request", "execute_reply", map[string]any{"code": "hello", "silent": false,
			"store_history": true, "user_expressions": map[string]any{"u": "seven", "v": "fail bad"}, "allow_stdin": false}},
		{"execute_error", "execute_request", "execute_reply", map[string]any{"code": "fail boom", "stop_on_error": false}},
		{"complete", "complete_request", "complete_reply", map[string]any{"code": "x = pri", "cursor_pos": 7}},
		{"complete_none", "complete_request", "complete_reply", map[string]any{"code": "zzz", "cursor_pos": 3}},
		{"inspect_0", "inspect_request", "inspect_reply", map[string]any{"code": "sleep", "cursor_pos": 1, "detail_level": 0}},
		{"inspect_1", "inspect_request", "inspect_reply", map[string]any{"code": "sleep", "cursor_pos": 1, "detail_level": 1}},
		{"inspect_missing", "inspect_request", "inspect_reply", map[string]any{"code": "nothing", "cursor_pos": 1}},
		{"is_complete_incomplete", "is_complete_request", "is_complete_reply", map[string]any{"code": "print a \\"}},
		{"is_complete_invalid", "is_complete_request", "is_complete_reply", map[string]any{"code": "} x"}},
		{"comm_info", "comm_info_request", "comm_info_reply", map[string]any{}},
		{"history_empty", "history_request", "history_reply", map[string]any{"hist_access_type": "tail", "n": 5}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			r := newRig(t)
			req, id := r.request(tc.msgType, tc.content)
			r.shell.in <- req
			rep := r.next(r.shell)
			if rep.Type != tc.replyType || rep.Parent["msg_id"] != id {
				t.Fatalf("got %s with parent %v, want %s to %s", rep.Type, rep.Parent["msg_id"], tc.replyType, id)
			}
			if len(rep.IDs) != 1 || rep.IDs[0] != "peer-1" {
				t.Errorf("routing identities %q, want [peer-1]", rep.IDs)
			}
			checkHeader(t, rep.Header)
			compareGolden(t, tc.name, rep.Content)
		})
	}
}

// checkHeader checks a header has the spec's six fields (messaging spec
// 5.3, "General Message Format"), with a date in RFC 3339 (an ISO 8601
// profile) carrying a zone.
func checkHeader(t *testing.T, h map[string]any) {
	t.Helper()
	for _, k := range []string{"msg_id", "session", "username", "date", "msg_type", "version"} {
		if s, _ := h[k].(string); s == "" {
			t.Errorf("header field %s missing or empty: %v", k, h)
		}
	}
	if h["version"] != "5.3" {
		t.Errorf("header version %v, want 5.3", h["version"])
	}
	if _, err := time.Parse(time.RFC3339Nano, h["date"].(string)); err != nil {
		t.Errorf("header date: %v", err)
	}
}

func compareGolden(t *testing.T, name string, content map[string]any) {
	t.Helper()
	got, _ := json.MarshalIndent(content, "", "  ")
	got = append(got, '\n')
	path := filepath.Join("testdata", "golden", name+".json")
	if *update {
		os.MkdirAll(filepath.Dir(path), 0o755)
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -update once to record)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("reply differs from %s:\ngot  %s\nwant %s", path, got, want)
	}
}
