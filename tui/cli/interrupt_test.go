package cli

import (
	"bytes"
	"context"
	"strings"
	"testing"
)

// cancelOn is a writer that ends a context once a text has been written:
// the run is stopped right after that line's steps were printed.
type cancelOn struct {
	bytes.Buffer
	text   string
	cancel context.CancelFunc
}

func (w *cancelOn) Write(p []byte) (int, error) {
	n, err := w.Buffer.Write(p)
	if strings.Contains(w.String(), w.text) {
		w.cancel()
	}
	return n, err
}

// TestRunInterrupted stops a run after its second line has printed: the
// steps of the lines before are out, the third line is named, and the
// exit code is 130 (the exit codes of the README).
func TestRunInterrupted(t *testing.T) {
	ws := "Za = 3+j4 Ω\nZb = Za || 10 Ω\nsweep Zb from 10 Hz to 1 kHz points 90000\nZc = 1 Ω\n"
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	out := &cancelOn{text: "→ Zb", cancel: cancel}
	var errw bytes.Buffer
	code := RunContext(ctx, strings.NewReader(ws), "ws", out, &errw, Options{})
	if code != 130 {
		t.Errorf("exit %d, want 130", code)
	}
	if got := errw.String(); got != "interrupted at line 3\n" {
		t.Errorf("stderr %q", got)
	}
	if s := out.String(); !strings.Contains(s, "→ Za") || !strings.Contains(s, "→ Zb") || strings.Contains(s, "sweep") || strings.Contains(s, "Zc") {
		t.Errorf("stdout:\n%s", s)
	}
}

// TestEvalInterrupted stops eval before its first argument.
func TestEvalInterrupted(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	var out, errw bytes.Buffer
	if code := EvalContext(ctx, []string{"3+j4"}, &out, &errw, Options{}); code != ExitInterrupted {
		t.Errorf("exit %d, want %d", code, ExitInterrupted)
	}
	if errw.String() != "interrupted at line 1\n" || out.Len() != 0 {
		t.Errorf("stdout %q stderr %q", out.String(), errw.String())
	}
}
