package kernel

import (
	"encoding/json"
	"fmt"
	"net"
	"os"
	"strconv"
)

// ConnectionInfo is the content of a Jupyter connection file: where the five
// sockets listen and how messages are signed.
type ConnectionInfo struct {
	Transport       string `json:"transport"`        // only "tcp" is served
	IP              string `json:"ip"`               // the only address bound
	ShellPort       int    `json:"shell_port"`       // ROUTER
	ControlPort     int    `json:"control_port"`     // ROUTER
	StdinPort       int    `json:"stdin_port"`       // ROUTER
	IOPubPort       int    `json:"iopub_port"`       // PUB
	HBPort          int    `json:"hb_port"`          // REP echo
	Key             string `json:"key"`              // HMAC key; empty disables signing
	SignatureScheme string `json:"signature_scheme"` // only "hmac-sha256"
	KernelName      string `json:"kernel_name,omitempty"`
}

// ReadConnectionFile reads and checks the connection file at path.
func ReadConnectionFile(path string) (ConnectionInfo, error) {
	var ci ConnectionInfo
	data, err := os.ReadFile(path)
	if err != nil {
		return ci, fmt.Errorf("kernel: cannot read connection file: %w; pass the file the front end wrote with --connection-file", err)
	}
	if err := json.Unmarshal(data, &ci); err != nil {
		return ci, fmt.Errorf("kernel: connection file %s is not valid JSON: %v; it must be the JSON object a Jupyter front end writes", path, err)
	}
	return ci, ci.Validate()
}

// Validate reports the first problem with ci: an unknown transport or
// signature scheme, a bad IP address or a missing or out-of-range port.
func (ci ConnectionInfo) Validate() error {
	if ci.Transport != "tcp" {
		return fmt.Errorf("kernel: transport %q is not supported; use \"transport\": \"tcp\" in the connection file", ci.Transport)
	}
	if net.ParseIP(ci.IP) == nil {
		return fmt.Errorf("kernel: ip %q is not an IP address; use e.g. \"127.0.0.1\"", ci.IP)
	}
	if ci.Key != "" && ci.SignatureScheme != "hmac-sha256" {
		return fmt.Errorf("kernel: signature_scheme %q is not supported; use \"hmac-sha256\"", ci.SignatureScheme)
	}
	for _, p := range ci.ports() {
		if p.port <= 0 || p.port > 65535 {
			return fmt.Errorf("kernel: %s is missing or out of range (got %d); give a TCP port between 1 and 65535", p.name, p.port)
		}
	}
	return nil
}

type namedPort struct {
	name string
	port int
}

func (ci ConnectionInfo) ports() []namedPort {
	return []namedPort{
		{"shell_port", ci.ShellPort}, {"control_port", ci.ControlPort},
		{"stdin_port", ci.StdinPort}, {"iopub_port", ci.IOPubPort}, {"hb_port", ci.HBPort},
	}
}

// hostPort joins the IP and a port for net.Listen.
func (ci ConnectionInfo) hostPort(port int) string {
	return net.JoinHostPort(ci.IP, strconv.Itoa(port))
}
