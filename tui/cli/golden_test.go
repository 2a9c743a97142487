package cli

import (
	"argand/tui/internal/golden"

	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The worksheets live in the repository's testdata; their data are
// invented examples, labelled as such in each file.
const (
	worksheetDir = "../../testdata/worksheets"
	goldenDir    = "../../testdata/golden"
)

// modes are the output forms pinned by golden files. The locale is pinned
// by passing the ASCII option explicitly: cli.Run never reads the
// environment, the command line maps the locale to this option.
var modes = []struct {
	name string
	opt  Options
}{
	{"text", Options{ASCII: false}},
	{"ascii", Options{ASCII: true}},
	{"json", Options{JSON: true, ASCII: false}},
}

// runOutput is what a person or a program sees from one run.
func runOutput(code int, out, errb string) string {
	return fmt.Sprintf("exit %d\n-- stdout --\n%s-- stderr --\n%s", code, out, errb)
}

func checkGolden(t *testing.T, file, got string) {
	t.Helper()
	golden.Check(t, filepath.Join(goldenDir, file), got)
}

func TestGoldenRun(t *testing.T) {
	files, err := filepath.Glob(filepath.Join(worksheetDir, "*.argand"))
	if err != nil || len(files) < 3 {
		t.Fatalf("worksheets: %v %v", files, err)
	}
	wantExit := map[string]int{"checkfail": ExitCheckFail, "error": ExitBadInput}
	for _, f := range files {
		src, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		base := strings.TrimSuffix(filepath.Base(f), ".argand")
		if !bytes.Contains(src[:min(len(src), 200)], []byte("EXAMPLE DATA")) {
			t.Errorf("%s: not labelled as example data", f)
		}
		for _, m := range modes {
			t.Run(base+"/"+m.name, func(t *testing.T) {
				var out, errb bytes.Buffer
				code := Run(bytes.NewReader(src), base+".argand", &out, &errb, m.opt)
				if code != wantExit[base] {
					t.Errorf("exit %d, want %d; stderr %s", code, wantExit[base], errb.String())
				}
				if m.opt.ASCII {
					assertASCII(t, out.String()+errb.String())
				}
				checkGolden(t, base+"."+m.name+".golden", runOutput(code, out.String(), errb.String()))
			})
		}
	}
}

// TestGoldenExample pins the built-in example worksheet as run without a
// terminal (argand with no arguments, output not a terminal).
func TestGoldenExample(t *testing.T) {
	if !strings.Contains(Example, "EXAMPLE DATA") {
		t.Errorf("the built-in example is not labelled as example data")
	}
	for _, m := range modes {
		t.Run(m.name, func(t *testing.T) {
			var out, errb bytes.Buffer
			code := Batch("", strings.NewReader(""), &out, &errb, m.opt)
			if code != ExitOK {
				t.Errorf("example exits %d: %s", code, errb.String())
			}
			if m.opt.ASCII {
				assertASCII(t, out.String()+errb.String())
			}
			checkGolden(t, "example."+m.name+".golden", runOutput(code, out.String(), errb.String()))
		})
	}
}

// TestJSONSameInASCII: ASCII mode changes only what a person reads; JSON
// stays UTF-8 and is byte for byte the same.
func TestJSONSameInASCII(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join(worksheetDir, "*.argand"))
	files = append(files, "")
	for _, f := range files {
		var a, b, ea, eb bytes.Buffer
		if f == "" {
			Batch("", nil, &a, &ea, Options{JSON: true})
			Batch("", nil, &b, &eb, Options{JSON: true, ASCII: true})
		} else {
			src, _ := os.ReadFile(f)
			Run(bytes.NewReader(src), "w", &a, &ea, Options{JSON: true})
			Run(bytes.NewReader(src), "w", &b, &eb, Options{JSON: true, ASCII: true})
		}
		if a.String() != b.String() || ea.String() != eb.String() {
			t.Errorf("%s: JSON differs between UTF-8 and ASCII mode", f)
		}
		if f != "" && !strings.Contains(a.String(), `"unit":"Ω"`) && !strings.Contains(a.String(), `"unit":"V"`) {
			t.Errorf("%s: JSON without unit symbols?", f)
		}
	}
}

func assertASCII(t *testing.T, s string) {
	t.Helper()
	for i, line := range strings.Split(s, "\n") {
		for _, r := range line {
			if r >= 0x80 {
				t.Errorf("ASCII mode output line %d has %q: %s", i+1, r, line)
				break
			}
		}
	}
}
