package cli

import (
	"strings"
	"testing"

	"argand/reduce/sheet"
)

// Help lists every statement keyword of the worksheet language: the help
// comes from the interpreter's keyword table, so none can be missed.
func TestHelpListsEveryKeyword(t *testing.T) {
	var out, errw strings.Builder
	if code := Help(nil, &out, &errw, Options{}); code != ExitOK {
		t.Fatalf("help: exit %d: %s", code, errw.String())
	}
	var forms []string
	for _, l := range strings.Split(out.String(), "\n") {
		if f := strings.Fields(l); len(f) > 0 {
			forms = append(forms, f[0])
		}
	}
	for _, k := range sheet.Keywords() {
		found := false
		for _, f := range forms {
			if f == k {
				found = true
				break
			}
		}
		if !found {
			t.Errorf("help has no line starting with the statement %q", k)
		}
	}
	if len(sheet.Keywords()) < 20 {
		t.Errorf("only %d keywords", len(sheet.Keywords()))
	}
}
