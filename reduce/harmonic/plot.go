package harmonic

import (
	"math"
	"math/cmplx"
	"strconv"
	"strings"
	"unicode/utf8"

	"argand/calc"
)

// barWidth is the length, in cells, of the longest bar of a spectrum plot.
const barWidth = 24

// PlotSpectrum draws the spectrum as one bar per order, each as a
// percentage of the fundamental. Bars are scaled to the largest order
// above the fundamental, so that small harmonics stay visible; the
// fundamental's bar is cut at the edge and marked when it runs past.
// The plot reads without colour; ascii restricts it to ASCII.
func PlotSpectrum(s Spectrum, ascii bool) string {
	full, cut, axis := "█", "»", "│"
	if ascii {
		full, cut, axis = "#", ">", "|"
	}
	h1 := s.Fundamental()
	top := 0.0
	for _, c := range s.Comps[1:] {
		top = math.Max(top, c.RMS)
	}
	if top == 0 {
		top = h1
	}
	var b strings.Builder
	b.WriteString("order  % of the fundamental (bars scaled to the largest harmonic)\n")
	for _, c := range s.Comps {
		pct := c.RMS / h1 * 100
		n := int(math.Round(c.RMS / top * barWidth))
		over := n > barWidth
		if over {
			n = barWidth
		}
		b.WriteString(pad(strconv.Itoa(c.Order), 5) + " " + axis)
		b.WriteString(strings.Repeat(full, n))
		if over {
			b.WriteString(cut)
		}
		b.WriteString(" " + pctText(pct) + "\n")
	}
	return b.String()
}

func pad(s string, w int) string {
	n := utf8.RuneCountInString(s)
	if n >= w {
		return s
	}
	return strings.Repeat(" ", w-n) + s
}

// pctText writes a percentage with four significant figures.
func pctText(p float64) string {
	return calc.Format{Digits: 4}.Mag(p, calc.Dim{}, 0) + " %"
}

// PlotScan draws |Z| of the supply alone ('.') and of the supply in
// parallel with the bank ('*') against harmonic order, on a logarithmic
// impedance axis, in about width columns and height rows. Orders listed
// A lossless resonance
// (unbounded impedance) is drawn at the top edge and named beneath.
func PlotScan(pts []ScanPoint, width, height int, ascii bool) string {
	if len(pts) < 2 {
		return "(nothing to plot)\n"
	}
	width = min(max(width, 30), 200)
	height = min(max(height, 4), 40)
	vert, corner, horiz, tick := "│", "└", "─", "┴"
	if ascii {
		vert, corner, horiz, tick = "|", "+", "-", "+"
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, p := range pts {
		for _, z := range []complex128{p.Zs, p.Zp} {
			m := cmplx.Abs(z)
			if m > 0 && !(p.Inf && z == p.Zp) {
				lo, hi = math.Min(lo, m), math.Max(hi, m)
			}
		}
	}
	if !(hi > 0) || math.IsInf(lo, 0) {
		return "(nothing to plot)\n"
	}
	llo, lhi := math.Floor(math.Log10(lo)), math.Ceil(math.Log10(hi))
	if lhi <= llo {
		lhi = llo + 1
	}
	f := calc.Format{Digits: 3, ASCII: ascii}
	label := func(v float64) string { return f.Mag(v, calc.DimImpedance, 0) }
	margin := max(len([]rune(label(math.Pow(10, lhi)))), len([]rune(label(math.Pow(10, llo)))))
	cols := max(width-margin-2, 20)
	h0, h1 := pts[0].H, pts[len(pts)-1].H
	grid := make([][]rune, height)
	for r := range grid {
		grid[r] = []rune(strings.Repeat(" ", cols))
	}
	row := func(m float64) int {
		y := (math.Log10(m) - llo) / (lhi - llo)
		r := height - 1 - int(math.Round(y*float64(height-1)))
		return min(max(r, 0), height-1)
	}
	colOf := func(h float64) int {
		c := int(math.Round((h - h0) / (h1 - h0) * float64(cols-1)))
		return min(max(c, 0), cols-1)
	}
	for _, p := range pts {
		c := colOf(p.H)
		if m := cmplx.Abs(p.Zs); m > 0 && grid[row(m)][c] == ' ' {
			grid[row(m)][c] = '.'
		}
	}
	var res []string
	for _, p := range pts {
		c := colOf(p.H)
		if p.Inf {
			grid[0][c] = '*'
			res = append(res, trimNum(p.H))
			continue
		}
		if m := cmplx.Abs(p.Zp); m > 0 {
			grid[row(m)][c] = '*'
		}
	}
	var b strings.Builder
	b.WriteString("|Z| in Ω, log scale; * with the bank, . supply alone\n")
	for r := 0; r < height; r++ {
		lab := ""
		switch r {
		case 0:
			lab = label(math.Pow(10, lhi))
		case height - 1:
			lab = label(math.Pow(10, llo))
		case (height - 1) / 2:
			lab = label(math.Pow(10, lhi-(lhi-llo)*float64((height-1)/2)/float64(height-1)))
		}
		b.WriteString(pad(lab, margin) + " " + vert + string(grid[r]) + "\n")
	}
	axisLine := []rune(strings.Repeat(horiz, cols))
	under := []rune(strings.Repeat(" ", cols+1))
	step := orderTick(h1 - h0)
	ticks := []float64{h0}
	for h := math.Ceil(h0/step) * step; h <= h1+1e-9; h += step {
		if h > h0 && colOf(h)-colOf(ticks[len(ticks)-1]) > len(trimNum(ticks[len(ticks)-1])) {
			ticks = append(ticks, h)
		}
	}
	for _, h := range ticks {
		c := colOf(h)
		axisLine[c] = []rune(tick)[0]
		s := trimNum(h)
		for i, r := range s {
			if c+i < len(under) {
				under[c+i] = r
			}
		}
	}
	b.WriteString(strings.Repeat(" ", margin+1) + corner + string(axisLine) + "\n")
	b.WriteString(strings.Repeat(" ", margin+1) + " " + strings.TrimRight(string(under), " ") + "\n")
	if len(res) > 0 {
		b.WriteString("lossless resonance (unbounded |Z|) at order " + strings.Join(res, ", ") + "\n")
	}
	b.WriteString("harmonic order\n")
	if ascii {
		return calc.ASCIIText(b.String())
	}
	return b.String()
}

func orderTick(span float64) float64 {
	switch {
	case span <= 12:
		return 1
	case span <= 30:
		return 5
	case span <= 60:
		return 10
	}
	return 20
}

func trimNum(h float64) string {
	return strconv.FormatFloat(h, 'f', -1, 64)
}
