package cli

import (
	"os"
	"regexp"
	"strings"
	"testing"
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
