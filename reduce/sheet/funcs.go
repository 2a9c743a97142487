package sheet

import (
	"sort"

	"argand/calc"
	"argand/reduce"
	"argand/reduce/harmonic"
	"argand/reduce/power"
	"argand/reduce/site"
	"argand/reduce/sweep"
	"argand/reduce/threephase"
)

// allFuncs gathers the functions of every package that offers some to the
// worksheet language.
func allFuncs() []calc.Func {
	var out []calc.Func
	out = append(out, reduce.Funcs()...)
	out = append(out, power.Funcs()...)
	out = append(out, threephase.Funcs()...)
	out = append(out, sweep.Funcs()...)
	out = append(out, site.Funcs()...)
	out = append(out, harmonic.Funcs(nil, nil)...)
	return out
}

// Functions returns every function a worksheet can call, built-in ones
// first, sorted by name within each group, for help.
func Functions() []calc.Func {
	b := calc.Builtins()
	rest := allFuncs()
	sort.Slice(rest, func(i, j int) bool { return rest[i].Name < rest[j].Name })
	return append(b, rest...)
}

func sortStrings(s []string) { sort.Strings(s) }
