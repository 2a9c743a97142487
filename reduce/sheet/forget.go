package sheet

import (
	"sort"
	"strings"

	"argand/calc"
)

// dependents lists the definitions and networks that read name.
func (s *Sheet) dependents(name string) []string {
	mine := map[string]bool{name: true}
	for _, d := range s.defs {
		if d.owner == name {
			mine[d.name] = true // NAME.key results go with NAME
		}
	}
	reads := func(deps map[string]bool) bool {
		for k := range deps {
			if mine[k] {
				return true
			}
		}
		return false
	}
	var out []string
	for _, d := range s.defs {
		if !mine[d.name] && reads(d.deps) {
			out = append(out, d.name)
		}
	}
	for _, n := range s.order {
		if reads(s.nets[n].deps) {
			out = append(out, "network "+n)
		}
	}
	sort.Strings(out)
	return out
}

// nameTarget reads the name a forget or rename statement acts on; verb
// and done (its past participle) word the errors.
func (s *Sheet) nameTarget(p *calc.Parser, verb, done string) (*def, calc.Item, bool) {
	t := p.Next()
	d, ok := s.byName[t.Text]
	switch {
	case t.Tok != calc.TokIdent:
		p.Failf(t, "%s takes the name of a value, as in %s Z3", verb, verb)
	case !ok:
		p.Failf(t, "no value named %q", t.Text)
	case d.owner != "":
		p.Failf(t, "%s is a result of %s: %s %s instead", t.Text, d.owner, verb, d.owner)
	case d.elem != nil && d.elem.net != "":
		p.Failf(t, "%s is an element of network %s and stays with it", t.Text, d.elem.net)
	default:
		if deps := s.dependents(t.Text); len(deps) > 0 {
			p.Failf(t, "%s cannot be %s: %s depend%s on it", t.Text, done,
				strings.Join(deps, ", "), map[bool]string{true: "s", false: ""}[len(deps) == 1])
			return nil, t, false
		}
		return d, t, true
	}
	return nil, t, false
}

// stmtForget runs: forget NAME — the value and its NAME.key results are
// removed. A value something else depends on cannot be forgotten.
func (s *Sheet) stmtForget(p *calc.Parser) error {
	p.Next()
	if t := p.Peek(); t.Tok == calc.TokIdent && s.spectra[t.Text] != nil {
		return s.forgetSpectrum(p)
	}
	d, _, ok := s.nameTarget(p, "forget", "forgotten")
	if !ok {
		return p.Err()
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	s.dropNames(func(x *def) bool { return x.name == d.name || x.owner == d.name })
	delete(s.tols, d.name)
	s.record(calc.Step{Kind: "forget", Source: p.Source(), Rule: d.name + " is no longer defined"})
	return nil
}

// forgetSpectrum removes a spectrum nothing depends on.
func (s *Sheet) forgetSpectrum(p *calc.Parser) error {
	t := p.Next()
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	if deps := s.dependents(t.Text); len(deps) > 0 {
		p.Failf(t, "spectrum %s cannot be forgotten: %s depend%s on it", t.Text, strings.Join(deps, ", "), map[bool]string{true: "s", false: ""}[len(deps) == 1])
		return p.Err()
	}
	delete(s.spectra, t.Text)
	s.record(calc.Step{Kind: "forget", Source: p.Source(), Rule: "spectrum " + t.Text + " is no longer defined"})
	return nil
}

// stmtRename runs: rename OLD to NEW — the value keeps its definition and
// history under the new name. A value something else depends on cannot be
// renamed, since their statements name it.
func (s *Sheet) stmtRename(p *calc.Parser) error {
	p.Next()
	d, _, ok := s.nameTarget(p, "rename", "renamed")
	if !ok {
		return p.Err()
	}
	if !expectWord(p, "to", "rename") {
		return p.Err()
	}
	nt := p.Next()
	if !s.validName(p, nt) {
		return p.Err()
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return err
	}
	if _, taken := s.byName[nt.Text]; taken {
		p.Failf(nt, "%s is already defined", nt.Text)
		return p.Err()
	}
	if _, taken := s.nets[nt.Text]; taken {
		p.Failf(nt, "%s is a network", nt.Text)
		return p.Err()
	}
	old := d.name
	for _, x := range append([]*def(nil), s.defs...) {
		if x.name == old || x.owner == old {
			delete(s.byName, x.name)
			if x.owner == old {
				x.owner = nt.Text
				x.name = nt.Text + "." + x.key
			} else {
				x.name = nt.Text
			}
			s.byName[x.name] = x
		}
	}
	if t, ok := s.tols[old]; ok {
		delete(s.tols, old)
		s.tols[nt.Text] = t
	}
	s.defined = append(s.defined, nt.Text)
	s.record(calc.Step{Kind: "rename", Source: p.Source(), Rule: old + " is now called " + nt.Text, Results: []calc.Operand{{Name: nt.Text, Value: d.value}}})
	return nil
}

// dropNames removes the definitions for which drop is true.
func (s *Sheet) dropNames(drop func(*def) bool) {
	keep := s.defs[:0]
	for _, d := range s.defs {
		if drop(d) {
			delete(s.byName, d.name)
			continue
		}
		keep = append(keep, d)
	}
	s.defs = keep
}
