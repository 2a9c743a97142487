package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"log"
	"net"
	"os"
	"os/signal"
	"path/filepath"
	"syscall"
	"time"

	"argand/calc"
	"argand/reduce/sheet"
	"argand/tui/cli"
	"argand/tui/serve"
	"argand/tui/store"

	gossh "golang.org/x/crypto/ssh"
)

// serveUsage is printed for argand serve --help and after a usage error.
const serveUsage = `argand serve [flags]: serve argand to a team over SSH

  --listen ADDR       address to listen on (default 127.0.0.1:2222, loopback only)
  --state DIR         state directory: host key, authorized keys, sessions
                      (default: the argand state directory, under serve/)
  --keys FILE         authorized-keys file (default DIR/authorized_keys)
  --max-sessions N    sessions at once, all keys (default 32)
  --max-per-key N     sessions at once with one key (default 4)
  --idle DURATION     no input for this long ends a session (default 30m)
  --rate N            sustained input per session, bytes a second (default 16384)
  --max-line N        input between two line ends, bytes (default 262144)
  --handshake DURATION  from connecting to a session started (default 30s)
  --max-bytes N       worksheet size: its statements, bytes (default 1048576)
  --max-names N       names in one worksheet (default 5000)
  --max-points N      points of one sweep (default 10000)
  --max-elements N    elements of one network (default 2000)
  --max-budget SECONDS  the largest budget of estimated work (default 30)
  --max-undo N        changes kept for undo in one session (default 50)
`

