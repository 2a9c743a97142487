package record

import (
	"math"
	"math/cmplx"
	"strconv"
	"strings"

	"argand/calc"
)

// The diagrams are drawn from the values, in SVG user units: a square for
// a phasor diagram, a wider box for a power triangle. They scale down with
// the page (max-width: 100%) and keep their proportions.
const (
	phasorSize = 320.0
	phasorR    = 100.0 // the longest phasor of each kind: room for its name beyond
	maxLabel   = 10    // characters of a name written at its tip (the table has it whole)
	triW       = 320.0
	triH       = 200.0
	triMargin  = 28.0
	maxArrows  = 12 // more would not be read; the table lists them all
)

// arrow is one phasor to draw.
type arrow struct {
	name string
	q    calc.Quantity
}

// diagrams draws a step's phasor diagram (its voltage and current
// phasors, inputs and results) and a power triangle for each complex
// power it results in.
func (p *page) diagrams(n int, s *calc.Step) {
	var arrows []arrow
	seen := map[string]bool{}
	for _, o := range append(append([]calc.Operand(nil), s.Inputs...), s.Results...) {
		if calc.QuantityName(o.Value) != "phasor" || seen[o.Name] || len(arrows) == maxArrows {
			continue
		}
		seen[o.Name] = true
		arrows = append(arrows, arrow{o.Name, o.Value})
	}
	if len(arrows) > 0 {
		svg, caption := p.phasorSVG(arrows)
		p.figure(n, svg, caption)
	}
	drawn := map[complex128]bool{}
	for _, o := range s.Results {
		// a function's result and its .s extra are one power: one triangle
		if calc.QuantityName(o.Value) == "complex-power" && cmplx.Abs(o.Value.V) > 0 && !drawn[o.Value.V] {
			drawn[o.Value.V] = true
			svg, caption := p.triangleSVG(o)
			p.figure(n, svg, caption)
		}
	}
}

func (p *page) figure(n int, svg, caption string) {
	p.figures++
	p.printf("<figure id=\"fig-%d\">\n%s<figcaption>%s</figcaption>\n</figure>\n", p.figures, svg, esc(caption))
}

// num writes a coordinate to 0.1 unit: finer than any screen or printer
// shows, and the same on every machine.
func num(x float64) string {
	x = math.Round(x*10) / 10
	if x == 0 {
		x = 0 // no "-0"
	}
	return strconv.FormatFloat(x, 'f', -1, 64)
}

// kindOf is the kind of phasor: voltage or current, each drawn in its own
// style and to its own scale.
func kindOf(q calc.Quantity) string {
	if q.Dim == calc.DimCurrent {
		return "current"
	}
	return "voltage"
}

// phasorSVG draws phasors from a common origin, the real axis to the right
// and +j up, so that a positive angle turns counter-clockwise. Voltages
// and currents are each scaled so that the longest of the kind reaches the
// full radius (the usual practice: two kinds share no unit), voltages
// solid and currents dashed, so colour is never the only mark.
func (p *page) phasorSVG(arrows []arrow) (svg, caption string) {
	longest := map[string]float64{}
	for _, a := range arrows {
		k := kindOf(a.q)
		longest[k] = math.Max(longest[k], cmplx.Abs(a.q.V))
	}
	c := phasorSize / 2
	var b strings.Builder
	names := make([]string, len(arrows))
	for i, a := range arrows {
		names[i] = a.name
	}
	b.WriteString(`<svg xmlns="http://www.w3.org/2000/svg" class="phasors" viewBox="0 0 320 320" width="320" height="320" role="img" aria-label="phasor diagram">` + "\n")
	b.WriteString("<title>" + esc("phasor diagram: "+strings.Join(names, ", ")) + "</title>\n")
	b.WriteString(`<path d="M16 160H304M160 304V16" stroke="#888" stroke-width="1" fill="none" />` + "\n")
	b.WriteString(`<text x="306" y="156" font-size="12" text-anchor="end" fill="#555">+1</text>` + "\n")
	b.WriteString(`<text x="166" y="26" font-size="12" fill="#555">+j</text>` + "\n")
	var zero []string
	for _, a := range arrows {
		m := cmplx.Abs(a.q.V)
		if m == 0 || longest[kindOf(a.q)] == 0 {
			zero = append(zero, a.name)
			continue
		}
		s := phasorR / longest[kindOf(a.q)]
		b.WriteString(arrowSVG(a.name, c, c, c+real(a.q.V)*s, c-imag(a.q.V)*s, kindOf(a.q) == "current"))
	}
	b.WriteString("</svg>\n")
	return b.String(), p.phasorCaption(longest, zero)
}

