package sheet

import (
	"reflect"
	"strings"
	"testing"

	"argand/calc"
)

// TestLanguageCommaRule: the decimal comma changed how input is read
// (language 3): under the decimal point "2,2" is refused where language 2
// read two arguments, and under "decimal comma" 2,2 is two point two and
// ';' separates arguments. A worksheet that declares an older language
// lists every such line among those that read differently, refused or
// not; one saved now says language 3, and lists nothing.
func TestLanguageCommaRule(t *testing.T) {
	if calc.Language < 3 {
		t.Fatalf("calc.Language = %d: the comma rule is language 3", calc.Language)
	}
	tests := []struct {
		name    string
		ws      string
		changed []int
		errors  []int
	}{
		{"two numbers in a call", "language 2\nx = atan2(2,2)\ny = atan2(2, 2)\n", []int{2}, []int{2}},
		{"a digit group", "language 2\nx = 1,000 * 2\ny = 1 000 * 2\n", []int{2}, []int{2}},
		{"comma setting", "language 2\ndecimal comma\nL = 2,2 mH\nZ = parallel(2 Ω; 3 Ω)\nn = 3 * 2\n", []int{2, 3, 4}, nil},
		{"point setting stated", "language 2\ndecimal point\nL = 2.2 mH\n", []int{2}, nil},
		{"language 1 lists both rules", "language 1\nR = 4k7\nx = atan2(2,2)\n", []int{2, 3}, []int{3}},
		{"current language", LanguageLine() + "\ndecimal comma\nL = 2,2 mH\nZ = parallel(2 Ω; 3 Ω)\n", nil, nil},
		{"no language line", "decimal comma\nL = 2,2 mH\n", nil, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var errs []int
			sum, err := New().Run(strings.NewReader(tt.ws), nil)
			if err != nil {
				t.Fatal(err)
			}
			for _, p := range sum.Problems {
				errs = append(errs, p.Err.Line)
				if !strings.Contains(p.Err.Msg, "reads differently since language 3") {
					t.Errorf("line %d: %q does not say the reading changed", p.Err.Line, p.Err.Msg)
				}
			}
			if !reflect.DeepEqual(sum.Changed, tt.changed) {
				t.Errorf("changed %v, want %v", sum.Changed, tt.changed)
			}
			if !reflect.DeepEqual(errs, tt.errors) {
				t.Errorf("errors on lines %v, want %v", errs, tt.errors)
			}
		})
	}
	// a worksheet saved under the decimal comma declares the language
	// that has it, and replays listing nothing
	s := New()
	for _, l := range []string{"decimal comma", "L = 2,2 mH"} {
		if _, _, err := s.Exec(l); err != nil {
			t.Fatal(err)
		}
	}
	saved := s.Worksheet()
	if saved[0] != "language 3" || saved[1] != "decimal comma" {
		t.Errorf("saved worksheet begins %q", saved[:2])
	}
	sum, _ := New().Run(strings.NewReader(strings.Join(saved, "\n")), nil)
	if len(sum.Changed) != 0 || len(sum.Problems) != 0 {
		t.Errorf("replay of the saved worksheet: changed %v, problems %v", sum.Changed, sum.Problems)
	}
}
