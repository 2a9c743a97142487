package cli

import _ "embed"

// Example is the built-in example worksheet, opened on first start and run
// when argand has no terminal. Its data are invented.
//
//go:embed examples/workshop.argand
var Example string