func (p *page) phasorCaption(longest map[string]float64, zero []string) string {
	var scales []string
	if v, ok := longest["voltage"]; ok && v > 0 {
		scales = append(scales, "voltages (solid) to "+p.f.Mag(v, calc.DimVoltage, calc.KindMagnitude))
	}
	if i, ok := longest["current"]; ok && i > 0 {
		scales = append(scales, "currents (dashed) to "+p.f.Mag(i, calc.DimCurrent, calc.KindMagnitude))
	}
	caption := "Phasor diagram, drawn from the values: +j up, a positive angle turns counter-clockwise."
	if len(scales) > 0 {
		caption += " Full radius: " + strings.Join(scales, "; ") + "."
	}
	if len(zero) > 0 {
		caption += " Zero, not drawn: " + strings.Join(zero, ", ") + "."
	}
	return caption
}

// arrowSVG draws one arrow from (x0, y0) to (x1, y1) with its head and its
// name beyond the tip.
func arrowSVG(name string, x0, y0, x1, y1 float64, dashed bool) string {
	dx, dy := x1-x0, y1-y0
	l := math.Hypot(dx, dy)
	ux, uy := dx/l, dy/l
	h := math.Min(10, l*0.4)
	bx, by := x1-ux*h, y1-uy*h
	nx, ny := -uy*h*0.45, ux*h*0.45
	colour, dash := "#1f4e9a", ""
	if dashed {
		colour, dash = "#9a3412", ` stroke-dasharray="6 3"`
	}
	anchor := "middle"
	switch {
	case ux > 0.3:
		anchor = "start"
	case ux < -0.3:
		anchor = "end"
	}
	var b strings.Builder
	b.WriteString(`<g class="phasor">` + "\n<title>" + esc(name) + "</title>\n")
	b.WriteString(`<line x1="` + num(x0) + `" y1="` + num(y0) + `" x2="` + num(bx) + `" y2="` + num(by) + `" stroke="` + colour + `" stroke-width="2"` + dash + " />\n")
	b.WriteString(`<polygon points="` + num(x1) + "," + num(y1) + " " + num(bx+nx) + "," + num(by+ny) + " " + num(bx-nx) + "," + num(by-ny) + `" fill="` + colour + `" />` + "\n")
	b.WriteString(`<text x="` + num(x1+ux*8) + `" y="` + num(y1+uy*8+4) + `" font-size="12" text-anchor="` + anchor + `" fill="` + colour + `">` + esc(label(name)) + "</text>\n")
	b.WriteString("</g>\n")
	return b.String()
}

// label shortens a long name for the drawing.
func label(name string) string {
	r := []rune(calc.Printable(name))
	if len(r) <= maxLabel {
		return string(r)
	}
	return string(r[:maxLabel-1]) + "…"
}

