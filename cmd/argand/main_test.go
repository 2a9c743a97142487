package main

import (
	"bytes"
	"errors"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/creack/pty"
)

// bin is the argand binary, built once for all tests.
var bin string

func TestMain(m *testing.M) {
	dir, err := os.MkdirTemp("", "argand-test")
	if err != nil {
		panic(err)
	}
	bin = filepath.Join(dir, "argand")
	build := exec.Command("go", "build", "-o", bin, ".")
	build.Stderr = os.Stderr
	if err := build.Run(); err != nil {
		os.RemoveAll(dir)
		os.Stderr.WriteString("cannot build argand: " + err.Error() + "\n")
		os.Exit(2)
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

// env is a pinned environment: UTF-8 locale unless lang says otherwise.
func env(lang string) []string {
	return []string{"PATH=" + os.Getenv("PATH"), "HOME=" + os.TempDir(), "LANG=" + lang, "TERM=xterm"}
}

// argand runs the binary with a pinned locale and returns exit code,
// standard output and standard error.
func argand(t *testing.T, lang, stdin string, args ...string) (int, string, string) {
	t.Helper()
	cmd := exec.Command(bin, args...)
	cmd.Env = env(lang)
	cmd.Stdin = strings.NewReader(stdin)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	err := cmd.Run()
	code := 0
	var ee *exec.ExitError
	if errors.As(err, &ee) {
		code = ee.ExitCode()
	} else if err != nil {
		t.Fatalf("argand %v: %v", args, err)
	}
	for _, bad := range []string{"panic:", "goroutine ", "runtime error"} {
		if strings.Contains(out.String()+errb.String(), bad) {
			t.Errorf("argand %v printed %q:\n%s", args, bad, errb.String())
		}
	}
	return code, out.String(), errb.String()
}

const utf8Lang = "en_US.UTF-8"

func ws(name string) string { return filepath.Join("..", "..", "testdata", "worksheets", name) }

func TestCommandLine(t *testing.T) {
	tests := []struct {
		name string
		args []string
		code int
		out  string // substring of standard output
		err  string // substring of standard error
	}{
		{"eval after --", []string{"eval", "--", "-j4"}, 0, "→ x1 = -j4.000 = 4.000 ∠-90.00°", ""},
		{"eval several", []string{"eval", "3+j4 Ω", "Z1 || 10 Ω"}, 0, "→ Z2 = ", ""},
		{"digits 6", []string{"--digits", "6", "eval", "3+j4 Ω"}, 0, "5.00000 Ω ∠53.1301°", ""},
		{"digits=2", []string{"--digits=2", "eval", "3+j4 Ω"}, 0, "5.0 Ω ∠53°", ""},
		{"decimal comma", []string{"--decimal-comma", "eval", "parallel(2,2 kΩ; 4,7 kΩ)"}, 0, "1,499 kΩ", ""},
		{"decimal comma refuses the point", []string{"--decimal-comma", "eval", "2.2 mH"}, 2, "", "decimal point? write 2,2 mH, or set decimal point"},
		{"decimal point refuses the comma", []string{"eval", "2,2 mH"}, 2, "", "decimal comma? write 2.2 mH, or set decimal comma"},
		{"decimal comma takes no value", []string{"--decimal-comma=yes", "eval", "1"}, 2, "", "--decimal-comma takes no value"},
		{"digits 0", []string{"--digits", "0", "eval", "1"}, 2, "", "--digits"},
		{"digits 18", []string{"--digits", "18", "eval", "1"}, 2, "", "--digits"},
		{"digits word", []string{"--digits", "many", "eval", "1"}, 2, "", "--digits"},
		{"digits missing", []string{"eval", "1", "--digits"}, 2, "", "--digits"},
		{"ascii", []string{"--ascii", "eval", "3+j4 kΩ", "10 µF"}, 0, "5.000 kohm @53.13 deg", ""},
		{"version", []string{"--version"}, 0, "argand ", ""},
		{"help", []string{"help"}, 0, "exit codes: 0 ok, 1 a check failed, 2 bad input or usage, 130 interrupted", ""},
		{"--help lists 130", []string{"--help"}, 0, "130 interrupted (ctrl+c)", ""},
		{"help topic", []string{"help", "functions"}, 0, "zl", ""},
		{"help unknown topic", []string{"help", "nosuch"}, 2, "", "no help on"},
		{"--help", []string{"--help"}, 0, "usage", ""},
		{"unknown flag", []string{"--frobnicate", "eval", "1"}, 2, "", "unknown flag"},
		{"eval nothing", []string{"eval"}, 2, "", "eval needs"},
		{"eval bad", []string{"eval", "1 V + 1 Ω"}, 2, "", "argument:1:5: cannot combine V + Ω"},
		{"run ok", []string{"run", ws("motor.argand")}, 0, "checks: 3 passed, 0 failed", ""},
		{"run check fails", []string{"run", ws("checkfail.argand")}, 1, "checks: 1 passed, 1 failed", ""},
		{"run bad input", []string{"run", ws("error.argand")}, 2, "→ I = ", "error.argand:7:18:"},
		{"run missing file", []string{"run", "no/such/file.argand"}, 2, "", "no such file"},
		{"run no file", []string{"run"}, 2, "", "run takes one"},
		{"run json", []string{"--json", "run", ws("motor.argand")}, 0, `"unit":"Ω"`, ""},
		{"two words", []string{"a", "b"}, 2, "", "unexpected"},
		{"csv", []string{"--csv", "eval", "3+j4 Ω"}, 0, "line,kind,name,re,im,mag,deg,unit,quantity,basis\r\n1,eval,Z1,3,4,5,", ""},
		{"csv run check fails", []string{"--csv", "run", ws("checkfail.argand")}, 1, "line,check,verdict\r\n", "checks: 1 passed, 1 failed"},
		{"csv and json", []string{"--csv", "--json", "eval", "1"}, 2, "", "--json and --csv are two output forms"},
		{"csv takes no value", []string{"--csv=x", "eval", "1"}, 2, "", "--csv takes no value"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, out, errs := argand(t, utf8Lang, "", tt.args...)
			if code != tt.code {
				t.Errorf("exit %d, want %d\nstdout %.300s\nstderr %.300s", code, tt.code, out, errs)
			}
			if !strings.Contains(out, tt.out) {
				t.Errorf("stdout lacks %q:\n%.600s", tt.out, out)
			}
			if !strings.Contains(errs, tt.err) {
				t.Errorf("stderr lacks %q:\n%s", tt.err, errs)
			}
		})
	}
}

// TestRunStdin: run - reads the worksheet from standard input.
func TestRunStdin(t *testing.T) {
	code, out, _ := argand(t, utf8Lang, "Za = 3+j4 Ω\ncheck mag(Za) is 5 Ω within 0.01%\n", "run", "-")
	if code != 0 || !strings.Contains(out, "checks: 1 passed, 0 failed") {
		t.Errorf("exit %d:\n%s", code, out)
	}
	code, _, _ = argand(t, utf8Lang, "check 1 is 2\n", "run", "-")
	if code != 1 {
		t.Errorf("failed check: exit %d, want 1", code)
	}
}

// TestNoArgsNotTerminal: with no arguments and no terminal (as under go
// run in a script), argand runs the built-in example and exits 0.
func TestNoArgsNotTerminal(t *testing.T) {
	code, out, errs := argand(t, utf8Lang, "")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "example data") || !strings.Contains(out, "checks:") {
		t.Errorf("example not run:\n%.500s", out)
	}
}

