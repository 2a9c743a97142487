// Package termbg settles whether the terminal background is dark before any
// other package can ask the terminal.
//
// Importing the terminal UI library runs an init function that calls
// lipgloss.HasDarkBackground. Unless the answer was set beforehand, that
// writes an OSC 11 background-colour query and a cursor-position request to
// the terminal and waits up to five seconds for a reply. Terminals that never
// answer (some SSH relays, scripts, pseudo-terminals in tests) then stall the
// program and are left with the escape bytes on screen.
//
// This package imports lipgloss but neither the UI library nor its
// components, and its init calls lipgloss.SetHasDarkBackground, which marks
// the background as known so the later call returns at once. The Go
// specification (1.21 and later) initialises packages by their dependencies
// and then in order of import path; "argand/..." sorts before
// "github.com/...", so a main package that imports termbg (directly, with a
// blank import if need be) has termbg's init run before the UI library's.
//
// The answer comes from the environment, never from the terminal:
// ARGAND_BACKGROUND=light or dark wins; otherwise the COLORFGBG variable that
// some terminal emulators export is consulted; otherwise dark is assumed.
// There is deliberately no query of the terminal here: a reply that arrives
// after any timeout would land in the application's keyboard input as
// garbage, so a bounded probe cannot be made safe at this level.
package termbg

import (
	"os"
	"strconv"
	"strings"

	"github.com/charmbracelet/lipgloss"
)

// EnvVar is the environment variable that states the background: "light"
// or "dark" (case-insensitive).
const EnvVar = "ARGAND_BACKGROUND"

func init() {
	lipgloss.SetHasDarkBackground(Dark(os.Getenv))
}

// Dark reports whether the background is dark according to the environment
// read through getenv. EnvVar decides when set to "light" or "dark"; then
// COLORFGBG ("fg;bg" or "fg;default;bg" with ANSI colour numbers, where 7
// and 9–15 are light backgrounds); otherwise the answer is dark, the common
// case for terminals reached over SSH.
func Dark(getenv func(string) string) bool {
	switch strings.ToLower(strings.TrimSpace(getenv(EnvVar))) {
	case "light":
		return false
	case "dark":
		return true
	}
	if v := getenv("COLORFGBG"); v != "" {
		parts := strings.Split(v, ";")
		bg, err := strconv.Atoi(strings.TrimSpace(parts[len(parts)-1]))
		if err == nil && bg >= 0 && bg <= 15 {
			return !(bg == 7 || bg >= 9)
		}
	}
	return true
}
