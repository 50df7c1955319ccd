"""End-to-end checks of the loligo kernel with Debian's reference Jupyter
client (python3-jupyter-client 7.4.9). Driven by kernel/e2e_test.go, which
builds the test kernel and installs kernelspecs LOLIGO_KERNEL_NAME (interrupt
by message) and LOLIGO_KERNEL_NAME-sig (interrupt by SIGINT).

Prints one "ok NAME ..." line per scenario and a final "METRICS {json}" line;
exits non-zero on the first failure.
"""
import json
import os
import signal
import socket
import statistics
import sys
import time

import zmq
from jupyter_client import BlockingKernelClient, KernelManager

NAME = os.environ.get("LOLIGO_KERNEL_NAME", "loligo-test")
TIMEOUT = 10
METRICS = {}


def check(cond, what):
    if not cond:
        raise AssertionError(what)


def run(kc, code, **kw):
    """Execute code; return (reply, iopub messages with this parent until idle)."""
    msg_id = kc.execute(code, **kw)
    reply = kc.get_shell_msg(timeout=TIMEOUT)
    check(reply["parent_header"]["msg_id"] == msg_id, "reply parent is the request")
    out = []
    while True:
        m = kc.get_iopub_msg(timeout=TIMEOUT)
        if m["parent_header"].get("msg_id") != msg_id:
            continue
        out.append(m)
        if m["msg_type"] == "status" and m["content"]["execution_state"] == "idle":
            return reply, out


def start(name=NAME):
    km = KernelManager(kernel_name=name)
    km.start_kernel()
    kc = km.client()
    kc.start_channels()
    kc.wait_for_ready(timeout=TIMEOUT)
    return km, kc


def t_kernel_info(km, kc):
    kc.kernel_info()
    r = kc.get_shell_msg(timeout=TIMEOUT)
    c = r["content"]
    check(c["protocol_version"] == "5.3", "protocol_version 5.3")
    check(c["implementation"] == "loligo", "implementation loligo")
    check(c["language_info"]["name"] == "fakesession", "language_info from Session.Info")
    check(r["header"]["version"] == "5.3", "header version")
    # jupyter_client parses the ISO 8601 date; a zone must have come with it.
    check(r["header"]["date"].tzinfo is not None, "ISO 8601 date with zone")


def t_execute(km, kc):
    code = "print hi\neprint oops\ndisplay d1\nshow x1 first\nupdate x1 second\nclear\n42"
    reply, out = run(kc, code)
    check(reply["content"]["status"] == "ok", "status ok")
    types = [m["msg_type"] for m in out]
    want = ["status", "execute_input", "stream", "stream", "display_data", "display_data",
            "update_display_data", "clear_output", "execute_result", "status"]
    check(types == want, "iopub sequence %s" % types)
    check(out[0]["content"]["execution_state"] == "busy", "busy first")
    check(out[2]["content"] == {"name": "stdout", "text": "hi\n"}, "stdout stream")
    check(out[3]["content"]["name"] == "stderr", "stderr stream")
    check(out[5]["content"]["transient"] == {"display_id": "x1"}, "display_id in transient")
    check(out[6]["content"]["data"]["text/plain"] == "second", "update content")
    res = out[8]["content"]
    check(res["data"]["text/plain"] == "42", "execute_result")
    check(res["execution_count"] == reply["content"]["execution_count"], "execution_count agrees")
    reply, out = run(kc, "fail boom")
    c = reply["content"]
    check(c["status"] == "error" and c["ename"] == "FakeError" and c["evalue"] == "boom", "error reply")
    err = [m for m in out if m["msg_type"] == "error"]
    check(len(err) == 1 and err[0]["content"]["traceback"][1].strip() == "^", "error on iopub with caret")
    reply, _ = run(kc, "panic")
    check(reply["content"]["status"] == "error", "a session panic is an error reply")
    reply, _ = run(kc, "7", user_expressions={"a": "six", "b": "fail no"})
    ue = reply["content"]["user_expressions"]
    check(ue["a"]["data"]["text/plain"] == "six" and ue["b"]["status"] == "error", "user_expressions")


def t_stop_on_error(km, kc):
    ids = [kc.execute("sleep 0.3\nfail first"), kc.execute("1"), kc.execute("2")]
    got = {}
    while len(got) < 3:
        r = kc.get_shell_msg(timeout=TIMEOUT)
        got[r["parent_header"]["msg_id"]] = r["content"]["status"]
    check([got[i] for i in ids] == ["error", "aborted", "aborted"], "stop_on_error %s" % got)
    reply, _ = run(kc, "3")
    check(reply["content"]["status"] == "ok", "queue drained, next runs")


def t_complete_inspect(km, kc):
    kc.complete("é pri", 5)
    c = kc.get_shell_msg(timeout=TIMEOUT)["content"]
    check(c["matches"] == ["print"] and c["cursor_start"] == 2 and c["cursor_end"] == 5, "complete in code points %s" % c)
    for detail in (0, 1):
        kc.inspect("print", 2, detail)
        c = kc.get_shell_msg(timeout=TIMEOUT)["content"]
        check(c["found"] and ("detail 1" in c["data"]["text/plain"]) == (detail == 1), "inspect detail %d" % detail)
    for code, status in (("print a \\", "incomplete"), ("print a", "complete"), ("} x", "invalid")):
        kc.is_complete(code)
        c = kc.get_shell_msg(timeout=TIMEOUT)["content"]
        check(c["status"] == status, "is_complete %r" % code)