// serveFlags parses the flags of argand serve.
func serveFlags(args []string, f flags) (serve.Config, string, error) {
	fs := flag.NewFlagSet("serve", flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	cfg := serve.Config{Digits: f.opt.Digits, PolarFirst: f.opt.PolarFirst, ASCII: f.opt.ASCII, Comma: f.opt.Comma}
	listen := fs.String("listen", serve.DefaultListen, "")
	fs.StringVar(&cfg.Dir, "state", "", "")
	fs.StringVar(&cfg.AuthorizedKeys, "keys", "", "")
	fs.IntVar(&cfg.MaxSessions, "max-sessions", serve.DefaultMaxSessions, "")
	fs.IntVar(&cfg.MaxPerKey, "max-per-key", serve.DefaultMaxPerKey, "")
	fs.DurationVar(&cfg.Idle, "idle", serve.DefaultIdle, "")
	fs.IntVar(&cfg.Rate, "rate", serve.DefaultRate, "")
	fs.IntVar(&cfg.MaxLine, "max-line", serve.DefaultMaxLine, "")
	fs.DurationVar(&cfg.Handshake, "handshake", serve.DefaultHandshake, "")
	d := serve.DefaultLimits()
	fs.IntVar(&cfg.Limits.Bytes, "max-bytes", d.Bytes, "")
	fs.IntVar(&cfg.Limits.Names, "max-names", d.Names, "")
	fs.IntVar(&cfg.Limits.Points, "max-points", d.Points, "")
	fs.IntVar(&cfg.Limits.Elements, "max-elements", d.Elements, "")
	fs.Float64Var(&cfg.Limits.Budget, "max-budget", d.Budget, "")
	fs.IntVar(&cfg.Limits.Undo, "max-undo", d.Undo, "")
	if err := fs.Parse(args); err != nil {
		return cfg, "", fmt.Errorf("serve: %v", err)
	}
	if fs.NArg() > 0 {
		return cfg, "", fmt.Errorf("serve: unexpected %q", fs.Arg(0))
	}
	for _, c := range []struct {
		name string
		v    int
	}{{"--max-sessions", cfg.MaxSessions}, {"--max-per-key", cfg.MaxPerKey}, {"--rate", cfg.Rate}, {"--max-line", cfg.MaxLine},
		{"--max-bytes", cfg.Limits.Bytes}, {"--max-names", cfg.Limits.Names}, {"--max-points", cfg.Limits.Points}, {"--max-elements", cfg.Limits.Elements},
		{"--max-undo", cfg.Limits.Undo}} {
		if c.v < 1 {
			return cfg, "", fmt.Errorf("serve: %s takes a whole number of at least 1, not %d", c.name, c.v)
		}
	}
	if !(cfg.Limits.Budget >= 0.1 && cfg.Limits.Budget <= sheet.MaxBudget) {
		return cfg, "", fmt.Errorf("serve: --max-budget takes seconds from 0.1 to %d, not %g", sheet.MaxBudget, cfg.Limits.Budget)
	}
	if cfg.Handshake < time.Second {
		return cfg, "", fmt.Errorf("serve: --handshake takes a duration of at least 1s, such as 30s, not %s", cfg.Handshake)
	}
	if cfg.Idle < time.Second {
		return cfg, "", fmt.Errorf("serve: --idle takes a duration of at least 1s, such as 30m, not %s", cfg.Idle)
	}
	if _, _, err := net.SplitHostPort(*listen); err != nil {
		return cfg, "", fmt.Errorf("serve: --listen takes HOST:PORT, such as 127.0.0.1:2222, not %q", *listen)
	}
	if cfg.Dir == "" {
		d, err := store.Dir()
		if err != nil {
			return cfg, "", err
		}
		cfg.Dir = filepath.Join(d, "serve")
	}
	return cfg, *listen, nil
}

// runServe is argand serve: it runs until interrupted (SIGINT or SIGTERM),
// then lets every app quit, each having saved as it went.
func runServe(args []string, out, errw io.Writer, f flags) int {
	for _, a := range args {
		if a == "--help" || a == "-h" || a == "-help" {
			fmt.Fprint(out, serveUsage)
			return cli.ExitOK
		}
	}
	cfg, listen, err := serveFlags(args, f)
	if err != nil {
		fmt.Fprintln(errw, "argand:", calc.Printable(err.Error()))
		fmt.Fprint(errw, serveUsage)
		return cli.ExitBadInput
	}
	logger := log.New(errw, "argand serve: ", log.LstdFlags|log.LUTC)
	cfg.Log = logger
	srv, err := serve.New(cfg)
	if err != nil {
		fmt.Fprintln(errw, "argand serve:", calc.Printable(err.Error()))
		return cli.ExitBadInput
	}
	ln, err := net.Listen("tcp", listen)
	if err != nil {
		fmt.Fprintln(errw, "argand serve:", calc.Printable(err.Error()))
		return cli.ExitBadInput
	}
	logger.Printf("listening on %s; host key %s", ln.Addr(), gossh.FingerprintSHA256(srv.HostKey()))
	if !loopback(ln.Addr()) {
		logger.Printf("note: %s is reachable beyond this machine", ln.Addr())
	}
	switch data, err := os.ReadFile(srv.KeysFile()); {
	case errors.Is(err, os.ErrNotExist):
		logger.Printf("no authorized keys yet: add public keys to %s, one a line", calc.Printable(srv.KeysFile()))
	case err != nil:
		logger.Printf("authorized keys %s: %s", calc.Printable(srv.KeysFile()), calc.Printable(cleanErr(err)))
	default:
		n, skipped := serve.ParseKeys(data)
		logger.Printf("authorized keys from %s: %d", calc.Printable(srv.KeysFile()), n)
		for _, l := range skipped {
			logger.Printf("authorized keys line %d skipped: not a key, or options this server does not apply", l)
		}
	}

	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	done := make(chan error, 1)
	go func() { done <- srv.Serve(ln) }()
	select {
	case err := <-done:
		if err != nil {
			logger.Print(calc.Printable(err.Error()))
			return cli.ExitBadInput
		}
		return cli.ExitOK
	case <-ctx.Done():
	}
	logger.Printf("stopping: %d sessions end", srv.Sessions())
	sctx, cancel := context.WithTimeout(context.Background(), 10*time.Second)
	defer cancel()
	if err := srv.Shutdown(sctx); err != nil {
		logger.Print("stopped without waiting for every session: " + calc.Printable(err.Error()))
	}
	<-done
	return cli.ExitOK
}

// loopback reports whether addr is on the loopback interface only.
func loopback(addr net.Addr) bool {
	ta, ok := addr.(*net.TCPAddr)
	return ok && ta.IP.IsLoopback()
}
