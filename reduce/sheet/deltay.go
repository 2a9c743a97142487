package sheet

import (
	"fmt"

	"argand/calc"
	"argand/reduce"
)

// triangle is a Δ of three passive elements of a network, replaced by its
// equivalent Y in a derived network.
type triangle struct {
	base  string    // the network converted
	elems [3]string // the Δ sides, as named
	nodes [3]string // a, b, c: elems[0] joins a–b, elems[1] b–c, elems[2] c–a
	star  string    // the new star node
}

// stmtDeltaY runs: deltay NEW = NET triangle E1 E2 E3. It defines network
// NEW as NET with the Δ formed by the three named elements replaced by its
// equivalent Y around a new node, which can make a bridge series-parallel.
// The Y arms are worked out from the Δ at every solve, so NEW stays live.
func (s *Sheet) stmtDeltaY(p *calc.Parser) error {
	nameTok, base, toks, err := s.readDeltaY(p)
	if err != nil {
		return err
	}
	tri, err := s.triangleOf(p, base, toks)
	if err != nil {
		return err
	}
	tri.star = freeNode(s, base, nameTok.Text+"_star")
	nw := &network{name: nameTok.Text, ref: base.ref, line: s.line, tri: tri, deps: map[string]bool{"f": true, "net:" + base.name: true}}
	for _, e := range base.elems {
		nw.deps[e] = true
		skip := false
		for _, t := range tri.elems {
			skip = skip || e == t
		}
		if !skip {
			nw.elems = append(nw.elems, e)
		}
	}
	s.nets[nw.name] = nw
	s.order = append(s.order, nw.name)
	if err := s.solve(nw, "network "+nw.name+": "+base.name+" with the Δ "+tri.elems[0]+", "+tri.elems[1]+", "+tri.elems[2]+" replaced by its Y"); err != nil {
		delete(s.nets, nw.name)
		s.order = s.order[:len(s.order)-1]
		return lineErr(s.line, 1, 6, "network %s: %v", nw.name, err)
	}
	return nil
}

// readDeltaY reads a deltay statement to the end of the line: the new
// network's name, free for a network, the network converted, a node block
// (a compact one has no triangle), and the three element names as typed.
func (s *Sheet) readDeltaY(p *calc.Parser) (nameTok calc.Item, base *network, toks [3]calc.Item, err error) {
	p.Next()
	nameTok = p.Next()
	if !s.validName(p, nameTok) {
		return nameTok, nil, toks, p.Err()
	}
	if _, ok := s.nets[nameTok.Text]; ok {
		p.Failf(nameTok, "network %s is already defined", nameTok.Text)
		return nameTok, nil, toks, p.Err()
	}
	if _, ok := s.byName[nameTok.Text]; ok {
		p.Failf(nameTok, "%s is already a named value", nameTok.Text)
		return nameTok, nil, toks, p.Err()
	}
	if !p.IsOp("=") {
		return nameTok, nil, toks, perr(p, "expected '=': deltay NEW = NETWORK triangle E1 E2 E3")
	}
	p.Next()
	netTok := p.Next()
	base, ok := s.nets[netTok.Text]
	if !ok {
		p.Failf(netTok, "no network named %q", netTok.Text)
		return nameTok, nil, toks, p.Err()
	}
	if base.compact != nil {
		p.Failf(netTok, "%s is a compact series-parallel network: it has no triangle to convert", netTok.Text)
		return nameTok, nil, toks, p.Err()
	}
	if !expectWord(p, "triangle", "deltay") {
		return nameTok, nil, toks, p.Err()
	}
	for k := range toks {
		toks[k] = p.Next()
		if toks[k].Tok != calc.TokIdent {
			p.Failf(toks[k], "deltay names three elements of %s that form a triangle", base.name)
			return nameTok, nil, toks, p.Err()
		}
	}
	p.ExpectEnd()
	if err := p.Err(); err != nil {
		return nameTok, nil, toks, err
	}
	return nameTok, base, toks, nil
}