// triangleSVG draws the power triangle of a complex power S = P + jQ: P
// along the real axis, Q at right angles to it (up for Q > 0, lagging), S
// the hypotenuse from the origin, φ the angle between P and S. Both axes
// share one scale, so the angle on the page is the angle of S.
func (p *page) triangleSVG(o calc.Operand) (svg, caption string) {
	P, Q := real(o.Value.V), imag(o.Value.V)
	tiny := cmplx.Abs(o.Value.V) * 1e-9
	xmin, xmax := math.Min(0, P), math.Max(0, P)
	ymin, ymax := math.Min(0, Q), math.Max(0, Q)
	s := math.Min((triW-2*triMargin)/math.Max(xmax-xmin, tiny), (triH-2*triMargin)/math.Max(ymax-ymin, tiny))
	// centre the drawing in the box
	ox := (triW-(xmax-xmin)*s)/2 - xmin*s
	oy := (triH-(ymax-ymin)*s)/2 + ymax*s
	X := func(x float64) float64 { return ox + x*s }
	Y := func(y float64) float64 { return oy - y*s }
	var b strings.Builder
	b.WriteString(`<svg xmlns="http://www.w3.org/2000/svg" class="triangle" viewBox="0 0 320 200" width="320" height="200" role="img" aria-label="power triangle">` + "\n")
	b.WriteString("<title>" + esc("power triangle of "+o.Name) + "</title>\n")
	b.WriteString(`<polygon points="` + num(X(0)) + "," + num(Y(0)) + " " + num(X(P)) + "," + num(Y(0)) + " " + num(X(P)) + "," + num(Y(Q)) +
		`" fill="#eef3fb" stroke="none" />` + "\n")
	side := func(x0, y0, x1, y1 float64, attrs string) {
		b.WriteString(`<line x1="` + num(X(x0)) + `" y1="` + num(Y(y0)) + `" x2="` + num(X(x1)) + `" y2="` + num(Y(y1)) + `" ` + attrs + " />\n")
	}
	side(0, 0, P, 0, `stroke="#1f4e9a" stroke-width="2"`)
	side(P, 0, P, Q, `stroke="#9a3412" stroke-width="2" stroke-dasharray="6 3"`)
	side(0, 0, P, Q, `stroke="#1a1a1a" stroke-width="3"`)
	text := func(x, y float64, anchor, t string) {
		b.WriteString(`<text x="` + num(x) + `" y="` + num(y) + `" font-size="13" text-anchor="` + anchor + `" fill="#1a1a1a">` + t + "</text>\n")
	}
	below := 16.0
	if Q < 0 {
		below = -6 // the triangle hangs below P: write P above it
	}
	text((X(0)+X(P))/2, Y(0)+below, "middle", "P")
	qa := map[bool]string{true: "start", false: "end"}[P >= 0]
	qx := X(P) + map[bool]float64{true: 6, false: -6}[P >= 0]
	text(qx, (Y(0)+Y(Q))/2+4, qa, "Q")
	text((X(0)+X(P))/2-map[bool]float64{true: 8, false: -8}[P >= 0], (Y(0)+Y(Q))/2-map[bool]float64{true: 6, false: -14}[Q >= 0], map[bool]string{true: "end", false: "start"}[P >= 0], "S")
	b.WriteString(arcSVG(X(0), Y(0), P, Q))
	b.WriteString("</svg>\n")
	return b.String(), p.triangleCaption(o.Name, P, Q)
}

// arcSVG marks φ with an arc at the origin from the P side to the S side,
// when the triangle has an angle to mark.
func arcSVG(x, y, P, Q float64) string {
	if P == 0 || Q == 0 {
		return ""
	}
	const r = 26.0
	a0 := 0.0
	if P < 0 {
		a0 = math.Pi
	}
	a1 := math.Atan2(Q, P)
	// the sweep flag of SVG counts in screen terms, y down
	sweep := "0"
	if math.Sin(a1-a0) < 0 {
		sweep = "1"
	}
	mid := a0 + math.Atan2(math.Sin(a1-a0), math.Cos(a1-a0))/2
	return `<path d="M` + num(x+r*math.Cos(a0)) + " " + num(y-r*math.Sin(a0)) + "A" + num(r) + " " + num(r) + " 0 0 " + sweep + " " +
		num(x+r*math.Cos(a1)) + " " + num(y-r*math.Sin(a1)) + `" fill="none" stroke="#1a1a1a" stroke-width="1" />` + "\n" +
		`<text x="` + num(x+(r+10)*math.Cos(mid)) + `" y="` + num(y-(r+10)*math.Sin(mid)+4) + `" font-size="13" text-anchor="middle" fill="#1a1a1a">φ</text>` + "\n"
}

func (p *page) triangleCaption(name string, P, Q float64) string {
	S := math.Hypot(P, Q)
	pf := P / S
	f := p.f
	f.Digits = max(f.Digits, 3)
	way := "lagging (inductive, Q > 0)"
	switch {
	case Q < 0:
		way = "leading (capacitive, Q < 0)"
	case Q == 0:
		way = "unity"
	}
	if P < 0 {
		way += "; P < 0: active power delivered, by the passive sign convention"
	}
	return "Power triangle of " + name + ", drawn from its value: P = " + p.f.Mag(P, calc.DimPower, calc.KindActive) +
		", Q = " + p.f.Mag(Q, calc.DimPower, calc.KindReactive) + ", |S| = " + p.f.Mag(S, calc.DimPower, calc.KindMagnitude) +
		", φ = " + p.f.AngleValue(math.Atan2(Q, P)) + ", power factor cos φ = " + f.Rect(calc.Real(pf, calc.Dim{})) + " " + way + "."
}
