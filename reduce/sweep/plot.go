package sweep

import (
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"argand/calc"
)

// Plot size bounds, in character cells.
const (
	minWidth, maxWidth   = 30, 400
	minHeight, maxHeight = 3, 100
)

// glyphs are the characters a plot is drawn with.
type glyphs struct {
	vert, corner, horiz, tick, deg string
}

var (
	unicodeGlyphs = glyphs{"│", "└", "─", "┴", "°"}
	asciiGlyphs   = glyphs{"|", "+", "-", "+", " deg"}
)

// Plot draws the magnitude (20·log10 of it when dB is set) and the angle
// of a sweep against frequency, one panel above the other, in about width
// columns with height rows per panel. The frequency axis is logarithmic
// when the table's points are log spaced. Curves are drawn with '*', so
// the plot reads without colour; points with a mark and zero magnitudes
// on a dB scale are listed beneath and shown on the axis line. ascii
// restricts the output to ASCII. A table holding a frequency or value
// that is not a finite number is refused with a one-line message.
func Plot(t *Table, width, height int, dB bool, ascii bool) string {
	if t == nil || len(t.Points) == 0 {
		return "(empty sweep)\n"
	}
	for _, p := range t.Points {
		if !finite(p.Freq) || p.Freq < 0 {
			return "(the sweep holds a frequency that is not a number of 0 Hz or more)\n"
		}
		if p.Mark == "" {
			if _, err := p.Value.Check("plot"); err != nil {
				return "(the sweep holds a value that is not a finite number)\n"
			}
		}
	}
	width = clamp(width, minWidth, maxWidth)
	height = clamp(height, minHeight, maxHeight)
	g := unicodeGlyphs
	if ascii {
		g = asciiGlyphs
	}
	unit := calc.UnitSymbol(t.Dim, t.Kind, ascii)

	n := len(t.Points)
	xs := make([]float64, n)
	mags := make([]float64, n)
	angs := make([]float64, n)
	okMag := make([]bool, n)
	okAng := make([]bool, n)
	var zeros []float64 // frequencies where the magnitude is zero on a dB plot
	for k, p := range t.Points {
		xs[k] = xpos(p.Freq, t.Log)
		if p.Mark != "" {
			continue
		}
		m := p.Value.Mag()
		okAng[k] = m > 0
		angs[k] = calc.Deg(p.Value.V)
		if dB {
			if d, err := DB(m); err == nil {
				mags[k], okMag[k] = d, true
			} else {
				zeros = append(zeros, p.Freq)
			}
		} else {
			mags[k], okMag[k] = m, true
		}
	}

	magTitle := "magnitude"
	if dB {
		magTitle += ", 20" + dot(ascii) + "log10|X| in dB"
		if unit != "" {
			magTitle += " re 1 " + unit
		}
	} else if unit != "" {
		magTitle += " in " + unit
	}
	magLabel := func(y float64) string {
		if dB {
			return noNegZero(strconv.FormatFloat(y, 'f', 1, 64)) + " dB"
		}
		return trimZeros(calc.Format{Digits: 3, ASCII: ascii}.Mag(y, t.Dim, t.Kind))
	}
	angLabel := func(y float64) string {
		return noNegZero(strconv.FormatFloat(y, 'f', 0, 64)) + g.deg
	}
	magLo, magHi, magAny := span(mags, okMag)
	if !dB && magAny {
		magLo = 0 // a linear magnitude axis starts at zero
	}
	angLo, angHi, angAny := span(angs, okAng)
	magLo, magHi = nice(magLo, magHi, 0)
	angLo, angHi = nice(angLo, angHi, 15)
	angLo, angHi = math.Max(angLo, -180), math.Min(angHi, 180)

	// the margin fits the widest label of either panel
	margin := 0
	mid := func(lo, hi float64) float64 { return hi - (hi-lo)*float64((height-1)/2)/float64(height-1) }
	for _, s := range []string{magLabel(magLo), magLabel(magHi), magLabel(mid(magLo, magHi)),
		angLabel(angLo), angLabel(angHi), angLabel(mid(angLo, angHi))} {
		margin = max(margin, utf8.RuneCountInString(s))
	}
	cols := max(width-margin-2, 10)
	x0, x1 := xs[0], xs[n-1]

	var b strings.Builder
	scale := "linear"
	if t.Log {
		scale = "log"
	}
	b.WriteString(magTitle + "\n")
	if magAny {
		panel(&b, xs, mags, okMag, x0, x1, magLo, magHi, cols, height, margin, magLabel, g)
	} else {
		b.WriteString("  (no finite magnitude to draw)\n")
	}
	axis(&b, t, xs, x0, x1, cols, margin, zeros, g, ascii)
	b.WriteString("\nangle in degrees\n")
	if angAny {
		panel(&b, xs, angs, okAng, x0, x1, angLo, angHi, cols, height, margin, angLabel, g)
	} else {
		b.WriteString("  (no angle to draw)\n")
	}
	axis(&b, t, xs, x0, x1, cols, margin, nil, g, ascii)
	b.WriteString(strings.Repeat(" ", margin+2) + "frequency in Hz, " + scale + " scale\n")
	var notes []string
	for _, p := range t.Points {
		if p.Mark != "" {
			notes = append(notes, "x on the axis: "+p.Mark+" at "+freqLabel(p.Freq, ascii))
		}
	}
	for _, f := range zeros {
		notes = append(notes, "v on the axis: zero magnitude (no dB value) at "+freqLabel(f, ascii))
	}
	const maxNotes = 10
	if len(notes) > maxNotes {
		more := len(notes) - maxNotes
		notes = append(notes[:maxNotes], "... and "+strconv.Itoa(more)+" more marked points")
	}
	for _, s := range notes {
		b.WriteString(s + "\n")
	}
	return b.String()
}

