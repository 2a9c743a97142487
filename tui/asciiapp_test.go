package tui

import (
	"strings"
	"testing"
)

// TestASCIIApp: asciiApp spells the app's symbols as the standard
// library's strings.Replacer does with the same pairs in the same order
// (the reference: first matching form at each place, no overlaps).
func TestASCIIApp(t *testing.T) {
	ref := strings.NewReplacer("↑↓", "up/down", "→←", "right/left", "›", ">", "↑", "up", "↓", "down", "←", "<-", "▸", ">", "◆", "*", "»", "]",
		"…", "~", "×", "x", "├", "+", "└", "+")
	tests := []string{
		"",
		"plain ascii 123",
		"↑↓ move  →← panes  › entry",
		"↑ up ↓ down ← back → stays",
		"▸ Z1  ◆1 Ry  » hi … more ×10^3 ├─ └─",
		"↑↑↓↓→←←→",
		"Ω µ ∠ ° stay for calc.ASCIIText",
		"\x1b[2J escapes are left to calc.Printable",
	}
	for _, s := range tests {
		if got, want := asciiApp(s), ref.Replace(s); got != want {
			t.Errorf("asciiApp(%q) = %q, want %q", s, got, want)
		}
	}
}
