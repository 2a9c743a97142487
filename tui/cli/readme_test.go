package cli

import (
	"encoding/json"
	"fmt"
	"os"
	"regexp"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce/sheet"
)

// Every worksheet shown in README.md runs: exit 0 (no error, every check
// passes), so the documentation cannot drift from the program.
func TestReadmeWorksheets(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Skip("README.md not found:", err)
	}
	blocks := worksheetBlocks(string(b))
	ran := 0
	for _, m := range blocks {
		src := m[1]
		first := strings.TrimSpace(strings.SplitN(src, "\n", 2)[0])
		// command lines and shell sessions, not worksheets
		if strings.HasPrefix(first, "go ") || strings.HasPrefix(first, "argand") || strings.HasPrefix(first, "$") {
			continue
		}
		var out, errw strings.Builder
		if code := Run(strings.NewReader(src), "README", &out, &errw, Options{}); code != ExitOK {
			t.Errorf("README worksheet starting %q: exit %d\n%s", first, code, errw.String())
		}
		ran++
	}
	if ran < 5 {
		t.Errorf("only %d README worksheets found", ran)
	}
}

// TestReadmeWorksheetsDecimalComma: every README worksheet, rewritten for
// the decimal comma (2.2 → 2,2 and ',' → ';' between arguments), runs
// under --decimal-comma to the same results: the JSON values (which never
// change with the setting) agree exactly, step for step. The SI Brochure
// (9th ed., §5.4.4) allows either marker; the numbers must not depend on
// which one is typed.
func TestReadmeWorksheetsDecimalComma(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Skip("README.md not found:", err)
	}
	blocks := worksheetBlocks(string(b))
	ran, withDecimals := 0, 0
	for _, m := range blocks {
		src := m[1]
		first := strings.TrimSpace(strings.SplitN(src, "\n", 2)[0])
		if strings.HasPrefix(first, "go ") || strings.HasPrefix(first, "argand") || strings.HasPrefix(first, "$") {
			continue
		}
		lines := strings.Split(src, "\n")
		for i := range lines {
			lines[i] = sheet.ChangeMarker(lines[i], false)
		}
		comma := strings.Join(lines, "\n")
		if comma != src {
			withDecimals++
		}
		var pOut, pErr, cOut, cErr strings.Builder
		pc := Run(strings.NewReader(src), "README", &pOut, &pErr, Options{JSON: true})
		cc := Run(strings.NewReader(comma), "README", &cOut, &cErr, Options{JSON: true, Comma: true})
		if pc != ExitOK || cc != ExitOK {
			t.Errorf("README worksheet starting %q: exit %d with the point, %d with the comma\n%s%s\n%s", first, pc, cc, pOut.String(), cOut.String(), comma)
			continue
		}
		pv, cv := jsonValues(t, pOut.String()), jsonValues(t, cOut.String())
		if len(pv) != len(cv) || len(pv) == 0 {
			t.Errorf("README worksheet starting %q: %d objects with the point, %d with the comma", first, len(pv), len(cv))
			continue
		}
		for i := range pv {
			if pv[i] != cv[i] {
				t.Errorf("README worksheet starting %q, object %d:\npoint %s\ncomma %s", first, i, pv[i], cv[i])
			}
		}
		// and the text output shows the comma, never a value with a point
		var tOut, tErr strings.Builder
		if Run(strings.NewReader(comma), "README", &tOut, &tErr, Options{Comma: true}) != ExitOK {
			t.Errorf("README worksheet starting %q: text run failed", first)
		}
		if regexp.MustCompile(`→ \S+ = -?j?\d+\.\d`).MatchString(tOut.String()) {
			t.Errorf("README worksheet starting %q: a value shown with a point under the comma:\n%s", first, tOut.String())
		}
		ran++
	}
	if ran < 5 || withDecimals < 3 {
		t.Errorf("only %d README worksheets run, %d with decimals", ran, withDecimals)
	}
}