// nice widens [lo, hi] outward to multiples of a round step (a half or
// whole power of ten of the span, or the given step when the span exceeds
// twice it) so the axis labels read as round numbers.
func nice(lo, hi, step float64) (float64, float64) {
	d := hi - lo
	if !(d > 0) || math.IsInf(d, 0) {
		return lo, hi
	}
	if step <= 0 || d <= 2*step {
		step = math.Pow(10, math.Floor(math.Log10(d))) / 2
	}
	return math.Floor(lo/step) * step, math.Ceil(hi/step) * step
}

// noNegZero turns "-0" or "-0.0" into "0" or "0.0".
func noNegZero(s string) string {
	if strings.HasPrefix(s, "-") && strings.Trim(s, "-0.") == "" {
		return s[1:]
	}
	return s
}

func dot(ascii bool) string {
	if ascii {
		return "*"
	}
	return "·"
}

func clamp(v, lo, hi int) int { return min(max(v, lo), hi) }

func xpos(f float64, log bool) float64 {
	if log && f > 0 {
		return math.Log10(f)
	}
	return f
}

// span returns the range of the valid values, widened when they are all
// equal so that a flat curve sits mid-panel.
func span(v []float64, ok []bool) (lo, hi float64, found bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for k, x := range v {
		if ok[k] {
			lo, hi, found = math.Min(lo, x), math.Max(hi, x), true
		}
	}
	if !found {
		return 0, 1, false
	}
	if hi-lo <= 1e-9*math.Max(math.Abs(lo), math.Abs(hi)) {
		d := math.Max(math.Abs(lo)*0.1, 1)
		lo, hi = lo-d, hi+d
	}
	return lo, hi, true
}

// col maps an x position to a column in [0, cols).
func col(x, x0, x1 float64, cols int) int {
	if x1 <= x0 {
		return cols / 2
	}
	return clamp(int(math.Round((x-x0)/(x1-x0)*float64(cols-1))), 0, cols-1)
}

