package sheet

import (
	"testing"

	"argand/calc"
)

// Every function name must be unique across packages and must not shadow a
// unit, a keyword or a constant, or a worksheet could not be read back.
func TestFunctionNamesUnique(t *testing.T) {
	seen := map[string]string{}
	for _, f := range calc.Builtins() {
		seen[f.Name] = "calc"
	}
	for _, f := range allFuncs() {
		if where, dup := seen[f.Name]; dup {
			t.Errorf("function %s defined twice (also in %s)", f.Name, where)
		}
		seen[f.Name] = "reduce"
	}
	// deg and rad are angle units after a number and conversions before
	// "("; thevenin is a statement before a name and a function before "(".
	both := map[string]bool{"deg": true, "rad": true, "thevenin": true}
	for name := range seen {
		if both[name] {
			continue
		}
		if calc.IsUnit(name) {
			t.Errorf("function %s reads as a unit", name)
		}
		if why, ok := readOnlyNames[name]; ok {
			t.Errorf("function %s is also %s", name, why)
		}
		for _, k := range keywords {
			if k.word == name && k.second == "" {
				t.Errorf("function %s is also a statement keyword", name)
			}
		}
	}
}

// Every function documents its arguments and what it computes, since help
// lists them.
func TestFunctionsDocumented(t *testing.T) {
	for _, f := range Functions() {
		if f.Doc == "" || f.Args == "" || f.Call == nil {
			t.Errorf("function %s lacks Doc, Args or Call", f.Name)
		}
		if f.Max >= 0 && f.Max < f.Min {
			t.Errorf("function %s: Max %d < Min %d", f.Name, f.Max, f.Min)
		}
	}
}
