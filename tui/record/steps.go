package record

import (
	"math"
	"math/cmplx"
	"strconv"
	"strings"

	"argand/calc"
)

// steps writes every step of the trail, in order.
func (p *page) steps(steps []calc.Step) {
	p.b.WriteString("<main>\n<section id=\"steps\">\n<h2>Steps</h2>\n")
	if len(steps) == 0 {
		p.b.WriteString("<p>The worksheet made no steps.</p>\n")
	}
	for i := range steps {
		p.step(i+1, &steps[i])
	}
	p.b.WriteString("</section>\n")
}

// step writes one step: heading, rule and formula, the values in both
// forms, the network table, the check, diagrams, notes and cautions.
func (p *page) step(n int, s *calc.Step) {
	class := "step"
	if s.Kind == "setting" {
		class += " setting"
	}
	if s.Check != nil {
		class += map[bool]string{true: " pass", false: " fail"}[s.Check.Pass]
	}
	p.printf("<section class=\"%s\" id=\"step-%d\">\n<h3>", class, n)
	if s.Line > 0 {
		p.printf("<span class=\"ln\">line %d</span>", s.Line)
	} else {
		p.printf("<span class=\"ln\">step %d</span>", n)
	}
	head := s.Source
	if head == "" {
		head = s.Rule
	}
	p.printf("<code>%s</code></h3>\n", esc(head))
	if s.Rule != "" || s.Formula != "" {
		p.b.WriteString("<p class=\"rule\">")
		if s.Rule != "" && s.Rule != head {
			p.b.WriteString(esc(s.Rule))
			if s.Formula != "" {
				p.b.WriteString(": ")
			}
		}
		if s.Formula != "" {
			p.printf("<code class=\"formula\">%s</code>", esc(s.Formula))
		}
		p.b.WriteString("</p>\n")
	}
	p.values(s)
	p.rows(s)
	if s.Check != nil {
		p.check(s.Check)
	}
	p.diagrams(n, s)
	for _, note := range s.Notes {
		note = strings.TrimRight(note, "\n")
		if strings.Contains(note, "\n") {
			// a plot keeps its columns; it scrolls inside its own box
			p.printf("<pre class=\"plot\">%s</pre>\n", esc(note))
		} else {
			p.printf("<p class=\"note\">Note: %s</p>\n", esc(note))
		}
	}
	for _, c := range s.Cautions {
		p.printf("<p class=\"caution\">Caution (%s): %s; <a href=\"#caution-%s\">in full under Cautions</a>.</p>\n",
			esc(c.Topic.String()), esc(c.Topic.Line()), anchor(c.Topic))
	}
	p.b.WriteString("</section>\n")
}

// values writes the inputs and results, each in rectangular and polar
// form; a quantity with no angle (a magnitude, a signed real, a count) is
// written once.
func (p *page) values(s *calc.Step) {
	if len(s.Inputs)+len(s.Results) == 0 {
		return
	}
	first, second := "rectangular", "polar"
	if p.polarFirst {
		first, second = second, first
	}
	p.printf("<table class=\"values\">\n<thead><tr><th scope=\"col\">value</th><th scope=\"col\">%s</th><th scope=\"col\">%s</th></tr></thead>\n<tbody>\n", first, second)
	row := func(class, mark string, o calc.Operand) {
		p.printf("<tr class=\"%s\"><th scope=\"row\">%s%s</th>", class, mark, esc(o.Name))
		if o.Value.Scalar() {
			p.printf("<td class=\"val\" colspan=\"2\" data-k=\"value\">%s</td></tr>\n", esc(p.f.Rect(o.Value)))
			return
		}
		a, b := p.f.Rect(o.Value), p.f.Polar(o.Value)
		if p.polarFirst {
			a, b = b, a
		}
		p.printf("<td class=\"val\" data-k=\"%s\">%s</td><td class=\"val\" data-k=\"%s\">%s</td></tr>\n", first, esc(a), second, esc(b))
	}
	for _, o := range s.Inputs {
		row("input", "", o)
	}
	for _, o := range s.Results {
		row("result", "→ ", o)
	}
	p.b.WriteString("</tbody>\n</table>\n")
}

