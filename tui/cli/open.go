package cli

import (
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"argand/calc"
)

// Batch runs a worksheet file, or the built-in example when file is "",
// without a terminal: every step printed, exit as for run.
func Batch(file string, in io.Reader, w, ew io.Writer, o Options) int {
	return BatchContext(context.Background(), file, in, w, ew, o)
}

// BatchContext is Batch stopped by ctx (ctrl+c), as RunContext.
func BatchContext(ctx context.Context, file string, in io.Reader, w, ew io.Writer, o Options) int {
	if file == "" {
		if !o.JSON && !o.CSV {
			fmt.Fprintln(w, "# built-in example worksheet (example data, invented scenario)")
		}
		return RunContext(ctx, strings.NewReader(ExampleIn(o.Comma)), "example", w, ew, o)
	}
	f, err := os.Open(file)
	if err != nil {
		fmt.Fprintln(ew, "argand:", calc.Printable(err.Error()))
		return ExitBadInput
	}
	defer f.Close()
	o.Dir = filepath.Dir(file)
	return RunContext(ctx, f, file, w, ew, o)
}
