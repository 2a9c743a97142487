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
		out := make([]string, height)
		out[0] = string([]rune("power triangle: P or Q not finite, not drawn")[:min(44, width)])
		return out
	}
	s := math.Hypot(p, q)
	if math.IsInf(s, 0) {
		out := make([]string, height)
		out[0] = string([]rune("power triangle: S too large, not drawn")[:min(38, width)])
		return out
	}
	phi := 0.0
	if s > 0 {
		phi = math.Atan2(q, p) * 180 / math.Pi
	}
	phiName, deg := "φ", "°"
	if opt.ASCII {
		phiName, deg = "phi", " deg"
	}
	pl := []rune("P = " + opt.format(p, "W"))
	ql := []rune("Q = " + opt.format(q, "var"))
	sl := []rune("S = " + opt.format(s, "VA"))
	var segs []string
	segs = append(segs, string(sl), phiName+" = "+opt.mark(strconv.FormatFloat(roundSig(phi, 4), 'f', -1, 64))+deg)
	switch {
	case s == 0:
		segs = []string{"no power: P = Q = 0"}
	case q > 0:
		segs = append(segs, "pf "+opt.mark(strconv.FormatFloat(roundSig(math.Abs(p)/s, 3), 'f', -1, 64))+" lagging (Q > 0, inductive)")
	case q < 0:
		segs = append(segs, "pf "+opt.mark(strconv.FormatFloat(roundSig(math.Abs(p)/s, 3), 'f', -1, 64))+" leading (Q < 0, capacitive)")
	default:
		segs = append(segs, "pf 1")
	}
	legend := wrap(segs, width)
	h := height - len(legend)
	if width < minWidth || h < minHeight {
		return tooSmall(width, height)
	}
	cv := newCanvas(width, h)
	if s > 0 {
		// Room: one row for P's label beside the horizontal leg, the Q
		// label beside the vertical leg.
		colsAvail := float64(width - 2 - (len(ql) + 1))
		rowsAvail := float64(h - 2)
		if colsAvail < 4 {
			return tooSmall(width, height)
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
		dx := clampInt(int(math.Round(a*scale)), 0, int(colsAvail))
		dy := clampInt(int(math.Round(b*scale/2)), 0, int(rowsAvail))
		sx, sy := 1, -1 // screen directions of +P and +Q
		x0 := 1
		if p < 0 {
			sx = -1
			x0 = width - 2
		}
		y0 := h - 2
		if q < 0 {
			sy = 1
			y0 = 1
		}
		if q == 0 {
			y0 = h / 2
		}
		xa, yb := x0+sx*dx, y0+sy*dy
		// Legs, hypotenuse, corners.
		for c := min(x0, xa); c <= max(x0, xa); c++ {
			cv.set(y0, c, '-', kShaft)
		}
		for r := min(y0, yb); r <= max(y0, yb); r++ {
			cv.set(r, xa, '|', kShaft)
		}
		hg := shaftGlyph(math.Atan2(float64(-sy*dy)*2, float64(sx*dx)) * 180 / math.Pi)
		line(y0, x0, yb, xa, func(r, c int) { cv.set(r, c, hg, kShaft) })
		cv.set(y0, x0, '*', kTip)
		cv.set(y0, xa, '+', kTip)
		cv.set(yb, xa, '+', kTip)

		// P below (or above) the horizontal leg, centred; Q beside the
		// vertical leg on the outside; S at the hypotenuse's middle on the
		// side away from the right angle.
		pr := y0 - sy
		pc := (x0+xa)/2 - len(pl)/2
		cv.place(pl, [][2]int{{pr, pc}, {pr, clampInt(pc, 0, width-len(pl))}, {y0 - 2*sy, pc}})
		qr := (y0 + yb) / 2
		qc := xa + 2
		if sx < 0 {
			qc = xa - 1 - len(ql)
		}
		cv.place(ql, [][2]int{{qr, qc}, {qr - 1, qc}, {qr + 1, qc}, {y0 + sy, clampInt(qc, 0, width-len(ql))}})
		mr, mc := (y0+yb)/2, (x0+xa)/2
		sc := mc - len(sl) - 1
		if sx < 0 {
			sc = mc + 2
		}
		var spots [][2]int
		for _, dr := range []int{0, sy, 2 * sy, -sy} {
			for _, dc := range []int{0, -2 * sx, -4 * sx, 2 * sx} {
				spots = append(spots, [2]int{mr + dr, sc + dc})
			}
		}
		spots = append(spots, [2]int{0, 0})
		cv.place(sl, spots)
		// φ inside the angle at the origin.
		pn := []rune(phiName)
		fc := x0 + sx*3
		if sx < 0 {
			fc -= len(pn) - 1
		}
		if dx > 0 && dy > 0 {
			cv.place(pn, [][2]int{{y0 + sy, fc}, {y0 + sy, fc + sx*2}, {y0 + 2*sy, fc + sx*3}})
		}
	}
	out := cv.lines()
	return append(out, legend...)
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
