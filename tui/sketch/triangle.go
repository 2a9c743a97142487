package sketch

import (
	"math"
	"strconv"
)

// Triangle draws the power triangle of active power p (W) and reactive
// power q (var) in a width × height grid: P along the horizontal from the
// origin (to the right when p ≥ 0), Q vertical at its end (up for q > 0,
// inductive and lagging under S = V·I*, IEEE Std 1459-2010), and the
// apparent power S as the hypotenuse. The legs carry their values, and a
// legend line gives S, the angle φ = atan2(Q, P) and the power factor
// |P|/|S|. P and Q share one scale, a row counting as two columns. It
// returns min(height, MaxDim) lines, as Render does.
func Triangle(p, q float64, width, height int, opt Options) []string {
	if height <= 0 {
		return nil
	}
	width, height = clampDims(width, height)
	if width <= 0 {
		return make([]string, height)
	}
	if math.IsNaN(p) || math.IsNaN(q) || math.IsInf(p, 0) || math.IsInf(q, 0) {
		return notDrawn("power triangle: P or Q not finite, not drawn", width, height)
	}
	s := math.Hypot(p, q)
	if math.IsInf(s, 0) {
		return notDrawn("power triangle: S too large, not drawn", width, height)
	}
	phiName := "φ"
	if opt.ASCII {
		phiName = "phi"
	}
	lb := triLabels{
		p:   []rune("P = " + opt.format(p, "W")),
		q:   []rune("Q = " + opt.format(q, "var")),
		s:   []rune("S = " + opt.format(s, "VA")),
		phi: []rune(phiName),
	}
	legend := wrap(triangleLegend(p, q, s, string(lb.s), opt), width)
	h := height - len(legend)
	if width < minWidth || h < minHeight {
		return tooSmall(width, height)
	}
	cv := newCanvas(width, h)
	if s > 0 {
		g, ok := triangleGeometry(p, q, s, width, h, len(lb.q))
		if !ok {
			return tooSmall(width, height)
		}
		g.draw(cv)
		g.label(cv, lb, width)
	}
	return append(cv.lines(), legend...)
}

// notDrawn returns height lines, the first saying why nothing is drawn.
func notDrawn(msg string, width, height int) []string {
	out := make([]string, height)
	r := []rune(msg)
	out[0] = string(r[:min(len(r), width)])
	return out
}

// triangleLegend is the legend under the triangle: S, the angle
// φ = atan2(Q, P) and the power factor |P|/|S| with its sense.
func triangleLegend(p, q, s float64, sl string, opt Options) []string {
	if s == 0 {
		return []string{"no power: P = Q = 0"}
	}
	phiName, deg := "φ", "°"
	if opt.ASCII {
		phiName, deg = "phi", " deg"
	}
	phi := math.Atan2(q, p) * 180 / math.Pi
	segs := []string{sl, phiName + " = " + opt.mark(strconv.FormatFloat(roundSig(phi, 4), 'f', -1, 64)) + deg}
	pf := "pf " + opt.mark(strconv.FormatFloat(roundSig(math.Abs(p)/s, 3), 'f', -1, 64))
	switch {
	case q > 0:
		segs = append(segs, pf+" lagging (Q > 0, inductive)")
	case q < 0:
		segs = append(segs, pf+" leading (Q < 0, capacitive)")
	default:
		segs = append(segs, "pf 1")
	}
	return segs
}

// triLabels are the texts written on the triangle.
type triLabels struct{ p, q, s, phi []rune }

// triGeom places the triangle on the canvas: the origin (x0, y0), the
// screen directions of +P and +Q (sx, sy), the legs' lengths in cells
// (dx, dy), and the far corners xa (end of P) and yb (end of Q).
type triGeom struct {
	x0, y0, sx, sy, dx, dy, xa, yb int
}

