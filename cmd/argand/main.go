// Command argand is a terminal tool for AC circuit work with phasors.
//
// Usage:
//
//	argand                 open the app (last session, or the example)
//	argand FILE            open a worksheet in the app
//	argand eval EXPR...    evaluate each argument and print the steps
//	argand run FILE|-      run a worksheet and print every step
//	                       (--csv: its tables and results as CSV)
//	argand help [TOPIC]    print help
//	argand export --html OUT.html [--date YYYY-MM-DD] [WORKSHEET|-]
//	                       write a job record (the saved session by default)
//	argand export --source RECORD.html
//	                       print the worksheet a record holds
//	argand serve [FLAGS]   serve the app over SSH (loopback unless --listen)
//	argand --version
//
// Flags: --json, --csv, --digits N, --ascii, --polar, --plain, --new,
// --decimal-comma, --help (or -h). Exit codes: 0 ok, 1 a check failed,
// 2 bad input or usage, 130 interrupted (ctrl+c).
package main

import (
	// termbg must initialise before the UI library asks the terminal for
	// its background colour; see its package comment.
	_ "argand/tui/termbg"

	"context"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strconv"
	"strings"

	"argand/calc"
	"argand/tui"
	"argand/tui/cli"

	"github.com/charmbracelet/x/term"
)

// version is set at release time.
const version = "0.1.0"

// flags holds the command line after parsing.
type flags struct {
	opt     cli.Options
	plain   bool
	fresh   bool // --new: a blank session
	version bool
	help    bool
	args    []string
	// export's flags: --html OUT, --source RECORD, --date YYYY-MM-DD
	export map[string]string
}

