package cli

import (
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
	"argand/tui/record"
	"argand/tui/store"
)

// Export says what argand export --html writes.
type Export struct {
	Out  string // the record's file; "-" for standard output
	Date string // YYYY-MM-DD
	// Name names the worksheet in messages: its file, "stdin" or the
	// saved session.
	Name string
}

// MaxExport bounds the worksheet a record is made of, in bytes: the record
// holds it whole, with every step of it.
const MaxExport = 8 << 20

// ExportHTML runs the worksheet src and writes its record (see package
// record) to e.Out. A worksheet with a bad line writes no record: each
// error is reported as argand run reports it, exit 2. A failed check is
// recorded as failed, and the exit code is 1, as for run.
func ExportHTML(ctx context.Context, src io.Reader, e Export, w, ew io.Writer, o Options) int {
	if err := record.ValidDate(e.Date); err != nil {
		fmt.Fprintln(ew, "argand: --date:", err)
		return ExitBadInput
	}
	text, err := io.ReadAll(io.LimitReader(stoppable(ctx, src), MaxExport+1))
	if err == nil && len(text) > MaxExport {
		err = fmt.Errorf("larger than %d MiB, more than a record can hold", MaxExport>>20)
	}
	if err != nil {
		fmt.Fprintf(ew, "argand: %s: %s\n", calc.Printable(e.Name), calc.Printable(err.Error()))
		return ExitBadInput
	}
	s, err := NewSheet(o)
	if err != nil {
		fmt.Fprintln(ew, "error:", err)
		return ExitBadInput
	}
	p := &Printer{W: ew, Err: ew, O: Options{ASCII: o.ASCII}}
	sum, err := s.RunAll(sheet.Job{Ctx: ctx}, strings.NewReader(string(text)), nil, func(pr sheet.Problem) { p.Problem(pr, e.Name) })
	switch {
	case sum.Interrupted > 0:
		return Interrupted(ew, sum.Interrupted)
	case err != nil:
		fmt.Fprintf(ew, "error: %s: %s\n", calc.Printable(e.Name), calc.Printable(err.Error()))
		return ExitBadInput
	case len(sum.Problems) > 0:
		fmt.Fprintf(ew, "argand: no record written: %s has %s (argand run lists them)\n", calc.Printable(e.Name), plural(len(sum.Problems), "bad line", "bad lines"))
		return ExitBadInput
	}
	var b strings.Builder
	if err := record.Write(&b, record.Job{Sheet: s, Source: string(text), Date: e.Date, PolarFirst: o.PolarFirst}); err != nil {
		fmt.Fprintln(ew, "argand:", calc.Printable(err.Error()))
		return ExitBadInput
	}
	if e.Out == "-" {
		io.WriteString(w, b.String())
	} else {
		if err := store.Publish(e.Out, []byte(b.String())); err != nil {
			fmt.Fprintf(ew, "argand: could not write %s: %s\n", calc.Printable(e.Out), calc.Printable(err.Error()))
			return ExitBadInput
		}
		abs, _ := filepath.Abs(e.Out)
		fmt.Fprintf(w, "wrote %s (%d bytes); checks: %d passed, %d failed\n", calc.Printable(abs), b.Len(), sum.Pass, sum.Fail)
	}
	if sum.Fail > 0 {
		return ExitCheckFail
	}
	return ExitOK
}

// ExtractSource writes the worksheet embedded in the record at path to w,
// so that argand run replays it.
func ExtractSource(path string, w, ew io.Writer) int {
	f, err := os.Open(path)
	if err != nil {
		fmt.Fprintln(ew, "argand:", calc.Printable(err.Error()))
		return ExitBadInput
	}
	defer f.Close()
	src, err := record.Extract(f)
	if err != nil {
		fmt.Fprintf(ew, "argand: %s: %s\n", calc.Printable(path), err)
		return ExitBadInput
	}
	io.WriteString(w, src)
	return ExitOK
}
