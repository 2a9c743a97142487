package clip

import (
	"errors"
	"strings"
	"testing"
)

func env(m map[string]string) func(string) string {
	return func(k string) string { return m[k] }
}

func TestOSC52(t *testing.T) {
	// Base64 vectors from RFC 4648, section 10; the framing
	// ESC ] 52 ; c ; data BEL from XTerm Control Sequences (from memory).
	tests := []struct{ in, want string }{
		{"", "\x1b]52;c;\a"},
		{"f", "\x1b]52;c;Zg==\a"},
		{"fo", "\x1b]52;c;Zm8=\a"},
		{"foo", "\x1b]52;c;Zm9v\a"},
		{"foob", "\x1b]52;c;Zm9vYg==\a"},
		{"fooba", "\x1b]52;c;Zm9vYmE=\a"},
		{"foobar", "\x1b]52;c;Zm9vYmFy\a"},
		// UTF-8 bytes of "Ω" are CE A9, base64 "zqk=".
		{"Ω", "\x1b]52;c;zqk=\a"},
	}
	for _, tt := range tests {
		if got := OSC52(tt.in); got != tt.want {
			t.Errorf("OSC52(%q) = %q, want %q", tt.in, got, tt.want)
		}
	}
}

func TestDetect(t *testing.T) {
	tests := []struct {
		env  map[string]string
		want Mux
	}{
		{nil, Direct},
		{map[string]string{"TERM": "xterm-256color"}, Direct},
		{map[string]string{"TERM": "vt100"}, Direct},
		{map[string]string{"TERM": "screen-256color", "TMUX": "/tmp/tmux-0/default,1,0"}, Tmux},
		{map[string]string{"TERM": "tmux-256color"}, Tmux},
		{map[string]string{"TERM": "screen"}, Screen},
		{map[string]string{"TERM": "xterm", "STY": "123.pts-0.host"}, Screen},
	}
	for _, tt := range tests {
		if got := Detect(env(tt.env)); got != tt.want {
			t.Errorf("Detect(%v) = %v, want %v", tt.env, got, tt.want)
		}
	}
}

func TestSequence(t *testing.T) {
	// tmux passthrough: ESC P tmux; payload with ESC doubled ESC \
	// (tmux manual, from memory).
	tests := []struct {
		env  map[string]string
		in   string
		want string
	}{
		{map[string]string{"TERM": "xterm"}, "foobar", "\x1b]52;c;Zm9vYmFy\a"},
		// tmux: bare for set-clipboard, then passthrough (tmux manual
		// page, options set-clipboard and allow-passthrough; from memory)
		{map[string]string{"TMUX": "x"}, "foobar", "\x1b]52;c;Zm9vYmFy\a\x1bPtmux;\x1b\x1b]52;c;Zm9vYmFy\a\x1b\\"},
		{map[string]string{"TERM": "screen"}, "foobar", "\x1bP\x1b]52;c;Zm9vYmFy\a\x1b\\"},
	}
	for _, tt := range tests {
		got, err := Sequence(tt.in, env(tt.env))
		if err != nil || got != tt.want {
			t.Errorf("Sequence(%q, %v) = %q, %v; want %q", tt.in, tt.env, got, err, tt.want)
		}
	}
}

func TestScreenChunks(t *testing.T) {
	text := strings.Repeat("a", 300) // 400 base64 bytes
	got, err := Sequence(text, env(map[string]string{"TERM": "screen"}))
	if err != nil {
		t.Fatal(err)
	}
	seq := OSC52(text)
	var rebuilt strings.Builder
	parts := strings.Split(got, "\x1b\\")
	if parts[len(parts)-1] != "" {
		t.Fatalf("does not end with ST: %q", got)
	}
	for _, p := range parts[:len(parts)-1] {
		if !strings.HasPrefix(p, "\x1bP") {
			t.Fatalf("chunk %q does not start with DCS", p)
		}
		body := p[2:]
		if len(body) > screenChunk {
			t.Errorf("chunk of %d bytes, want ≤ %d", len(body), screenChunk)
		}
		rebuilt.WriteString(body)
	}
	if rebuilt.String() != seq {
		t.Errorf("chunks do not rebuild the sequence")
	}
}

func TestTooLarge(t *testing.T) {
	direct := env(nil)
	if _, err := Sequence(strings.Repeat("x", MaxBytes), direct); err != nil {
		t.Errorf("text of MaxBytes refused: %v", err)
	}
	_, err := Sequence(strings.Repeat("x", MaxBytes+1), direct)
	if !errors.Is(err, ErrTooLarge) {
		t.Errorf("text of MaxBytes+1: err = %v, want ErrTooLarge", err)
	}
}
