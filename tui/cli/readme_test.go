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
	blocks := regexp.MustCompile("(?s)```\n(.*?)```").FindAllStringSubmatch(string(b), -1)
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
	blocks := regexp.MustCompile("(?s)```\n(.*?)```").FindAllStringSubmatch(string(b), -1)
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
