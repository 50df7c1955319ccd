package kernel

import (
	"encoding/json"
	"unicode/utf8"
)

// onShell answers the stateless requests at once, so a front end probing
// with kernel_info is answered even while a cell runs (TRANSPORT.md hazard
// 6), and queues the rest for the execution goroutine in arrival order.
func (k *Kernel) onShell(m *message) {
	switch m.Header.MsgType {
	case "kernel_info_request", "comm_info_request":
		k.around(k.shell, m, k.dispatch)
		return
	}
	select {
	case k.queue <- m:
	case <-k.done:
	}
}

// onControl serves control requests; it runs beside a busy shell.
func (k *Kernel) onControl(m *message) {
	k.around(k.control, m, func(sock Socket, m *message) {
		switch m.Header.MsgType {
		case "interrupt_request":
			k.Interrupt()
			k.reply(sock, m, "interrupt_reply", map[string]string{"status": "ok"})
		default:
			k.dispatch(sock, m)
		}
	})
}

// around publishes busy and idle around handling m.
func (k *Kernel) around(sock Socket, m *message, handle func(Socket, *message)) {
	k.status(m, "busy")
	handle(sock, m)
	k.status(m, "idle")
	if m.Header.MsgType == "shutdown_request" {
		k.Shutdown() // after idle, so the front end sees the request finish
	}
}

// executor is the one goroutine that calls the session's cell methods.
func (k *Kernel) executor() {
	defer k.wg.Done()
	for {
		select {
		case m := <-k.queue:
			k.around(k.shell, m, k.dispatch)
			k.abortQueued() // after a failed execute with stop_on_error
		case <-k.done:
			return
		}
	}
}

// dispatch handles one request of any type.
func (k *Kernel) dispatch(sock Socket, m *message) {
	switch m.Header.MsgType {
	case "kernel_info_request":
		k.reply(sock, m, "kernel_info_reply", k.kernelInfo())
	case "execute_request":
		k.execute(sock, m)
	case "complete_request":
		k.complete(sock, m)
	case "inspect_request":
		k.inspect(sock, m)
	case "is_complete_request":
		k.isComplete(sock, m)
	case "history_request":
		k.history(sock, m)
	case "comm_info_request":
		k.reply(sock, m, "comm_info_reply", map[string]any{"status": "ok", "comms": map[string]any{}})
	case "comm_open":
		k.commOpen(m)
	case "comm_msg", "comm_close":
		// No comm is ever open here, so these address nothing (spec: ignore).
	case "shutdown_request":
		k.shutdown(sock, m)
	default:
		k.log.Info("ignoring unknown request", "msg_type", m.Header.MsgType)
	}
}

// unpack decodes m's content into dst, logging and reporting failure.
func (k *Kernel) unpack(m *message, dst any) bool {
	if err := json.Unmarshal(m.Content, dst); err != nil {
		k.log.Warn("bad request content; ignoring", "msg_type", m.Header.MsgType, "err", err)
		return false
	}
	return true
}

// kernelInfoReply is the content of kernel_info_reply.
type kernelInfoReply struct {
	Status                string       `json:"status"`
	ProtocolVersion       string       `json:"protocol_version"`
	Implementation        string       `json:"implementation"`
	ImplementationVersion string       `json:"implementation_version"`
	LanguageInfo          languageInfo `json:"language_info"`
	Banner                string       `json:"banner"`
	HelpLinks             []HelpLink   `json:"help_links"`
	Debugger              bool         `json:"debugger"`
}

type languageInfo struct {
	Name          string `json:"name"`
	Version       string `json:"version"`
	MIMEType      string `json:"mimetype"`
	FileExtension string `json:"file_extension"`
}

func (k *Kernel) kernelInfo() kernelInfoReply {
	li := k.sess.Info()
	links := li.HelpLinks
	if links == nil {
		links = []HelpLink{}
	}
	return kernelInfoReply{Status: "ok", ProtocolVersion: ProtocolVersion, Implementation: "loligo",
		ImplementationVersion: k.cfg.Version, Banner: li.Banner, HelpLinks: links,
		LanguageInfo: languageInfo{li.Name, li.Version, li.MIMEType, li.FileExtension}}
}

// clampCursor keeps a code-point cursor inside code; -1 or absent means end.
func clampCursor(code string, cur *int) int {
	n := utf8.RuneCountInString(code)
	if cur == nil || *cur < 0 || *cur > n {
		return n
	}
	return *cur
}

func (k *Kernel) complete(sock Socket, m *message) {
	var req struct {
		Code   string `json:"code"`
		Cursor *int   `json:"cursor_pos"`
	}
	if !k.unpack(m, &req) {
		return
	}
	cur := clampCursor(req.Code, req.Cursor)
	matches, start, end := k.sess.Complete(req.Code, cur)
	if matches == nil {
		matches = []string{}
		start, end = cur, cur
	}
	k.reply(sock, m, "complete_reply", map[string]any{"status": "ok", "matches": matches,
		"cursor_start": start, "cursor_end": end, "metadata": map[string]any{}})
}

func (k *Kernel) inspect(sock Socket, m *message) {
	var req struct {
		Code   string `json:"code"`
		Cursor *int   `json:"cursor_pos"`
		Detail int    `json:"detail_level"`
	}
	if !k.unpack(m, &req) {
		return
	}
	if req.Detail != 1 {
		req.Detail = 0
	}
	found, b := k.sess.Inspect(req.Code, clampCursor(req.Code, req.Cursor), req.Detail)
	data, meta := bundleJSON(b)
	k.reply(sock, m, "inspect_reply", map[string]any{"status": "ok", "found": found && b != nil,
		"data": data, "metadata": meta})
}

func (k *Kernel) isComplete(sock Socket, m *message) {
	var req struct {
		Code string `json:"code"`
	}
	if !k.unpack(m, &req) {
		return
	}
	status, indent := k.sess.IsComplete(req.Code)
	switch status {
	case "complete", "invalid", "unknown":
		k.reply(sock, m, "is_complete_reply", map[string]any{"status": status})
	case "incomplete":
		k.reply(sock, m, "is_complete_reply", map[string]any{"status": status, "indent": indent})
	default:
		k.reply(sock, m, "is_complete_reply", map[string]any{"status": "unknown"})
	}
}

// commOpen refuses a comm: no comm targets exist, so the spec's answer is
// an immediate comm_close for that comm_id.
func (k *Kernel) commOpen(m *message) {
	var req struct {
		CommID     string `json:"comm_id"`
		TargetName string `json:"target_name"`
	}
	if !k.unpack(m, &req) {
		return
	}
	k.log.Info("closing comm for unknown target", "target_name", req.TargetName)
	k.publish(m, "comm_close", map[string]any{"comm_id": req.CommID, "data": map[string]any{}})
}

func (k *Kernel) shutdown(sock Socket, m *message) {
	var req struct {
		Restart bool `json:"restart"`
	}
	k.unpack(m, &req)
	content := map[string]any{"status": "ok", "restart": req.Restart}
	k.reply(sock, m, "shutdown_reply", content)
	k.publish(m, "shutdown_reply", content)
}

// bundleJSON returns a bundle's data and metadata, never nil.
func bundleJSON(b *Bundle) (map[string]any, map[string]any) {
	data, meta := map[string]any{}, map[string]any{}
	if b != nil {
		for k, v := range b.Data {
			data[k] = v
		}
		for k, v := range b.Metadata {
			meta[k] = v
		}
	}
	return data, meta
}