// triangleGeometry scales the triangle to a width × h canvas, leaving a
// row for P's label and room for Q's label (qLen cells) beside the
// vertical leg; ok is false when the canvas is too narrow.
func triangleGeometry(p, q, s float64, width, h, qLen int) (g triGeom, ok bool) {
	colsAvail := float64(width - 2 - (qLen + 1))
	rowsAvail := float64(h - 2)
	if colsAvail < 4 {
		return g, false
	}
	// Sides relative to S lie in [0, 1] and one of them is at least
	// 1/√2, so the scale stays finite even for extreme P and Q.
	a, b := math.Abs(p)/s, math.Abs(q)/s
	scale := math.Inf(1) // columns per unit of a or b
	if a > 0 {
		scale = colsAvail / a
	}
	if b > 0 {
		scale = min(scale, 2*rowsAvail/b)
	}
	g.dx = clampInt(int(math.Round(a*scale)), 0, int(colsAvail))
	g.dy = clampInt(int(math.Round(b*scale/2)), 0, int(rowsAvail))
	g.sx, g.sy, g.x0, g.y0 = 1, -1, 1, h-2
	if p < 0 {
		g.sx, g.x0 = -1, width-2
	}
	if q < 0 {
		g.sy, g.y0 = 1, 1
	}
	if q == 0 {
		g.y0 = h / 2
	}
	g.xa, g.yb = g.x0+g.sx*g.dx, g.y0+g.sy*g.dy
	return g, true
}

// draw draws the legs, the hypotenuse and the corners.
func (g triGeom) draw(cv *canvas) {
	for c := min(g.x0, g.xa); c <= max(g.x0, g.xa); c++ {
		cv.set(g.y0, c, '-', kShaft)
	}
	for r := min(g.y0, g.yb); r <= max(g.y0, g.yb); r++ {
		cv.set(r, g.xa, '|', kShaft)
	}
	hg := shaftGlyph(math.Atan2(float64(-g.sy*g.dy)*2, float64(g.sx*g.dx)) * 180 / math.Pi)
	line(g.y0, g.x0, g.yb, g.xa, func(r, c int) { cv.set(r, c, hg, kShaft) })
	cv.set(g.y0, g.x0, '*', kTip)
	cv.set(g.y0, g.xa, '+', kTip)
	cv.set(g.yb, g.xa, '+', kTip)
}

// label writes P below (or above) the horizontal leg, centred; Q beside
// the vertical leg on the outside; S at the hypotenuse's middle on the
// side away from the right angle; φ inside the angle at the origin.
func (g triGeom) label(cv *canvas, lb triLabels, width int) {
	pr := g.y0 - g.sy
	pc := (g.x0+g.xa)/2 - len(lb.p)/2
	cv.place(lb.p, [][2]int{{pr, pc}, {pr, clampInt(pc, 0, width-len(lb.p))}, {g.y0 - 2*g.sy, pc}})
	qr := (g.y0 + g.yb) / 2
	qc := g.xa + 2
	if g.sx < 0 {
		qc = g.xa - 1 - len(lb.q)
	}
	cv.place(lb.q, [][2]int{{qr, qc}, {qr - 1, qc}, {qr + 1, qc}, {g.y0 + g.sy, clampInt(qc, 0, width-len(lb.q))}})
	mr, mc := (g.y0+g.yb)/2, (g.x0+g.xa)/2
	sc := mc - len(lb.s) - 1
	if g.sx < 0 {
		sc = mc + 2
	}
	var spots [][2]int
	for _, dr := range []int{0, g.sy, 2 * g.sy, -g.sy} {
		for _, dc := range []int{0, -2 * g.sx, -4 * g.sx, 2 * g.sx} {
			spots = append(spots, [2]int{mr + dr, sc + dc})
		}
	}
	spots = append(spots, [2]int{0, 0})
	cv.place(lb.s, spots)
	fc := g.x0 + g.sx*3
	if g.sx < 0 {
		fc -= len(lb.phi) - 1
	}
	if g.dx > 0 && g.dy > 0 {
		cv.place(lb.phi, [][2]int{{g.y0 + g.sy, fc}, {g.y0 + g.sy, fc + g.sx*2}, {g.y0 + 2*g.sy, fc + g.sx*3}})
	}
}

func clampInt(x, lo, hi int) int { return max(lo, min(x, hi)) }

// roundSig rounds x to n significant figures.
func roundSig(x float64, n int) float64 {
	if x == 0 {
		return 0
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'e', n-1, 64), 64)
	return r + 0
}
