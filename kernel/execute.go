package kernel

import (
	"context"
	"errors"
	"fmt"
	"runtime/debug"
	"strings"
)

// executeRequest is the content of execute_request.
type executeRequest struct {
	Code            string            `json:"code"`
	Silent          bool              `json:"silent"`
	StoreHistory    *bool             `json:"store_history"`
	UserExpressions map[string]string `json:"user_expressions"`
	AllowStdin      bool              `json:"allow_stdin"` // input is never requested, so false and true behave alike
	StopOnError     *bool             `json:"stop_on_error"`
}

// execute runs one cell and answers it; see the messaging spec, "Execute".
func (k *Kernel) execute(sock Socket, m *message) {
	var req executeRequest
	if !k.unpack(m, &req) {
		k.reply(sock, m, "execute_reply", errorContent(k.count, "BadRequest",
			"kernel: execute_request content is not valid; send {\"code\": \"...\"}", nil))
		return
	}
	store := req.StoreHistory == nil || *req.StoreHistory
	if req.Silent {
		store = false // spec: silent implies store_history false
	}
	if store {
		k.count++
		k.hist.add(k.count, req.Code)
	}
	if !req.Silent {
		k.publish(m, "execute_input", map[string]any{"code": req.Code, "execution_count": k.count})
	}
	out := &cellOutput{k: k, req: m, silent: req.Silent}
	result, err := k.run(req.Code, out)
	if err != nil {
		name, value, tb := describe(err)
		if req.StopOnError == nil || *req.StopOnError {
			// Abort what was queued before the client could see this error;
			// a request it sends after the reply must run. Counted before
			// the reply goes out, so the two cannot race.
			k.abortN = len(k.queue)
		}
		if !req.Silent {
			k.publish(m, "error", map[string]any{"ename": name, "evalue": value, "traceback": tb})
		}
		k.reply(sock, m, "execute_reply", errorContent(k.count, name, value, tb))
		return
	}
	if result != nil && !req.Silent {
		data, meta := bundleJSON(result)
		k.publish(m, "execute_result", map[string]any{"execution_count": k.count, "data": data, "metadata": meta})
		if store {
			k.hist.setOutput(k.count, textPlain(result))
		}
	}
	k.reply(sock, m, "execute_reply", map[string]any{"status": "ok", "execution_count": k.count,
		"user_expressions": k.userExpressions(req.UserExpressions), "payload": []any{}})
}

func errorContent(count int, name, value string, tb []string) map[string]any {
	if tb == nil {
		tb = []string{}
	}
	return map[string]any{"status": "error", "execution_count": count, "ename": name, "evalue": value, "traceback": tb}
}

// run calls Session.Execute with a context the interrupt cancels, turning a
// panic in the session into an error so the kernel lives on.
func (k *Kernel) run(code string, out Output) (res *Bundle, err error) {
	ctx, cancel := context.WithCancel(context.Background())
	k.cellMu.Lock()
	k.cellCancel = cancel
	k.cellMu.Unlock()
	defer func() {
		k.cellMu.Lock()
		k.cellCancel = nil
		k.cellMu.Unlock()
		cancel()
		if p := recover(); p != nil {
			k.log.Error("session panicked", "panic", p, "stack", string(debug.Stack()))
			res, err = nil, fmt.Errorf("internal error: %v", p)
		}
	}()
	return k.sess.Execute(ctx, code, out)
}

// describe gives an error's ename, evalue and traceback lines.
func describe(err error) (name, value string, tb []string) {
	if errors.Is(err, context.Canceled) {
		return "Interrupted", "the cell was interrupted", []string{"Interrupted: the cell was interrupted"}
	}
	var d ErrorDetail
	if errors.As(err, &d) {
		return d.Name(), err.Error(), d.Traceback()
	}
	return "Error", err.Error(), strings.Split(err.Error(), "\n")
}

// abortQueued answers the execute_requests that were queued when an execute
// failed with stop_on_error (k.abortN of them) with status "aborted"; other
// queued requests among them are served as usual.
func (k *Kernel) abortQueued() {
	for ; k.abortN > 0; k.abortN-- {
		select {
		case m := <-k.queue:
			k.around(k.shell, m, func(sock Socket, m *message) {
				if m.Header.MsgType == "execute_request" {
					k.reply(sock, m, "execute_reply", map[string]any{"status": "aborted", "execution_count": k.count})
					return
				}
				k.dispatch(sock, m)
			})
		default:
			k.abortN = 0
			return
		}
	}
}

// userExpressions evaluates each expression and returns its text/plain in a
// display bundle, or an error entry.
func (k *Kernel) userExpressions(exprs map[string]string) map[string]any {
	out := make(map[string]any, len(exprs))
	for name, code := range exprs {
		res, err := k.run(code, discardOutput{})
		if err != nil {
			n, v, tb := describe(err)
			out[name] = map[string]any{"status": "error", "ename": n, "evalue": v, "traceback": tb}
			continue
		}
		out[name] = map[string]any{"status": "ok", "data": map[string]any{"text/plain": textPlain(res)}, "metadata": map[string]any{}}
	}
	return out
}

func textPlain(b *Bundle) string {
	if b == nil {
		return ""
	}
	s, _ := b.Data["text/plain"].(string)
	return s
}

// cellOutput publishes a running cell's outputs with the request as parent.
type cellOutput struct {
	k      *Kernel
	req    *message
	silent bool
}

var _ Output = (*cellOutput)(nil)

func (o *cellOutput) Stream(name, text string) {
	if o.silent {
		return
	}
	if name != "stderr" {
		name = "stdout"
	}
	o.k.publish(o.req, "stream", map[string]string{"name": name, "text": text})
}

func (o *cellOutput) Display(b Bundle, displayID string, update bool) {
	if o.silent {
		return
	}
	data, meta := bundleJSON(&b)
	transient := map[string]any{}
	if displayID != "" {
		transient["display_id"] = displayID
	}
	kind := "display_data"
	if update && displayID != "" {
		kind = "update_display_data"
	}
	o.k.publish(o.req, kind, map[string]any{"data": data, "metadata": meta, "transient": transient})
}

func (o *cellOutput) ClearOutput(wait bool) {
	if !o.silent {
		o.k.publish(o.req, "clear_output", map[string]bool{"wait": wait})
	}
}

// discardOutput drops what a user expression shows.
type discardOutput struct{}

func (discardOutput) Stream(string, string)        {}
func (discardOutput) Display(Bundle, string, bool) {}
func (discardOutput) ClearOutput(bool)             {}
