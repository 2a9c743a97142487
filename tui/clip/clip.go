// Package clip builds the OSC 52 escape sequence that asks a terminal to
// put text on the system clipboard. It works over SSH because the request
// travels in the output stream to the user's own terminal emulator.
//
// The sequence is ESC ] 52 ; c ; base64(text) BEL, as described in the
// XTerm Control Sequences document. Terminal multiplexers swallow unknown
// sequences, so inside tmux the sequence is sent bare (for tmux's own
// clipboard) and again wrapped in tmux's DCS passthrough, and inside GNU
// screen in DCS chunks screen passes on.
package clip

import (
	"encoding/base64"
	"errors"
	"fmt"
	"strings"
)

// MaxBytes bounds the text copied in one sequence. Terminals cap what they
// accept (often near 100 kB of encoded data or less) and drop longer
// requests silently; refusing early lets the caller say so.
const MaxBytes = 100000

// ErrTooLarge is returned (wrapped) by Sequence for text over MaxBytes.
var ErrTooLarge = errors.New("clipboard text too large")

// Mux names the terminal multiplexer a sequence must pass through.
type Mux int

const (
	Direct Mux = iota // no multiplexer
	Tmux              // tmux: DCS passthrough with ESC doubled
	Screen            // GNU screen: DCS chunks
)

func (m Mux) String() string {
	switch m {
	case Tmux:
		return "tmux"
	case Screen:
		return "screen"
	}
	return "direct"
}

// OSC52 returns the bare OSC 52 sequence that sets the clipboard ("c") to
// text. It does not apply the MaxBytes bound; Sequence does.
func OSC52(text string) string {
	return "\x1b]52;c;" + base64.StdEncoding.EncodeToString([]byte(text)) + "\a"
}

// Detect reports the multiplexer indicated by the environment read through
// getenv: TMUX set, or TERM beginning "tmux", means tmux (tmux sets TERM to
// "screen…" by default too, so TMUX is checked first); STY set, or TERM
// beginning "screen", means screen.
func Detect(getenv func(string) string) Mux {
	term := getenv("TERM")
	switch {
	case getenv("TMUX") != "" || strings.HasPrefix(term, "tmux"):
		return Tmux
	case getenv("STY") != "" || strings.HasPrefix(term, "screen"):
		return Screen
	}
	return Direct
}

// screenChunk is the payload per DCS string under screen, which truncates
// long DCS strings; 76 is the chunk size commonly used (common practice).
const screenChunk = 76

// Wrap wraps seq for passage through m.
func Wrap(seq string, m Mux) string {
	switch m {
	case Tmux:
		// ESC P tmux; <seq with every ESC doubled> ESC \
		return "\x1bPtmux;" + strings.ReplaceAll(seq, "\x1b", "\x1b\x1b") + "\x1b\\"
	case Screen:
		var b strings.Builder
		for len(seq) > 0 {
			n := min(screenChunk, len(seq))
			b.WriteString("\x1bP" + seq[:n] + "\x1b\\")
			seq = seq[n:]
		}
		return b.String()
	}
	return seq
}

// Sequence returns the bytes to write to the terminal to copy text: the
// OSC 52 sequence wrapped for the multiplexer that getenv indicates. Text
// longer than MaxBytes is refused with an error wrapping ErrTooLarge.
//
// Inside tmux it is both sequences, see ForTmux.
func Sequence(text string, getenv func(string) string) (string, error) {
	if len(text) > MaxBytes {
		return "", fmt.Errorf("%w: %d bytes, at most %d", ErrTooLarge, len(text), MaxBytes)
	}
	seq := OSC52(text)
	mux := Detect(getenv)
	if mux == Tmux {
		return ForTmux(seq), nil
	}
	return Wrap(seq, mux), nil
}

// ForTmux returns seq for tmux twice: bare, which tmux itself takes when
// its set-clipboard option is on (and passes on to the outer terminal),
// then in DCS passthrough, which tmux forwards only when allow-passthrough
// is on. tmux drops whichever its options refuse; when both pass, the
// clipboard is set twice to the same text.
func ForTmux(seq string) string { return seq + Wrap(seq, Tmux) }
