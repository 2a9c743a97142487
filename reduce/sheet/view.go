package sheet

import (
	"fmt"
	"sort"

	"argand/calc"
	"argand/reduce"
)

// NetworkView is a defined network as the app shows it: its elements with
// their solved values, its nodes, and the series-parallel reduction the
// worksheet made when it solved it, one step at a time. The app draws it
// as it is; it neither reduces the network again nor reads step text.
type NetworkView struct {
	Name      string
	Reference string // "" for a compact network, which has no named nodes
	Compact   string // the compact form as written, "" for a node block
	Elements  []ViewElement
	Nodes     []string // sorted
	// Z is the impedance the source sees, when the network was reduced.
	Z calc.Quantity
	// Steps is the reduction, empty when the network was solved by nodal
	// analysis only; Why then says why.
	Steps []ViewStep
	Why   string
}

// ViewElement is one element of a network view.
type ViewElement struct {
	Name     string
	Kind     string // resistor, inductor, capacitor, impedance, voltage source, current source
	From, To string // "" in a compact network
	Value    calc.Quantity
	// Solved says V, I and S hold the element's solution (a compact
	// network without a source has none).
	Solved  bool
	V, I, S calc.Quantity
}

// IsSource reports a voltage or current source.
func (e ViewElement) IsSource() bool {
	return e.Kind == reduce.VoltageSource.String() || e.Kind == reduce.CurrentSource.String()
}

// ValueText writes the element's component value: R, L and C as
// magnitudes with their unit, a source as a phasor, an impedance in
// rectangular form.
func (e ViewElement) ValueText(f calc.Format) string {
	switch e.Kind {
	case reduce.Resistor.String(), reduce.Inductor.String(), reduce.Capacitor.String():
		return f.Mag(real(e.Value.V), e.Value.Dim, 0)
	case reduce.VoltageSource.String(), reduce.CurrentSource.String():
		return f.Polar(e.Value)
	}
	return f.Rect(e.Value)
}

// ViewStep is one step of a reduction.
type ViewStep struct {
	Step calc.Step
	// Merge is set on a step that combines parts into an equivalent.
	Merge *ViewMerge
	// Hot lists the elements the step works on: those a merge combines,
	// or those inside the element or equivalent whose values it finds.
	Hot []string
}

// ViewMerge is a combination of parts into one equivalent.
type ViewMerge struct {
	Name     string   // such as Zeq3
	Parts    []string // element names or earlier equivalents
	Elements []string // every element inside it
}

// NetworkNames returns the defined networks' names, oldest first.
func (s *Sheet) NetworkNames() []string { return append([]string(nil), s.order...) }

// NetworkView returns the named network as the app shows it.
func (s *Sheet) NetworkView(name string) (*NetworkView, error) {
	nw, ok := s.nets[name]
	if !ok {
		return nil, fmt.Errorf("no network named %s", name)
	}
	v := &NetworkView{Name: nw.name, Reference: nw.ref, Why: nw.why}
	if nw.compact != nil {
		v.Compact = nw.src
	}
	if err := s.viewElements(nw, v); err != nil {
		return nil, err
	}
	seen := map[string]bool{}
	for _, e := range v.Elements {
		for _, n := range []string{e.From, e.To} {
			if n != "" && !seen[n] {
				seen[n] = true
				v.Nodes = append(v.Nodes, n)
			}
		}
	}
	sort.Strings(v.Nodes)
	if nw.red != nil {
		v.Z = nw.red.Z
		v.Steps = viewSteps(nw.red)
	} else if v.Why == "" {
		v.Why = "the network has no step-by-step reduction"
	}
	return v, nil
}

// viewElements lists a network's elements with their solved values: a
// node block's in the order written, a compact network's left to right in
// its form, then its source when it is fed.
func (s *Sheet) viewElements(nw *network, v *NetworkView) error {
	names := nw.elems
	if nw.tree != nil {
		names = nw.tree.Elements()
	}
	for _, name := range names {
		d, ok := s.byName[name]
		if !ok || d.elem == nil {
			return fmt.Errorf("element %s is not defined", name)
		}
		e := ViewElement{Name: name, Kind: d.elem.kind.String(), From: d.elem.from, To: d.elem.to, Value: d.elem.raw}
		if nw.tree != nil {
			e.From, e.To = "", ""
		}
		s.viewSolution(nw, &e)
		v.Elements = append(v.Elements, e)
	}
	if nw.tree != nil && nw.red != nil && nw.feed != nil {
		src := nw.red.Source
		e := ViewElement{Name: src.Name, Kind: reduce.VoltageSource.String()}
		if r, err := s.evaluator(nw.src, nw.line).Eval(nw.feed); err == nil {
			e.Value = r.Value
			if r.Value.Dim == calc.DimCurrent {
				e.Kind = reduce.CurrentSource.String()
			}
		}
		s.viewSolution(nw, &e)
		v.Elements = append(v.Elements, e)
	}
	return nil
}

// viewSolution fills an element's solved values from the network's
// results, when it has them.
func (s *Sheet) viewSolution(nw *network, e *ViewElement) {
	base := nw.name + "." + e.Name + "."
	vd, okv := s.byName[base+"v"]
	id, oki := s.byName[base+"i"]
	sd, oks := s.byName[base+"s"]
	if okv && oki && oks {
		e.Solved, e.V, e.I, e.S = true, vd.value, id.value, sd.value
	}
}

// viewSteps turns a reduction into view steps: each merge with its parts,
// and each step of the work back with the elements inside its subject.
func viewSteps(red *reduce.Reduction) []ViewStep {
	out := make([]ViewStep, len(red.Steps))
	inside := map[string][]string{}
	for i := range red.Merges {
		mg := &red.Merges[i]
		inside[mg.Name] = mg.Elements
		if mg.Step < len(out) {
			out[mg.Step].Merge = &ViewMerge{Name: mg.Name, Parts: mg.Parts, Elements: mg.Elements}
			out[mg.Step].Hot = mg.Elements
		}
	}
	for i, st := range red.Steps {
		out[i].Step = st
		if out[i].Merge != nil || i >= len(red.Subjects) || red.Subjects[i] == "" {
			continue
		}
		subj := red.Subjects[i]
		if els, ok := inside[subj]; ok {
			out[i].Hot = els
		} else {
			out[i].Hot = []string{subj}
		}
	}
	return out
}