// panel draws one curve. Each column is filled from the lowest to the
// highest value that falls in it, so steep parts stay joined; a column
// with no point takes the value interpolated between its neighbours.
func panel(b *strings.Builder, xs, ys []float64, ok []bool, x0, x1, lo, hi float64, cols, rows, margin int, label func(float64) string, g glyphs) {
	colLo := make([]float64, cols)
	colHi := make([]float64, cols)
	has := make([]bool, cols)
	for k := range xs {
		if !ok[k] {
			continue
		}
		c := col(xs[k], x0, x1, cols)
		if !has[c] {
			colLo[c], colHi[c], has[c] = ys[k], ys[k], true
		} else {
			colLo[c], colHi[c] = math.Min(colLo[c], ys[k]), math.Max(colHi[c], ys[k])
		}
	}
	// interpolate across gaps between drawn columns, never past the ends
	prev := -1
	for c := 0; c < cols; c++ {
		if !has[c] {
			continue
		}
		if prev >= 0 && c-prev > 1 {
			for m := prev + 1; m < c; m++ {
				f := float64(m-prev) / float64(c-prev)
				y := colHi[prev] + f*(colLo[c]-colHi[prev])
				colLo[m], colHi[m] = y, y
			}
			for m := prev + 1; m < c; m++ {
				has[m] = true
			}
		}
		prev = c
	}
	row := func(y float64) int {
		return clamp(int(math.Round((hi-y)/(hi-lo)*float64(rows-1))), 0, rows-1)
	}
	grid := make([][]byte, rows)
	for r := range grid {
		grid[r] = []byte(strings.Repeat(" ", cols))
	}
	for c := 0; c < cols; c++ {
		if !has[c] {
			continue
		}
		for r := row(colHi[c]); r <= row(colLo[c]); r++ {
			grid[r][c] = '*'
		}
	}
	for r := 0; r < rows; r++ {
		lab := ""
		switch r {
		case 0:
			lab = label(hi)
		case rows - 1:
			lab = label(lo)
		case (rows - 1) / 2:
			if rows >= 5 {
				lab = label(hi - (hi-lo)*float64(r)/float64(rows-1))
			}
		}
		b.WriteString(pad(lab, margin) + " " + g.vert + strings.TrimRight(string(grid[r]), " ") + "\n")
	}
}

func pad(s string, w int) string {
	n := utf8.RuneCountInString(s)
	if n >= w {
		return s
	}
	return strings.Repeat(" ", w-n) + s
}

// axis draws the frequency axis with ticks, marks and labels.
func axis(b *strings.Builder, t *Table, xs []float64, x0, x1 float64, cols, margin int, zeros []float64, g glyphs, ascii bool) {
	line := make([]string, cols)
	for c := range line {
		line[c] = g.horiz
	}
	ticks := tickFreqs(t.Points[0].Freq, t.Points[len(t.Points)-1].Freq, t.Log)
	labels := []rune(strings.Repeat(" ", cols+margin+2))
	nextFree := 0
	for _, f := range ticks {
		c := col(xpos(f, t.Log), x0, x1, cols)
		line[c] = g.tick
		lab := []rune(freqLabel(f, ascii))
		start := margin + 2 + c - len(lab)/2
		start = clamp(start, 0, len(labels)-len(lab))
		if start < nextFree {
			continue // would overlap the previous label
		}
		copy(labels[start:], lab)
		nextFree = start + len(lab) + 1
	}
	for k, p := range t.Points {
		if p.Mark != "" {
			line[col(xs[k], x0, x1, cols)] = "x"
		}
	}
	for _, f := range zeros {
		line[col(xpos(f, t.Log), x0, x1, cols)] = "v"
	}
	b.WriteString(strings.Repeat(" ", margin+1) + g.corner + strings.Join(line, "") + "\n")
	b.WriteString(strings.TrimRight(string(labels), " ") + "\n")
}

// tickFreqs chooses the labelled frequencies: the decades inside a log
// range (or its ends when it spans less than two), five even steps of a
// linear one.
func tickFreqs(lo, hi float64, log bool) []float64 {
	if hi <= lo {
		return []float64{lo}
	}
	if log && lo > 0 {
		var d []float64
		for e := math.Ceil(math.Log10(lo) - 1e-9); e <= math.Floor(math.Log10(hi)+1e-9) && len(d) < 30; e++ {
			d = append(d, math.Pow(10, e))
		}
		if len(d) >= 2 {
			return d
		}
		return []float64{lo, math.Sqrt(lo * hi), hi}
	}
	out := make([]float64, 5)
	for k := range out {
		out[k] = lo + (hi-lo)*float64(k)/4
	}
	return out
}