// TestLocale: JSON is the same in every locale; text follows the locale
// (ASCII in the C locale) unless --ascii is given.
func TestLocale(t *testing.T) {
	for _, args := range [][]string{{"--json", "run", ws("motor.argand")}, {"--json", "eval", "3+j4 kΩ", "1/0"}, {"--json"}} {
		_, a, _ := argand(t, "C", "", args...)
		_, b, _ := argand(t, utf8Lang, "", args...)
		if a != b || a == "" {
			t.Errorf("%v: JSON differs between LANG=C and LANG=%s", args, utf8Lang)
		}
	}
	_, c, _ := argand(t, "C", "", "run", ws("motor.argand"))
	_, d, _ := argand(t, utf8Lang, "", "--ascii", "run", ws("motor.argand"))
	if c != d {
		t.Errorf("LANG=C text differs from --ascii text")
	}
	for i := 0; i < len(c); i++ {
		if c[i] >= 0x80 {
			t.Fatalf("LANG=C output has a non-ASCII byte at %d: %.80q", i, c[max(0, i-40):])
		}
	}
}

// TestNoStallInSilentTerminal runs argand eval 1 in a pseudo-terminal that
// never answers a query, as some SSH relays and scripts do. It must finish
// well inside a generous bound and write no escape sequence.
func TestNoStallInSilentTerminal(t *testing.T) {
	cmd := exec.Command(bin, "eval", "1")
	cmd.Env = env(utf8Lang)
	start := time.Now()
	f, err := pty.Start(cmd)
	if err != nil {
		t.Skipf("no pseudo-terminal here: %v", err)
	}
	defer f.Close()
	done := make(chan []byte, 1)
	go func() {
		b, _ := io.ReadAll(f) // ends with EIO when the child exits
		done <- b
	}()
	var out []byte
	select {
	case out = <-done:
	case <-time.After(10 * time.Second):
		cmd.Process.Kill()
		t.Fatalf("argand eval 1 still running after 10 s in a silent terminal")
	}
	cmd.Wait()
	d := time.Since(start)
	if d > 2*time.Second {
		t.Errorf("argand eval 1 took %v in a silent terminal, want < 2 s", d)
	}
	if bytes.IndexByte(out, 0x1b) >= 0 {
		t.Errorf("output holds an escape byte: %q", out)
	}
	if !bytes.Contains(out, []byte("1.000")) {
		t.Errorf("output %q lacks the result", out)
	}
	t.Logf("argand eval 1 in a silent pseudo-terminal: %v", d)
}

