// Command nostall imports termbg first and the UI library after it, and
// prints one line: the test runs it in a pseudo-terminal that never answers
// queries and checks that it neither stalls nor writes escape sequences.
package main

import (
	"fmt"

	_ "argand/tui/termbg"

	_ "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
)

func main() {
	fmt.Println("dark:", lipgloss.HasDarkBackground())
}
