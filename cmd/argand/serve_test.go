package main

import (
	"strings"
	"testing"
	"time"

	"argand/tui/serve"
)

// TestServeFlags: the defaults (loopback only), each flag, and one clear
// message for each bad value.
func TestServeFlags(t *testing.T) {
	cfg, listen, err := serveFlags([]string{"--state", t.TempDir()}, flags{})
	if err != nil {
		t.Fatal(err)
	}
	if listen != "127.0.0.1:2222" || cfg.MaxSessions != 32 || cfg.MaxPerKey != 4 || cfg.Idle != 30*time.Minute {
		t.Errorf("defaults: %s %+v", listen, cfg)
	}
	if cfg.Limits != serve.DefaultLimits() {
		t.Errorf("worksheet limits %+v", cfg.Limits)
	}
	cfg, listen, err = serveFlags([]string{"--listen", "[::1]:2200", "--state", "/x", "--keys", "/k", "--max-sessions", "64", "--max-per-key=2",
		"--idle", "90s", "--rate", "100", "--max-line", "2000", "--max-points", "500", "--max-budget", "12.5", "--max-undo", "7"}, flags{})
	if err != nil {
		t.Fatal(err)
	}
	if listen != "[::1]:2200" || cfg.Dir != "/x" || cfg.AuthorizedKeys != "/k" || cfg.MaxSessions != 64 || cfg.MaxPerKey != 2 ||
		cfg.Idle != 90*time.Second || cfg.Rate != 100 || cfg.MaxLine != 2000 || cfg.Limits.Points != 500 || cfg.Limits.Budget != 12.5 || cfg.Limits.Undo != 7 {
		t.Errorf("flags: %s %+v", listen, cfg)
	}
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"--listen", "2222"}, "--listen takes HOST:PORT"},
		{[]string{"--max-sessions", "0"}, "--max-sessions takes a whole number of at least 1, not 0"},
		{[]string{"--idle", "10ms"}, "--idle takes a duration of at least 1s"},
		{[]string{"--handshake", "0s"}, "--handshake takes a duration of at least 1s"},
		{[]string{"--max-budget", "1e9"}, "--max-budget takes seconds from 0.1 to 86400"},
		{[]string{"--max-undo", "0"}, "--max-undo takes a whole number of at least 1, not 0"},
		{[]string{"--nope"}, "flag provided but not defined: -nope"},
		{[]string{"extra"}, `unexpected "extra"`},
	} {
		var out, errw strings.Builder
		code := run(append([]string{"serve", "--state", t.TempDir()}, c.args...), strings.NewReader(""), &out, &errw)
		if code != 2 || !strings.Contains(errw.String(), c.want) {
			t.Errorf("%v: exit %d, %q; want 2 and %q", c.args, code, errw.String(), c.want)
		}
	}
	var out, errw strings.Builder
	if code := run([]string{"serve", "--help"}, strings.NewReader(""), &out, &errw); code != 0 || !strings.Contains(out.String(), "--listen ADDR") {
		t.Errorf("serve --help: %d %q", code, out.String())
	}
}

// TestServeLocale: the serve configuration takes ASCII from --ascii
// alone, not from the locale the server runs in (run hands serve its flags
// before the locale is looked at; TestClientLook in tui/serve checks that
// each session follows its client's LANG).
func TestServeLocale(t *testing.T) {
	t.Setenv("LANG", "C")
	t.Setenv("LC_ALL", "")
	t.Setenv("LC_CTYPE", "")
	f, err := parse([]string{"serve", "--state", "/x"})
	if err != nil {
		t.Fatal(err)
	}
	cfg, _, err := serveFlags(f.args[1:], f)
	if err != nil || cfg.ASCII {
		t.Errorf("serve in the C locale: ASCII %v (%v)", cfg.ASCII, err)
	}
	f, _ = parse([]string{"--ascii", "serve"})
	if cfg, _, _ := serveFlags(f.args[1:], f); !cfg.ASCII {
		t.Error("--ascii serve did not apply ASCII")
	}
}