// rows writes a step's table (a solved network's elements), its columns
// the keys of the first row, each value in the form a table uses.
func (p *page) rows(s *calc.Step) {
	if len(s.Rows) == 0 {
		return
	}
	var keys []string
	seen := map[string]bool{}
	for _, r := range s.Rows {
		for _, v := range r.Values {
			if !seen[v.Name] {
				seen[v.Name] = true
				keys = append(keys, v.Name)
			}
		}
	}
	p.b.WriteString("<table class=\"values rows\">\n<thead><tr><th scope=\"col\">element</th>")
	for _, k := range keys {
		p.printf("<th scope=\"col\">%s</th>", esc(k))
	}
	p.b.WriteString("</tr></thead>\n<tbody>\n")
	for _, r := range s.Rows {
		p.printf("<tr><th scope=\"row\">%s</th>", esc(r.Name))
		for _, k := range keys {
			text := ""
			for _, v := range r.Values {
				if v.Name == k {
					text = p.f.Short(v.Value)
				}
			}
			p.printf("<td class=\"val\" data-k=\"%s\">%s</td>", esc(k), esc(text))
		}
		p.b.WriteString("</tr>\n")
	}
	p.b.WriteString("</tbody>\n</table>\n")
}

// check writes a check's verdict, what was compared and the difference.
func (p *page) check(c *calc.CheckOutcome) {
	p.printf("<p class=\"check\"><span class=\"verdict\">%s</span>: %s</p>\n", verdict(c.Pass), esc(p.difference(c)))
}

func verdict(pass bool) string {
	if pass {
		return "PASS"
	}
	return "FAIL"
}

// difference says what a check compared and by how much the values
// differ, as the command line reports it.
func (p *page) difference(c *calc.CheckOutcome) string {
	pct := p.percent(c.RelMag * 100)
	switch {
	case c.MagOnly:
		return "read " + p.f.Mag(cmplx.Abs(c.Got.V), c.Got.Dim, c.Got.Kind) + ", nominal " + p.f.Mag(cmplx.Abs(c.Want.V), c.Want.Dim, c.Want.Kind) +
			"; outside the range by " + p.f.Mag(real(c.Diff.V), c.Diff.Dim, c.Diff.Kind) + "; " + pct + " % from the nominal magnitude; " + c.Tolerance
	case c.Scalar:
		return "got " + p.f.Rect(c.Got) + ", expected " + p.f.Rect(c.Want) + "; difference " + p.f.Rect(c.Diff) + "; " + pct +
			" % of the expected value; tolerance " + c.Tolerance
	}
	return "got " + p.f.Both(c.Got, p.polarFirst) + ", expected " + p.f.Both(c.Want, p.polarFirst) + "; difference " + p.f.Polar(c.Diff) +
		"; magnitude " + pct + " %, angle " + p.f.AngleValue(c.DegDiff*math.Pi/180) + "; tolerance " + c.Tolerance
}

// percent writes a percentage to three significant figures, without
// e-notation.
func (p *page) percent(x float64) string {
	f := p.f
	f.Digits = 3
	return f.Rect(calc.Real(x, calc.Dim{}))
}

// checks lists every check of the worksheet in one table.
func (p *page) checks(steps []calc.Step) {
	p.b.WriteString("<section id=\"checks\">\n<h2>Checks</h2>\n")
	n := 0
	for i := range steps {
		c := steps[i].Check
		if c == nil {
			continue
		}
		if n == 0 {
			p.b.WriteString("<table class=\"values checks\">\n<thead><tr><th scope=\"col\">check</th><th scope=\"col\">verdict</th><th scope=\"col\">difference</th></tr></thead>\n<tbody>\n")
		}
		n++
		p.printf("<tr class=\"%s\"><th scope=\"row\"><a href=\"#step-%d\">%s</a></th><td class=\"verdict\" data-k=\"verdict\">%s</td><td data-k=\"difference\">%s</td></tr>\n",
			strings.ToLower(verdict(c.Pass)), i+1, esc(lineOf(&steps[i])), verdict(c.Pass), esc(p.difference(c)))
	}
	if n == 0 {
		p.b.WriteString("<p>The worksheet has no check statements.</p>\n")
	} else {
		p.b.WriteString("</tbody>\n</table>\n")
	}
	p.b.WriteString("</section>\n")
}

func lineOf(s *calc.Step) string {
	if s.Line > 0 {
		return "line " + strconv.Itoa(s.Line) + ": " + s.Source
	}
	return s.Source
}