// triangleOf checks that the three named elements are distinct passive
// elements of base joining three nodes pairwise, in order around the
// triangle, and returns the triangle they form (its star node still to
// be named).
func (s *Sheet) triangleOf(p *calc.Parser, base *network, toks [3]calc.Item) (*triangle, error) {
	in := map[string]bool{}
	for _, e := range base.elems {
		in[e] = true
	}
	tri := &triangle{base: base.name}
	var ends [3][2]string
	for k, t := range toks {
		d, ok := s.byName[t.Text]
		if !ok || !in[t.Text] {
			p.Failf(t, "%s is not an element of network %s", t.Text, base.name)
			return nil, p.Err()
		}
		if d.elem.kind.IsSource() {
			p.Failf(t, "%s is a source: a Δ–Y conversion takes three passive elements", t.Text)
			return nil, p.Err()
		}
		for j := 0; j < k; j++ {
			if tri.elems[j] == t.Text {
				p.Failf(t, "%s is named twice", t.Text)
				return nil, p.Err()
			}
		}
		tri.elems[k] = t.Text
		ends[k] = [2]string{d.elem.from, d.elem.to}
	}
	// the three elements must join exactly three nodes pairwise
	a, b := ends[0][0], ends[0][1]
	c, ok1 := otherEnd(ends[1], b)
	back, ok2 := otherEnd(ends[2], c)
	if !ok1 || !ok2 || back != a || a == b || b == c || c == a {
		return nil, lineErr(s.line, toks[0].Col, toks[2].End-toks[0].Off, "%s, %s and %s do not form a triangle: name them in order around it (the first joins a–b, the second b–c, the third c–a)", tri.elems[0], tri.elems[1], tri.elems[2])
	}
	tri.nodes = [3]string{a, b, c}
	return tri, nil
}

// otherEnd returns the node an element with ends e joins to x, and
// whether it touches x at all.
func otherEnd(e [2]string, x string) (string, bool) {
	if e[0] == x {
		return e[1], true
	}
	if e[1] == x {
		return e[0], true
	}
	return "", false
}

// freeNode returns a node name not used in the network.
func freeNode(s *Sheet, nw *network, want string) string {
	used := map[string]bool{}
	for _, e := range nw.elems {
		if d, ok := s.byName[e]; ok && d.elem != nil {
			used[d.elem.from], used[d.elem.to] = true, true
		}
	}
	name := want
	for k := 2; used[name]; k++ {
		name = fmt.Sprintf("%s%d", want, k)
	}
	return name
}

// yArms adds the Y equivalent of a network's triangle to out, with the
// conversion's steps.
func (s *Sheet) yArms(tri *triangle, out *reduce.Network) ([]calc.Step, error) {
	var ops [3]calc.Operand
	for k, e := range tri.elems {
		d, ok := s.byName[e]
		if !ok || d.elem == nil {
			return nil, fmt.Errorf("element %s is not defined", e)
		}
		ops[k] = calc.Operand{Name: e, Value: d.value}
	}
	za, zb, zc, steps, err := reduce.DeltaToY(ops[0], ops[1], ops[2])
	if err != nil {
		return nil, err
	}
	for k, z := range []calc.Quantity{za, zb, zc} {
		out.Elements = append(out.Elements, reduce.Element{Name: "Y_" + tri.nodes[k], Kind: reduce.Impedance,
			From: tri.nodes[k], To: tri.star, Z: z.V, Raw: z.V})
	}
	for i := range steps {
		steps[i].Notes = append(steps[i].Notes, fmt.Sprintf("nodes: a = %s, b = %s, c = %s; the Y arms Y_%s, Y_%s, Y_%s meet at the new node %s",
			tri.nodes[0], tri.nodes[1], tri.nodes[2], tri.nodes[0], tri.nodes[1], tri.nodes[2], tri.star))
	}
	return steps, nil
}
