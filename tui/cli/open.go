package cli

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"strings"

	"argand/calc"
	"argand/reduce/sheet"
)

// Batch runs a worksheet file, or the built-in example when file is "",
// without a terminal: every step printed, exit as for run.
func Batch(file string, in io.Reader, w, ew io.Writer, o Options) int {
	if file == "" {
		if !o.JSON {
			fmt.Fprintln(w, "# built-in example worksheet (example data, invented scenario)")
		}
		return Run(strings.NewReader(Example), "example", w, ew, o)
	}
	f, err := os.Open(file)
	if err != nil {
		fmt.Fprintln(ew, "argand:", err)
		return ExitBadInput
	}
	defer f.Close()
	return Run(f, file, w, ew, o)
}

// Plain is the line-by-line mode for terminals that cannot address the
// screen: a prompt, then each statement's steps or its error as lines.
// Besides statements it reads: list, undo, save FILE, help, quit.
func Plain(file string, in io.Reader, w, ew io.Writer, o Options) int {
	p := &Printer{W: w, Err: w, O: o}
	var history []string
	s, err := NewSheet(o)
	if err != nil {
		fmt.Fprintln(ew, "argand:", err)
		return ExitBadInput
	}
	load := func(src string) {
		sum, _ := s.Run(strings.NewReader(src), func(steps []calc.Step) { p.Steps(s, steps) })
		history = s.Statements()
		if sum.Err != nil {
			p.Error(sum.Err, sum.ErrSrc, file)
		}
	}
	if file != "" {
		b, err := os.ReadFile(file)
		if err != nil {
			fmt.Fprintln(ew, "argand:", err)
			return ExitBadInput
		}
		load(string(b))
	}
	fmt.Fprintln(w, "argand line mode: type a statement, or help, list, undo, save FILE, quit.")
	br := bufio.NewReader(in)
	for {
		prompt := "> "
		if n := s.OpenNetwork(); n != "" {
			prompt = n + "> "
		}
		fmt.Fprint(w, prompt)
		line, n, err := sheet.ReadLine(br)
		if err != nil {
			fmt.Fprintln(w)
			return ExitOK
		}
		if n > calc.MaxLine {
			fmt.Fprintf(w, "error: line too long: %d bytes (the limit is %d)\n", n, calc.MaxLine)
			continue
		}
		cmd := strings.TrimSpace(line)
		switch {
		case cmd == "quit" || cmd == "exit":
			return ExitOK
		case cmd == "help":
			Help(nil, w, w, o)
			continue
		case cmd == "list":
			f := s.Context().Format
			f.ASCII = o.ASCII
			for _, e := range s.Entries() {
				fmt.Fprintf(w, "  %-10s %s\n", e.Name, f.Both(e.Value, o.PolarFirst))
			}
			continue
		case cmd == "undo":
			if len(history) == 0 {
				fmt.Fprintln(w, "nothing to undo")
				continue
			}
			history = history[:len(history)-1]
			ns, _ := NewSheet(o)
			for _, h := range history {
				ns.Exec(h)
			}
			s = ns
			fmt.Fprintln(w, "undone; worksheet replayed to", len(history), "lines")
			continue
		case strings.HasPrefix(cmd, "save "):
			name := strings.TrimSpace(cmd[5:])
			data := strings.Join(s.Statements(), "\n") + "\n"
			if err := os.WriteFile(name, []byte(data), 0o644); err != nil {
				fmt.Fprintln(w, "error:", err)
			} else {
				fmt.Fprintln(w, "saved", name)
			}
			continue
		}
		steps, err := s.Exec(line)
		if err != nil {
			e, ok := err.(*calc.Error)
			if !ok {
				e = &calc.Error{Line: s.Line(), Col: 1, Len: 1, Msg: err.Error()}
			}
			p.Error(e, line, "")
			continue
		}
		history = append(history, line)
		p.Steps(s, steps)
	}
}
