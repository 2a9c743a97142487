package tui

import (
	"fmt"
	"io"
	"os"

	"argand/calc"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"
)

// Run runs the app on the terminal of in and out until the user quits. It
// returns the exit code for the command line: 0, or 2 when the terminal
// could not be used.
func Run(opt Options, in io.Reader, out io.Writer, errw io.Writer) int {
	if opt.Getenv == nil {
		opt.Getenv = os.Getenv
	}
	// Colour comes from the environment alone, never from a query of the
	// terminal. Without colour (NO_COLOR, or a terminal such as vt100) the
	// styles keep bold and reversed text only; TERM=dumb gets no styling.
	switch {
	case !opt.Color:
		lipgloss.SetColorProfile(termenv.Ascii)
		if opt.Getenv("TERM") != "dumb" {
			lipgloss.SetColorProfile(termenv.ANSI)
		}
	default:
		lipgloss.SetColorProfile(termenv.ANSI256)
	}
	if opt.Out == nil {
		opt.Out = out
	}
	m := New(opt)
	defer m.Close()
	p := tea.NewProgram(m, tea.WithInput(in), tea.WithOutput(out), tea.WithAltScreen())
	if _, err := p.Run(); err != nil {
		fmt.Fprintln(errw, "argand:", calc.Printable(err.Error()))
		return 2
	}
	return 0
}

// ColorWanted reports whether colour may be used: not under NO_COLOR
// (https://no-color.org) and not on a terminal type known to have none.
func ColorWanted(getenv func(string) string) bool {
	if getenv("NO_COLOR") != "" {
		return false
	}
	switch getenv("TERM") {
	case "vt100", "vt220", "dumb", "":
		return false
	}
	return true
}
