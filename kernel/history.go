package kernel

import (
	"sync"
)

// HistorySession is the session number this kernel gives its history
// entries: history covers this kernel's inputs in this run only, numbered 1.
// A history_request for session 0 (IPython's "current session") or 1 reads
// them; any other session number gets an empty list.
const HistorySession = 1

// history records the inputs (and text/plain results) of stored cells.
type history struct {
	mu      sync.Mutex
	entries []histEntry
}

type histEntry struct {
	line   int
	input  string
	output string
}

func (h *history) add(line int, input string) {
	h.mu.Lock()
	defer h.mu.Unlock()
	h.entries = append(h.entries, histEntry{line: line, input: input})
}

func (h *history) setOutput(line int, out string) {
	h.mu.Lock()
	defer h.mu.Unlock()
	if n := len(h.entries); n > 0 && h.entries[n-1].line == line {
		h.entries[n-1].output = out
	}
}

// historyRequest is the content of history_request.
type historyRequest struct {
	Output  bool   `json:"output"`
	Raw     bool   `json:"raw"`
	Access  string `json:"hist_access_type"`
	Session int    `json:"session"`
	Start   int    `json:"start"`
	Stop    int    `json:"stop"`
	N       int    `json:"n"`
	Pattern string `json:"pattern"`
	Unique  bool   `json:"unique"`
}

// query returns the entries req selects, oldest first.
func (h *history) query(req historyRequest) []histEntry {
	h.mu.Lock()
	all := append([]histEntry(nil), h.entries...)
	h.mu.Unlock()
	switch req.Access {
	case "tail":
		return lastN(all, req.N)
	case "range":
		if req.Session != 0 && req.Session != HistorySession {
			return nil
		}
		var sel []histEntry
		for _, e := range all {
			// stop is exclusive; 0 or absent means no upper bound.
			if e.line >= req.Start && (req.Stop <= 0 || e.line < req.Stop) {
				sel = append(sel, e)
			}
		}
		return sel
	case "search":
		var sel []histEntry
		for _, e := range all {
			if globMatch(req.Pattern, e.input) {
				sel = append(sel, e)
			}
		}
		if req.Unique {
			sel = uniqueLatest(sel)
		}
		return lastN(sel, req.N)
	}
	return nil
}

func lastN(e []histEntry, n int) []histEntry {
	if n > 0 && len(e) > n {
		return e[len(e)-n:]
	}
	return e
}

// uniqueLatest keeps the latest entry of each distinct input, in order.
func uniqueLatest(e []histEntry) []histEntry {
	last := make(map[string]int, len(e))
	for i, x := range e {
		last[x.input] = i
	}
	var out []histEntry
	for i, x := range e {
		if last[x.input] == i {
			out = append(out, x)
		}
	}
	return out
}

// globMatch reports whether s matches pattern, where * matches any run of
// code points (newlines included) and ? exactly one; an empty pattern
// matches everything. Iterative with one backtrack point: linear-ish time,
// no recursion blow-up on patterns like "*a*a*a*".
func globMatch(pattern, s string) bool {
	if pattern == "" {
		return true
	}
	p, t := []rune(pattern), []rune(s)
	pi, ti, star, mark := 0, 0, -1, 0
	for ti < len(t) {
		switch {
		case pi < len(p) && p[pi] == '*': // before the literal case: '*' is never literal
			star, mark = pi, ti
			pi++
		case pi < len(p) && (p[pi] == '?' || p[pi] == t[ti]):
			pi++
			ti++
		case star >= 0:
			pi = star + 1
			mark++
			ti = mark
		default:
			return false
		}
	}
	for pi < len(p) && p[pi] == '*' {
		pi++
	}
	return pi == len(p)
}

func (k *Kernel) history(sock Socket, m *message) {
	var req historyRequest
	if !k.unpack(m, &req) {
		return
	}
	sel := k.hist.query(req)
	items := make([][]any, 0, len(sel))
	for _, e := range sel {
		if req.Output {
			items = append(items, []any{HistorySession, e.line, []string{e.input, e.output}})
		} else {
			items = append(items, []any{HistorySession, e.line, e.input})
		}
	}
	k.reply(sock, m, "history_reply", map[string]any{"status": "ok", "history": items})
}