// jsonValues keeps of each JSON line what is a value: the name, the
// numbers, the unit, the kinds and the line; text written for people
// (the source as typed, rules, notes) is left out.
func jsonValues(t *testing.T, out string) []string {
	t.Helper()
	var vals []string
	for _, l := range strings.Split(strings.TrimSpace(out), "\n") {
		var m map[string]any
		if err := json.Unmarshal([]byte(l), &m); err != nil {
			t.Fatalf("not JSON: %q: %v", l, err)
		}
		var keep []string
		for _, k := range []string{"kind", "name", "re", "im", "mag", "deg", "unit", "basis", "quantity", "line", "pass", "checks_passed", "checks_failed"} {
			if v, ok := m[k]; ok {
				keep = append(keep, fmt.Sprintf("%s=%v", k, v))
			}
		}
		vals = append(vals, strings.Join(keep, " "))
	}
	return vals
}

// The README carries the one safety text word for word.
func TestReadmeSafety(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Skip("README.md not found:", err)
	}
	if !strings.Contains(string(b), calc.SafetyText) {
		t.Errorf("README.md lacks the safety text:\n%s", calc.SafetyText)
	}
}

// fence is a fenced block of README.md: its info string (csv, text or
// none) and its text.
type fence struct{ tag, body string }

// fences splits README.md into its fenced blocks, line by line, so that a
// block with an info string does not shift the pairing of the others.
func fences(readme string) []fence {
	var out []fence
	var cur *fence
	for _, l := range strings.SplitAfter(readme, "\n") {
		if strings.HasPrefix(l, "```") {
			if cur == nil {
				cur = &fence{tag: strings.TrimSpace(l[3:])}
			} else {
				out = append(out, *cur)
				cur = nil
			}
			continue
		}
		if cur != nil {
			cur.body += l
		}
	}
	return out
}

// worksheetBlocks returns README.md's untagged blocks as the submatches
// the tests read (index 1 the text): a block tagged csv or text is data
// or a fragment, not a worksheet.
func worksheetBlocks(readme string) [][]string {
	var out [][]string
	for _, f := range fences(readme) {
		if f.tag == "" {
			out = append(out, []string{"", f.body})
		}
	}
	return out
}

// readmeBlock returns the first fenced block of README.md tagged tag ("" for
// none) that holds text.
func readmeBlock(t *testing.T, readme, tag, text string) string {
	t.Helper()
	for _, f := range fences(readme) {
		if f.tag == tag && strings.Contains(f.body, text) {
			return f.body
		}
	}
	t.Fatalf("README.md has no block tagged %q holding %q", tag, text)
	return ""
}

// The README's CSV round trip is what argand does: the element table it
// shows is the bridge's --csv output (first five fields), and its readings
// file, beside the bridge worksheet with the lines it adds, passes every
// check.
func TestReadmeCSV(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Skip("README.md not found:", err)
	}
	readme := string(b)
	bridge := readmeBlock(t, readme, "", "network bridge reference gnd")
	shown := readmeBlock(t, readme, "", "$ argand run --csv bridge.argand")
	var out, errw strings.Builder
	Run(strings.NewReader(bridge), "bridge.argand", &out, &errw, Options{CSV: true})
	var got []string
	for _, part := range strings.Split(out.String(), "\r\n\r\n") {
		if strings.HasPrefix(part, "name,re v") {
			for _, l := range strings.Split(strings.TrimSpace(part), "\r\n") {
				f := strings.Split(l, ",")
				got = append(got, strings.Join(f[:5], ","))
			}
		}
	}
	lines := strings.Split(strings.TrimSpace(shown), "\n")
	if want := strings.Join(lines[2:], "\n"); strings.Join(got, "\n") != want {
		t.Errorf("README shows\n%s\nargand writes\n%s", want, strings.Join(got, "\n"))
	}
	dir := t.TempDir()
	csvText := readmeBlock(t, readme, "csv", "name,value,unit")
	if err := os.WriteFile(dir+"/bridge-readings.csv", []byte(csvText), 0o644); err != nil {
		t.Fatal(err)
	}
	added := readmeBlock(t, readme, "text", "readings bridge-readings.csv")
	out.Reset()
	errw.Reset()
	code := Run(strings.NewReader(bridge+added), "bridge.argand", &out, &errw, Options{Dir: dir})
	if code != ExitOK || !strings.Contains(out.String(), "checks: 4 passed, 0 failed") {
		t.Errorf("README readings: exit %d\n%s%s", code, out.String(), errw.String())
	}
}
