package kernel

import (
	"flag"
	"fmt"
	"io"
	"log/slog"
	"os"
	"os/signal"
	"time"
)

// ServeCommand implements
//
//	loligo kernel --connection-file F [--log-level debug|info|warn|error]
//	              [--interrupt-mode message|signal] [--max-message-bytes N]
//
// serving a fresh session from newSession until a shutdown_request. It logs
// with log/slog to stderr and returns the exit status: 0 after a clean
// shutdown, 1 when the kernel cannot start, 2 on bad arguments. SIGINT never
// kills the kernel: with interrupt mode "signal" it interrupts the running
// cell, with "message" (the default) it is logged and ignored.
func ServeCommand(args []string, newSession func() Session, version string, stderr io.Writer) int {
	fs := flag.NewFlagSet("kernel", flag.ContinueOnError)
	fs.SetOutput(stderr)
	file := fs.String("connection-file", "", "connection file written by the front end (required)")
	level := fs.String("log-level", "warn", "log level: debug, info, warn or error")
	mode := fs.String("interrupt-mode", "message", "how interrupts arrive: message or signal")
	maxBytes := fs.Int64("max-message-bytes", DefaultMaxBytes, "largest message accepted, in bytes")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	var lv slog.Level
	if err := lv.UnmarshalText([]byte(*level)); err != nil {
		fmt.Fprintf(stderr, "kernel: unknown --log-level %q; use debug, info, warn or error\n", *level)
		return 2
	}
	if *mode != "message" && *mode != "signal" {
		fmt.Fprintf(stderr, "kernel: unknown --interrupt-mode %q; use message or signal\n", *mode)
		return 2
	}
	if *file == "" {
		fmt.Fprintln(stderr, "kernel: --connection-file is required; the front end passes it through the kernelspec argv")
		return 2
	}
	log := slog.New(slog.NewTextHandler(stderr, &slog.HandlerOptions{Level: lv}))
	ci, err := ReadConnectionFile(*file)
	if err != nil {
		log.Error(err.Error())
		return 1
	}
	// Catch SIGINT before binding: the reference client sends it before
	// shutdown_request and, in signal mode, to interrupt (TRANSPORT.md 5).
	sig := make(chan os.Signal, 1)
	signal.Notify(sig, os.Interrupt)
	defer signal.Stop(sig)
	k, err := Start(Config{Conn: ci, Version: version, InterruptMode: *mode, Logger: log,
		Guard: Guard{MaxBytes: *maxBytes}}, newSession())
	if err != nil {
		log.Error(err.Error())
		return 1
	}
	log.Info("kernel started", "ip", ci.IP, "shell_port", ci.ShellPort, "interrupt_mode", *mode)
	for {
		select {
		case <-sig:
			if *mode == "signal" {
				log.Info("SIGINT: interrupting the running cell")
				k.Interrupt()
			} else {
				log.Info("SIGINT ignored; interrupt_mode is message")
			}
		case <-k.Done():
			return waitExit(k, log)
		}
	}
}

// waitExit waits briefly for the kernel's goroutines; shutdown must finish
// within a second.
func waitExit(k *Kernel, log *slog.Logger) int {
	ch := make(chan struct{})
	go func() { k.Wait(); close(ch) }()
	select {
	case <-ch:
	case <-time.After(800 * time.Millisecond):
		log.Warn("shutdown: some goroutines still running; exiting anyway")
	}
	log.Info("kernel stopped")
	return 0
}
