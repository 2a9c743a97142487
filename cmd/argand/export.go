package main

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"time"

	"argand/calc"
	"argand/tui"
	"argand/tui/cli"
)

// runExport runs argand export: --html OUT writes the job record of a
// worksheet (a file, - for standard input, or by default the saved
// session); --source RECORD prints the worksheet a record holds.
func runExport(f flags, in io.Reader, out, errw io.Writer) int {
	args := f.args[1:]
	html, hasHTML := f.export["html"]
	src, hasSource := f.export["source"]
	switch {
	case hasHTML == hasSource:
		fmt.Fprintln(errw, "argand: export takes --html OUT.html [WORKSHEET] or --source RECORD.html")
		return cli.ExitBadInput
	case hasSource:
		if len(args) > 0 || len(f.export) > 1 {
			fmt.Fprintln(errw, "argand: export --source takes the record alone, as in argand export --source record.html")
			return cli.ExitBadInput
		}
		return cli.ExtractSource(src, out, errw)
	case html == "" || len(args) > 1:
		fmt.Fprintln(errw, "argand: export --html takes the record's file and at most one worksheet, as in argand export --html record.html job.argand")
		return cli.ExitBadInput
	}
	date, ok := f.export["date"]
	if !ok {
		date = time.Now().Format("2006-01-02")
	}
	ctx, stop := interruptible()
	defer stop()
	e := cli.Export{Out: html, Date: date}
	switch {
	case len(args) == 0:
		text, err := tui.SavedWorksheet("")
		if err != nil {
			fmt.Fprintln(errw, "argand:", calc.Printable(err.Error()))
			return cli.ExitBadInput
		}
		e.Name = "the saved session"
		return cli.ExportHTML(ctx, strings.NewReader(text), e, out, errw, f.opt)
	case args[0] == "-":
		e.Name = "stdin"
		return cli.ExportHTML(ctx, in, e, out, errw, f.opt)
	}
	file, err := os.Open(args[0])
	if err != nil {
		fmt.Fprintln(errw, "argand:", calc.Printable(cleanErr(err)))
		return cli.ExitBadInput
	}
	defer file.Close()
	e.Name = args[0]
	f.opt.Dir = filepath.Dir(args[0]) // a worksheet's readings files lie beside it
	return cli.ExportHTML(ctx, file, e, out, errw, f.opt)
}