// parse reads flags anywhere before "--"; everything else is an argument.
func parse(argv []string) (flags, error) {
	var f flags
	for i := 0; i < len(argv); i++ {
		a := argv[i]
		if a == "--" {
			f.args = append(f.args, argv[i+1:]...)
			break
		}
		if len(f.args) == 0 && a == "serve" {
			// serve has flags of its own, read by serveFlags
			f.args = append(f.args, argv[i:]...)
			break
		}
		if !strings.HasPrefix(a, "--") || a == "-" {
			if a == "-h" {
				f.help = true
				continue
			}
			f.args = append(f.args, a)
			continue
		}
		name, val, hasVal := strings.Cut(a[2:], "=")
		switch name {
		case "json":
			f.opt.JSON = true
		case "csv":
			f.opt.CSV = true
		case "ascii":
			f.opt.ASCII = true
		case "plain":
			f.plain = true
		case "new":
			f.fresh = true
		case "polar":
			f.opt.PolarFirst = true
		case "decimal-comma":
			f.opt.Comma = true
		case "version":
			f.version = true
		case "help":
			f.help = true
		case "html", "source", "date":
			if !hasVal {
				if i+1 >= len(argv) {
					return f, fmt.Errorf("--%s needs a value (see argand help)", name)
				}
				i++
				val = argv[i]
			}
			if f.export == nil {
				f.export = map[string]string{}
			}
			f.export[name] = val
			continue
		case "digits":
			if !hasVal {
				if i+1 >= len(argv) {
					return f, fmt.Errorf("--digits needs a number from 1 to %d", calc.MaxDigits)
				}
				i++
				val = argv[i]
			}
			n, err := strconv.Atoi(val)
			if err != nil || n < 1 || n > calc.MaxDigits {
				return f, fmt.Errorf("--digits takes a whole number from 1 to %d, not %q", calc.MaxDigits, val)
			}
			f.opt.Digits = n
		default:
			return f, fmt.Errorf("unknown flag --%s (see argand help)", name)
		}
		if hasVal && name != "digits" {
			return f, fmt.Errorf("--%s takes no value", name)
		}
	}
	if f.opt.JSON && f.opt.CSV {
		return f, fmt.Errorf("--json and --csv are two output forms: choose one")
	}
	return f, nil
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// interruptible returns a context that ctrl+c (SIGINT) ends, for the
// commands that print as they go; the app reads ctrl+c as a key instead.
func interruptible() (context.Context, context.CancelFunc) {
	return signal.NotifyContext(context.Background(), os.Interrupt)
}

func run(argv []string, in io.Reader, out, errw io.Writer) int {
	f, err := parse(argv)
	if err != nil {
		fmt.Fprintln(errw, "argand:", calc.Printable(err.Error()))
		return cli.ExitBadInput
	}
	if len(f.args) > 0 && f.args[0] == "serve" && !f.version && !f.help {
		// each client's LANG decides its glyphs, never the server's
		// locale: only an explicit --ascii applies to every session
		return runServe(f.args[1:], out, errw, f)
	}
	if f.export != nil && (len(f.args) == 0 || f.args[0] != "export") {
		fmt.Fprintln(errw, "argand: --html, --source and --date belong to argand export (see argand help)")
		return cli.ExitBadInput
	}
	if !f.opt.ASCII && !cli.UTF8Locale(os.Getenv) {
		f.opt.ASCII = true
	}
	switch {
	case f.version:
		fmt.Fprintln(out, "argand", version)
		return cli.ExitOK
	case f.help:
		return cli.Help(nil, out, errw, f.opt)
	}
	if len(f.args) == 0 {
		return open("", in, out, errw, f)
	}
	switch f.args[0] {
	case "eval":
		if len(f.args) < 2 {
			fmt.Fprintln(errw, "argand: eval needs at least one expression, as in argand eval '3+j4 Ω'")
			return cli.ExitBadInput
		}
		ctx, stop := interruptible()
		defer stop()
		return cli.EvalContext(ctx, f.args[1:], out, errw, f.opt)
	case "run":
		if len(f.args) != 2 {
			fmt.Fprintln(errw, "argand: run takes one worksheet file, or - for standard input")
			return cli.ExitBadInput
		}
		ctx, stop := interruptible()
		defer stop()
		if f.args[1] == "-" {
			return cli.RunContext(ctx, in, "stdin", out, errw, f.opt)
		}
		file, err := os.Open(f.args[1])
		if err != nil {
			fmt.Fprintln(errw, "argand:", calc.Printable(cleanErr(err)))
			return cli.ExitBadInput
		}
		defer file.Close()
		// a worksheet's readings and spectrum files lie beside it
		f.opt.Dir = filepath.Dir(f.args[1])
		return cli.RunContext(ctx, file, f.args[1], out, errw, f.opt)
	case "help":
		return cli.Help(f.args[1:], out, errw, f.opt)
	case "export":
		return runExport(f, in, out, errw)
	}
	if len(f.args) > 1 {
		fmt.Fprintf(errw, "argand: unexpected %q (see argand help)\n", f.args[1])
		return cli.ExitBadInput
	}
	return open(f.args[0], in, out, errw, f)
}

// open starts the app on a terminal, the line mode on a terminal that
// cannot address the screen or with --plain (which reads statements from
// standard input, piped or typed), and otherwise runs the worksheet (or
// the example) non-interactively.
func open(file string, in io.Reader, out, errw io.Writer, f flags) int {
	tty := term.IsTerminal(os.Stdin.Fd()) && term.IsTerminal(os.Stdout.Fd())
	switch {
	case !tty && !f.plain:
		ctx, stop := interruptible()
		defer stop()
		return cli.BatchContext(ctx, file, in, out, errw, f.opt)
	}
	opt := tui.Options{
		ASCII:      f.opt.ASCII,
		Color:      tui.ColorWanted(os.Getenv),
		PolarFirst: f.opt.PolarFirst,
		Digits:     f.opt.Digits,
		Comma:      f.opt.Comma,
		File:       file,
		New:        f.fresh,
	}
	if f.plain || os.Getenv("TERM") == "dumb" || os.Getenv("TERM") == "" {
		// the line mode works on the same session as the app
		ctx, stop := interruptible()
		defer stop()
		return tui.PlainContext(ctx, opt, in, out)
	}
	return tui.Run(opt, in, out, errw)
}

// cleanErr shortens an *os.PathError to what a person needs.
func cleanErr(err error) string {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Path + ": " + pe.Err.Error()
	}
	return err.Error()
}