def interrupt_latency(km, kc, how):
    msg_id = kc.execute("sleep 20")
    while True:
        m = kc.get_iopub_msg(timeout=TIMEOUT)
        if m["msg_type"] == "execute_input" and m["parent_header"]["msg_id"] == msg_id:
            break
    time.sleep(0.2)
    t0 = time.monotonic()
    how()
    reply = kc.get_shell_msg(timeout=TIMEOUT)
    dt = time.monotonic() - t0
    check(reply["content"].get("ename") == "Interrupted", "ename Interrupted")
    check(dt < 0.1, "interrupt took %.3f s; want < 0.1 s" % dt)
    reply, _ = run(kc, "still here")
    check(reply["content"]["status"] == "ok", "kernel alive after interrupt")
    return dt


def t_interrupt(km, kc):
    METRICS["interrupt_message_s"] = interrupt_latency(km, kc, km.interrupt_kernel)
    # SIGINT in message mode is survived and ignored.
    os.kill(km.provisioner.process.pid, signal.SIGINT)
    time.sleep(0.2)
    reply, _ = run(kc, "alive")
    check(reply["content"]["status"] == "ok", "survived SIGINT")
    km2, kc2 = start(NAME + "-sig")
    try:
        METRICS["interrupt_signal_s"] = interrupt_latency(km2, kc2, km2.interrupt_kernel)
    finally:
        kc2.stop_channels()
        km2.shutdown_kernel(now=False)


def connect_info(km):
    return {k: v for k, v in km.get_connection_info().items()}


def t_stalled_subscriber(km, kc):
    info = connect_info(km)
    ctx = zmq.Context.instance()
    stalled = ctx.socket(zmq.SUB)
    stalled.setsockopt(zmq.RCVHWM, 1)
    stalled.setsockopt(zmq.RCVBUF, 4096)
    stalled.setsockopt(zmq.SUBSCRIBE, b"")
    stalled.connect("tcp://%s:%d" % (info["ip"], info["iopub_port"]))
    time.sleep(0.3)
    big = "x" * 200000
    t0 = time.monotonic()
    worst = 0.0
    for i in range(40):
        s = time.monotonic()
        reply, out = run(kc, "print " + big)
        worst = max(worst, time.monotonic() - s)
        check(any(m["msg_type"] == "stream" for m in out), "healthy client got its stream")
    METRICS["stalled_total_s"] = time.monotonic() - t0
    METRICS["stalled_worst_cell_s"] = worst
    check(worst < 8, "one cell waited %.1f s behind a stalled subscriber" % worst)
    stalled.close(linger=0)


def t_silent_peer(km, kc):
    info = connect_info(km)
    peers = []
    for port in ("shell_port", "iopub_port", "control_port"):
        s = socket.create_connection((info["ip"], info[port]))
        peers.append(s)  # says nothing
    t0 = time.monotonic()
    kc2 = BlockingKernelClient()
    kc2.load_connection_info(info)
    kc2.start_channels()
    try:
        kc2.wait_for_ready(timeout=TIMEOUT)
        reply, out = run(kc2, "print new")
        check(any(m["msg_type"] == "stream" for m in out), "new client gets iopub")
    finally:
        kc2.stop_channels()
    METRICS["silent_peer_new_client_s"] = time.monotonic() - t0
    check(METRICS["silent_peer_new_client_s"] < 4, "new client blocked by a silent peer")
    for s in peers:
        s.close()


def t_reconnect(km, kc):
    info = connect_info(km)
    for i in range(3):
        c = BlockingKernelClient()
        c.load_connection_info(info)
        c.start_channels()
        c.wait_for_ready(timeout=TIMEOUT)
        if i == 1:
            c.execute("sleep 0.05\nprint gone")  # leave before the reply
            c.stop_channels()
            continue
        reply, out = run(c, "print round %d" % i)
        check(any(m["msg_type"] == "stream" for m in out), "reconnected client receives iopub")
        c.stop_channels()


def t_restart_shutdown(km, kc):
    old = km.provisioner.process.pid
    km.restart_kernel(now=False)
    check(km.provisioner.process.pid != old, "restart gave a new process")
    kc.wait_for_ready(timeout=TIMEOUT)
    reply, _ = run(kc, "1")
    check(reply["content"]["execution_count"] == 1, "fresh kernel after restart")
    proc = km.provisioner.process
    kc.shutdown()
    r = kc.get_control_msg(timeout=TIMEOUT)
    check(r["msg_type"] == "shutdown_reply" and r["content"]["restart"] is False, "shutdown_reply on control")
    t0 = time.monotonic()
    rc = proc.wait(timeout=5)
    METRICS["shutdown_exit_s"] = time.monotonic() - t0
    check(rc == 0, "exit status %s" % rc)
    check(METRICS["shutdown_exit_s"] < 1, "exit within 1 s")


def t_bench(km, kc):
    rtt = []
    for _ in range(int(os.environ.get("LOLIGO_BENCH_N", "1000"))):
        t0 = time.perf_counter()
        run(kc, "1")
        rtt.append(time.perf_counter() - t0)
    rtt.sort()
    METRICS["bench_n"] = len(rtt)
    METRICS["bench_median_ms"] = 1000 * statistics.median(rtt)
    METRICS["bench_p99_ms"] = 1000 * rtt[int(0.99 * (len(rtt) - 1))]


def main():
    km, kc = start()
    try:
        for t in (t_kernel_info, t_execute, t_stop_on_error, t_complete_inspect, t_interrupt,
                  t_silent_peer, t_reconnect, t_stalled_subscriber, t_bench, t_restart_shutdown):
            t0 = time.monotonic()
            t(km, kc)
            print("ok %s %.2fs" % (t.__name__[2:], time.monotonic() - t0), flush=True)
    finally:
        kc.stop_channels()
        if km.is_alive():
            km.shutdown_kernel(now=True)
    print("METRICS " + json.dumps(METRICS), flush=True)


if __name__ == "__main__":
    main()