// TestInjection runs the built binary on worksheets that carry control
// sequences, as argand run, argand FILE (no terminal) and argand eval, and
// with them in a flag and a help topic: standard output and standard error
// hold no control character but the line feed, and show each sequence as
// its escape. The first case is the terminal clipboard write and screen
// clear of a bad line's comment (OSC 52 and CSI 2J, ECMA-48).
func TestInjection(t *testing.T) {
	dir := t.TempDir()
	seqs := []string{"\x1b]52;c;aGVsbG8=\x07\x1b[2J", "\u009b31m", "\u202e", "\r", "\x9b"}
	for _, seq := range seqs {
		file := filepath.Join(dir, "w.argand")
		if err := os.WriteFile(file, []byte("x = 3\ny = 1/0 # "+seq+"\n"), 0o600); err != nil {
			t.Fatal(err)
		}
		for _, args := range [][]string{
			{"run", file}, {file}, {"--ascii", "run", file}, {"--json", "run", file},
			{"eval", "z = 1 + " + seq}, {"--x" + seq}, {"help", seq}, {"run", file + seq},
		} {
			code, out, errs := argand(t, utf8Lang, "", args...)
			if code != 2 {
				t.Errorf("%q: exit %d, want 2", args, code)
			}
			for _, r := range out + errs {
				if r < 0x20 && r != '\n' || r == 0x7f || r >= 0x80 && r < 0xa0 || r >= 0x202a && r <= 0x202e || r == 0xfffd {
					t.Errorf("%q: control %U reaches the terminal:\n%q", args, r, out+errs)
					break
				}
			}
		}
	}
	// the example of the report, byte for byte
	file := filepath.Join(dir, "w.argand")
	if err := os.WriteFile(file, []byte("x = 3\ny = 1/0 # \033]52;c;aGVsbG8=\007\033[2J\n"), 0o600); err != nil {
		t.Fatal(err)
	}
	_, _, errs := argand(t, utf8Lang, "", "run", file)
	if !strings.Contains(errs, `\x1b]52;c;aGVsbG8=\x07\x1b[2J`) {
		t.Errorf("the sequence is not shown escaped:\n%s", errs)
	}
}

// TestPlainPiped: --plain reads the statements piped to it in the line
// mode (it once ignored them and ran the example), on a session of its own
// state directory.
func TestPlainPiped(t *testing.T) {
	cmd := exec.Command(bin, "--plain")
	cmd.Env = append(env(utf8Lang), "XDG_STATE_HOME="+t.TempDir())
	cmd.Stdin = strings.NewReader("Zpiped = 3+j4 Ω\nZpiped * 2\nquit\n")
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	if err := cmd.Run(); err != nil {
		t.Fatalf("argand --plain: %v\n%s", err, errb.String())
	}
	for _, want := range []string{"line mode", "Zpiped = 3.000 + j4.000 Ω", "6.000 + j8.000 Ω"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("--plain with piped statements lacks %q:\n%s", want, out.String())
		}
	}
}

// TestReadingsBesideWorksheet: argand run reads a readings file named by
// a relative path from the worksheet's folder, not the working directory;
// a perturbed reading fails its check with exit 1; export --html reads it
// alike. Example data: an
// invented 12 V bench circuit, I = 12 V / 10 Ω.
func TestReadingsBesideWorksheet(t *testing.T) {
	dir := t.TempDir()
	sheet := "resistor R1 = 10 Ω\nI1 = 12 V / R1\nreadings bench.csv\ncheck I1 is I_R1 within 0.5%\n"
	if err := os.WriteFile(filepath.Join(dir, "job.argand"), []byte(sheet), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		reading string
		code    int
	}{{"1.2", 0}, {"1.21", 1}} {
		body := "name,value,unit\r\nI_R1," + c.reading + ",A\r\n"
		if err := os.WriteFile(filepath.Join(dir, "bench.csv"), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
		code, out, errs := argand(t, "C", "", "--csv", "run", filepath.Join(dir, "job.argand"))
		if code != c.code {
			t.Errorf("reading %s A: exit %d, want %d\n%s%s", c.reading, code, c.code, out, errs)
		}
		// CSV is UTF-8 in every locale, as JSON is
		if !strings.Contains(out, "3,readings,I_R1,"+c.reading+",0,"+c.reading+",0,A,phasor,rms\r\n") || !strings.Contains(out, "R1,10,0,10,0,Ω,") {
			t.Errorf("reading %s A: output\n%s", c.reading, out)
		}
		// a job record of the worksheet reads the same file
		code, out, errs = argand(t, utf8Lang, "", "export", "--html", filepath.Join(dir, "job.html"), "--date", "2026-03-14", filepath.Join(dir, "job.argand"))
		if code != c.code {
			t.Errorf("export with reading %s A: exit %d, want %d\n%s%s", c.reading, code, c.code, out, errs)
		}
	}
}
