package cli

import (
	_ "embed"
	"strings"

	"argand/reduce/sheet"
)

// Example is the built-in example worksheet, opened on first start and run
// when argand has no terminal. Its data are invented.
//
//go:embed examples/workshop.argand
var Example string

// ExampleIn returns the built-in example written with the decimal comma
// when comma is set, so that it reads as the user writes numbers.
func ExampleIn(comma bool) string {
	if !comma {
		return Example
	}
	lines := strings.Split(Example, "\n")
	for i := range lines {
		lines[i] = sheet.ChangeMarker(lines[i], false)
	}
	return strings.Join(lines, "\n")
}
