package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// loligoClient drives the real loligo kernel with the reference client
// (Debian's python3-jupyter-client): the language answers through the
// protocol as a notebook front end would see it. Each check prints a line;
// the script exits non-zero on the first mismatch.
const loligoClient = `
import sys, queue
from jupyter_client.manager import KernelManager
km = KernelManager(kernel_name="loligo-e2e")
km.start_kernel()
import atexit
atexit.register(lambda: km.is_alive() and km.shutdown_kernel(now=True))
kc = km.client(); kc.start_channels(); kc.wait_for_ready(timeout=30)
def run(code):
    msg_id = kc.execute(code)
    reply = kc.get_shell_msg(timeout=30)
    outs = []
    while True:
        m = kc.get_iopub_msg(timeout=30)
        if m["parent_header"].get("msg_id") != msg_id: continue
        if m["msg_type"] == "status" and m["content"]["execution_state"] == "idle": break
        outs.append(m)
    return reply, outs
def check(cond, what):
    print(("ok   " if cond else "FAIL ") + what); sys.stdout.flush()
    if not cond: km.shutdown_kernel(now=True); sys.exit(1)
info = kc.kernel_info(reply=True, timeout=30)["content"]
check(info["implementation"] == "loligo" and info["language_info"]["file_extension"] == ".loligo", "kernel_info names loligo")
r, outs = run("x = 20 ms\nx in us")
res = [o for o in outs if o["msg_type"] == "execute_result"]
check(r["content"]["status"] == "ok" and res and res[0]["content"]["data"]["text/plain"] == "20000 µs", "a quantity is shown in the asked unit")
r, outs = run("5 mV + x")
err = [o for o in outs if o["msg_type"] == "error"]
check(r["content"]["status"] == "error" and err and err[0]["content"]["ename"] == "UnitError", "a dimension error is a UnitError")
tb = err[0]["content"]["traceback"]
check("cannot add voltage (mV) to time (ms)" in tb[0] and tb[2].strip() == "^", "the traceback points at the operator")
r, outs = run("x")
res = [o for o in outs if o["msg_type"] == "execute_result"]
check(res and res[0]["content"]["data"]["text/plain"] == "20 ms", "the failed cell left the session intact")
c = kc.complete("y = sp", 6, reply=True, timeout=30)["content"]
check("span" in c["matches"] and c["cursor_start"] == 4 and c["cursor_end"] == 6, "completion offers builtins")
i = kc.inspect("span(0, 1, n = 3)", 2, reply=True, timeout=30)["content"]
check(i["found"] and "span(from, to" in i["data"]["text/plain"], "inspection shows the declaration")
kc.is_complete("span(0,")
ic = kc.get_shell_msg(timeout=30)["content"]
check(ic["status"] == "incomplete", "an open bracket is incomplete")
r, outs = run("plot(logistic, tanh, over = span(-4, 4, n = 50))")
figs = [o for o in outs if o["msg_type"] in ("execute_result", "display_data") and "image/svg+xml" in o["content"]["data"]]
check(figs and "text/html" not in figs[0]["content"]["data"], "a figure is SVG with no HTML beside it")
import time
msg_id = kc.execute("sweep(hh(), amplitude = span(0, 20, by = 0.5) uA/cm^2, duration = 5000 ms)")
time.sleep(1.0)
t0 = time.time(); km.interrupt_kernel()
reply = kc.get_shell_msg(timeout=30)
dt = time.time() - t0
partial = []
while True:
    m = kc.get_iopub_msg(timeout=30)
    if m["parent_header"].get("msg_id") != msg_id: continue
    if m["msg_type"] == "status" and m["content"]["execution_state"] == "idle": break
    if m["msg_type"] == "display_data" and "image/svg+xml" in m["content"]["data"]: partial.append(m)
check(reply["content"]["status"] == "error" and reply["content"]["ename"] == "Interrupted", "an interrupted sweep answers Interrupted")
check(dt < 2.0, "the interrupt took %.3f s" % dt)
check(len(partial) >= 1, "the partial f-I curve is shown")
r, outs = run("x")
check(r["content"]["status"] == "ok", "the kernel answers after an interrupt")
kc.stop_channels(); km.shutdown_kernel(now=False)
print("done")
`

func TestLoligoKernelWithReferenceClient(t *testing.T) {
	if testing.Short() {
		t.Skip("end-to-end test; run without -short")
	}
	py := ""
	for _, cand := range []string{os.Getenv("LOLIGO_PYTHON"), "/usr/bin/python3", "python3"} {
		if cand != "" && exec.Command(cand, "-c", "import jupyter_client").Run() == nil {
			py = cand
			break
		}
	}
	if py == "" {
		if os.Getenv("LOLIGO_REQUIRE_JUPYTER") == "1" {
			t.Fatal("python3 with jupyter_client not found; apt-get install -y python3-jupyter-client")
		}
		t.Skip("python3 with jupyter_client not found; apt-get install -y python3-jupyter-client")
	}
	dir := t.TempDir()
	bin := filepath.Join(dir, "loligo")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	prefix := filepath.Join(dir, "prefix")
	if out, err := exec.Command(bin, "install", "--prefix", prefix, "--name", "loligo-e2e").CombinedOutput(); err != nil {
		t.Fatalf("install: %v\n%s", err, out)
	}
	cmd := exec.Command(py, "-c", loligoClient)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "JUPYTER_PATH="+filepath.Join(prefix, "share", "jupyter"),
		"JUPYTER_RUNTIME_DIR="+dir, "PYTHONDONTWRITEBYTECODE=1")
	var out bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &out
	// The kernel inherits the script's output; should the script die
	// without stopping it, do not wait for the kernel to close it.
	cmd.WaitDelay = 10 * time.Second
	err := cmd.Run()
	t.Log(out.String())
	if err != nil || !strings.Contains(out.String(), "done") {
		t.Fatalf("reference client: %v", err)
	}
}
