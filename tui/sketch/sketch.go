// Package sketch draws phasors as an Argand diagram in character cells, and
// a power triangle, for terminals that may have no colour and only ASCII.
//
// A sketch is a grid of cells: the real axis runs left to right, the
// imaginary axis bottom to top, so a positive angle turns counter-clockwise
// (leads). Each phasor is an arrow from the origin, its shaft drawn along
// the cells of Bresenham's line algorithm with a glyph chosen by the
// arrow's angle (- / | \), its tip an arrow head (> ^ < v) and its label
// written beside the tip. Character cells are about twice as tall as they
// are wide, so one row counts as two columns and angles look right.
//
// Scales. Phasors are grouped by unit. Each group is scaled to its own full
// scale: a round number at or above its largest magnitude, shown by the +
// marks on the axes. With one group the legend says "scale: + = 250 V";
// with several it says "own scale per unit, + = 250 V; 10.0 A", because
// arrows of different units drawn together are only comparable in angle.
// Colour is never needed: every arrow carries its text label.
package sketch

import (
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/mattn/go-runewidth"
)

// Item is one phasor to draw.
type Item struct {
	Label string     // shown beside the tip; "" gives a number in brackets
	V     complex128 // the value
	Unit  string     // unit symbol; items are scaled per unit
}

// Options control the look of a sketch.
type Options struct {
	// ASCII restricts the output to bytes below 0x80: labels and units are
	// transliterated (subscript digits to digits, Ω to "ohm", µ to "u") and
	// any other character becomes '?'.
	ASCII bool
	// Comma writes numbers with the decimal comma, as the worksheet does.
	Comma bool
	// Format writes a magnitude with its unit for the legend and the
	// triangle labels. Nil selects three significant figures in
	// engineering notation with an SI prefix, such as "2.50 kV".
	Format func(x float64, unit string) string
}

// MaxDim bounds width and height; larger values are treated as MaxDim.
const MaxDim = 500

// minimum plot area below which a sketch says it is too small.
const (
	minWidth  = 16
	minHeight = 5
)

// maxLabel bounds a label's width on the sketch, in cells.
const maxLabel = 12

type cellKind uint8

const (
	kEmpty cellKind = iota
	kAxis
	kMark // full-scale mark: shafts may cover it, labels may not
	kShaft
	kTip
	kLabel
)

type canvas struct {
	w, h  int
	cells []rune
	kind  []cellKind
}

func newCanvas(w, h int) *canvas {
	c := &canvas{w: w, h: h, cells: make([]rune, w*h), kind: make([]cellKind, w*h)}
	for i := range c.cells {
		c.cells[i] = ' '
	}
	return c
}

func (c *canvas) in(r, col int) bool { return r >= 0 && r < c.h && col >= 0 && col < c.w }

func (c *canvas) set(r, col int, ch rune, k cellKind) {
	if c.in(r, col) {
		c.cells[r*c.w+col] = ch
		c.kind[r*c.w+col] = k
	}
}

func (c *canvas) at(r, col int) cellKind {
	if !c.in(r, col) {
		return kEmpty
	}
	return c.kind[r*c.w+col]
}

// fits reports whether text of n cells can go at row r from column col
// without covering a tip or a label (nor a shaft unless overShaft), and
// without touching another label end to end.
func (c *canvas) fits(r, col, n int, overShaft bool) bool {
	if r < 0 || r >= c.h || col < 0 || col+n > c.w {
		return false
	}
	for i := col; i < col+n; i++ {
		switch c.kind[r*c.w+i] {
		case kEmpty, kAxis:
		case kShaft:
			if !overShaft {
				return false
			}
		default:
			return false
		}
	}
	return c.at(r, col-1) != kLabel && c.at(r, col+n) != kLabel
}

func (c *canvas) write(r, col int, text []rune) {
	for i, ch := range text {
		c.set(r, col+i, ch, kLabel)
	}
}

// place writes text at the first candidate position (row, column) where it
// fits, first avoiding shafts and then, if need be, over them. It reports
// whether the text was placed.
func (c *canvas) place(text []rune, cands [][2]int) bool {
	for _, over := range []bool{false, true} {
		for _, p := range cands {
			if c.fits(p[0], p[1], len(text), over) {
				c.write(p[0], p[1], text)
				return true
			}
		}
	}
	return false
}

func (c *canvas) lines() []string {
	out := make([]string, c.h)
	for r := 0; r < c.h; r++ {
		out[r] = strings.TrimRight(string(c.cells[r*c.w:(r+1)*c.w]), " ")
	}
	return out
}

// line calls f for each cell from (r0,c0) to (r1,c1) inclusive, by
// Bresenham's line algorithm.
func line(r0, c0, r1, c1 int, f func(r, c int)) {
	dc, dr := abs(c1-c0), -abs(r1-r0)
	sc, sr := sign(c1-c0), sign(r1-r0)
	e := dc + dr
	for {
		f(r0, c0)
		if r0 == r1 && c0 == c1 {
			return
		}
		e2 := 2 * e
		if e2 >= dr {
			e += dr
			c0 += sc
		}
		if e2 <= dc {
			e += dc
			r0 += sr
		}
	}
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

func sign(x int) int {
	switch {
	case x > 0:
		return 1
	case x < 0:
		return -1
	}
	return 0
}

// shaftGlyph picks the shaft character for a line at angle deg (screen
// geometry, counter-clockwise from the right).
func shaftGlyph(deg float64) rune {
	a := math.Mod(deg, 180)
	if a < 0 {
		a += 180
	}
	switch {
	case a < 22.5 || a >= 157.5:
		return '-'
	case a < 67.5:
		return '/'
	case a < 112.5:
		return '|'
	}
	return '\\'
}

// headGlyph picks the arrow head for an arrow pointing at angle deg in
// (−180, 180]; at an exact diagonal the vertical head wins.
func headGlyph(deg float64) rune {
	switch {
	case deg >= 45 && deg <= 135:
		return '^'
	case deg <= -45 && deg >= -135:
		return 'v'
	case math.Abs(deg) < 45:
		return '>'
	}
	return '<'
}

// asciiSubst transliterates the non-ASCII characters likely in labels and
// units. A switch rather than a map: nothing is built at start-up.
func asciiSubst(r rune) (string, bool) {
	switch r {
	case 'Ω':
		return "ohm", true
	case 'µ', 'μ':
		return "u", true
	case '°':
		return "deg", true
	case 'φ':
		return "phi", true
	case 'θ':
		return "theta", true
	case '∠':
		return "@", true
	case '·':
		return ".", true
	case '−':
		return "-", true
	case '×':
		return "x", true
	case '⁰':
		return "0", true
	case '¹':
		return "1", true
	case '²':
		return "2", true
	case '³':
		return "3", true
	}
	switch {
	case r >= '₀' && r <= '₉':
		return string('0' + (r - '₀')), true
	case r >= '⁴' && r <= '⁹':
		return string('0' + (r - '⁰')), true
	}
	return "", false
}

// clean makes s safe for the grid: every rune one cell wide, no control
// characters, ASCII only when ascii is set.
func clean(s string, ascii bool) []rune {
	var out []rune
	for _, r := range s {
		switch {
		case r < 0x20 || r == 0x7f:
			out = append(out, '?')
		case r < 0x80:
			out = append(out, r)
		case ascii:
			if t, ok := asciiSubst(r); ok {
				out = append(out, []rune(t)...)
			} else {
				out = append(out, '?')
			}
		case r == 0xfffd || runewidth.RuneWidth(r) != 1:
			out = append(out, '?')
		default:
			out = append(out, r)
		}
	}
	return out
}

func (o Options) text(s string) string { return string(clean(s, o.ASCII)) }

func (o Options) format(x float64, unit string) string {
	if o.Format != nil {
		return o.text(o.Format(x, unit))
	}
	return o.text(o.mark(Eng(x, unit, 3, o.ASCII)))
}

// mark writes the decimal marker in force into a number written with a
// point.
func (o Options) mark(s string) string {
	if o.Comma {
		return strings.Replace(s, ".", ",", 1)
	}
	return s
}

// prefix is the SI prefix of the power of ten exp3 (a multiple of 3),
// f to T; a function rather than a map, so nothing is built at start-up.
func prefix(exp3 int) (string, bool) {
	names := [...]string{"f", "p", "n", "µ", "m", "", "k", "M", "G", "T"}
	i := exp3/3 + 5
	if exp3%3 != 0 || i < 0 || i >= len(names) {
		return "", false
	}
	return names[i], true
}

// Eng writes x to the given significant figures (1 to 15) in engineering
// notation, with an SI prefix on unit when one fits (f to T) and a power
// of ten (2.50×10^3) otherwise: Eng(2500, "V", 3, false) is "2.50 kV". NaN and
// infinities are written as "not finite".
func Eng(x float64, unit string, digits int, ascii bool) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return "not finite"
	}
	digits = min(max(digits, 1), 15)
	sp := ""
	if unit != "" {
		sp = " "
	}
	if x == 0 {
		return "0" + sp + unit
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(math.Abs(x), 'e', digits-1, 64), 64)
	e := int(math.Floor(math.Log10(r)))
	exp3 := int(math.Floor(float64(e)/3)) * 3
	dec := max(digits-1-(e-exp3), 0)
	s := strconv.FormatFloat(x/math.Pow(10, float64(exp3)), 'f', dec, 64)
	p, ok := prefix(exp3)
	if ok && unit != "" {
		if ascii && p == "µ" {
			p = "u"
		}
		return s + " " + p + unit
	}
	if exp3 != 0 {
		// no prefix fits (or there is no unit to carry one): a power of
		// ten, never e-notation, which the design keeps from people
		x := "×"
		if ascii {
			x = "*"
		}
		s += x + "10^" + strconv.Itoa(exp3)
	}
	return s + sp + unit
}

// niceCeil returns the smallest number of the form m·10^k, m in
// {1, 1.5, 2, 2.5, 3, 4, 5, 6, 8}, at or above x > 0.
func niceCeil(x float64) float64 {
	k := math.Floor(math.Log10(x))
	base := math.Pow(10, k)
	for _, m := range []float64{1, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10} {
		if v := m * base; v >= x*(1-1e-12) && !math.IsInf(v, 0) {
			return v
		}
	}
	return x // near the top of the float64 range: no rounder number above
}

// tooSmall returns height lines, the first saying the sketch needs more
// room.
func tooSmall(width, height int) []string {
	out := make([]string, height)
	msg := "sketch: too small"
	if len(msg) > width {
		msg = "too small"[:min(9, width)]
	}
	out[0] = msg
	return out
}

// wrap joins segments with "; " into lines of at most width cells,
// breaking a segment longer than a line between words (and a word longer
// than a line anywhere).
func wrap(segs []string, width int) []string {
	var out []string
	cur := ""
	for _, s := range segs {
		if len([]rune(s)) > width {
			if cur != "" {
				out = append(out, cur)
				cur = ""
			}
			for _, w := range strings.Fields(s) {
				r := []rune(w)
				for len(r) > width {
					if cur != "" {
						out = append(out, cur)
						cur = ""
					}
					out = append(out, string(r[:width]))
					r = r[width:]
				}
				w = string(r)
				switch {
				case cur == "":
					cur = w
				case len([]rune(cur))+1+len(r) <= width:
					cur += " " + w
				default:
					out = append(out, cur)
					cur = w
				}
			}
			continue
		}
		switch {
		case cur == "":
			cur = s
		case len([]rune(cur))+2+len([]rune(s)) <= width:
			cur += "; " + s
		default:
			out = append(out, cur)
			cur = s
		}
	}
	if cur != "" {
		out = append(out, cur)
	}
	return out
}

func clampDims(width, height int) (int, int) {
	return min(width, MaxDim), min(height, MaxDim)
}

// finite reports whether v and its magnitude are finite numbers.
func finite(v complex128) bool {
	m := math.Hypot(real(v), imag(v))
	return !math.IsNaN(m) && !math.IsInf(m, 0)
}

// group is the items of one unit and their full scale.
type group struct {
	unit string
	full float64 // 0 when every item of the unit is zero
}

// arrow is one item's geometry on the canvas.
type arrow struct {
	label []rune
	r, c  int     // tip cell
	deg   float64 // angle in degrees
	zero  bool
}

// Render draws items as arrows from the origin on a width × height grid of
// character cells, with a legend of the scales at the bottom, and returns
// the lines (trailing spaces trimmed). It always returns min(height,
// MaxDim) lines, none wider than width cells; when the area is too small
// for a legible sketch the first line says so. Items whose value is not
// finite are listed in the legend instead of drawn. A non-zero phasor
// shorter than one cell is drawn one cell long so that it stays visible; a
// zero phasor is an "o" at the origin with its label.
func Render(items []Item, width, height int, opt Options) []string {
	if height <= 0 {
		return nil
	}
	width, height = clampDims(width, height)
	if width <= 0 {
		return make([]string, height)
	}
	sc := scaleItems(items, opt)
	segs := sc.legend(len(items), opt)
	base := len(segs)
	legend := wrap(segs, width)
	// The legend grows when labels find no room, and the plot shrinks with
	// it; a few rounds settle it.
	for round := 0; ; round++ {
		plotH := height - len(legend)
		if width < minWidth || plotH < minHeight {
			return tooSmall(width, height)
		}
		cv, unplaced, ok := plot(items, sc, width, plotH, opt)
		if !ok {
			return tooSmall(width, height)
		}
		segs = segs[:base]
		if len(unplaced) > 0 {
			segs = append(segs, "no room to label: "+strings.Join(unplaced, ", "))
		}
		if len(sc.bad) > 0 {
			segs = append(segs, "not drawn (not finite or too large): "+strings.Join(sc.bad, ", "))
		}
		next := wrap(segs, width)
		if len(next) <= len(legend) || round >= 3 {
			if len(next) > height-minHeight {
				next = next[:height-minHeight]
			}
			out := cv.lines()
			for len(out)+len(next) < height {
				out = append(out, "")
			}
			return append(out[:height-len(next)], next...)
		}
		legend = next
	}
}

// scaled is the items' labels and their groups by unit, each with its
// full scale.
type scaled struct {
	labels [][]rune
	groups []group
	index  map[string]int // group of each unit
	bad    []string       // labels of items not finite, not drawn
}

// scaleItems labels the items and groups them by unit, in order of first
// appearance, each group scaled to a round number at or above its
// largest magnitude.
func scaleItems(items []Item, opt Options) scaled {
	sc := scaled{labels: make([][]rune, len(items)), index: map[string]int{}}
	for i, it := range items {
		l := clean(it.Label, opt.ASCII)
		if len(l) == 0 {
			l = []rune("(" + strconv.Itoa(i+1) + ")")
		}
		if len(l) > maxLabel {
			l = l[:maxLabel]
		}
		sc.labels[i] = l
		if !finite(it.V) {
			sc.bad = append(sc.bad, string(l))
			continue
		}
		g, ok := sc.index[it.Unit]
		if !ok {
			g = len(sc.groups)
			sc.index[it.Unit] = g
			sc.groups = append(sc.groups, group{unit: it.Unit})
		}
		if m := math.Hypot(real(it.V), imag(it.V)); m > sc.groups[g].full {
			sc.groups[g].full = m
		}
	}
	for i := range sc.groups {
		if sc.groups[i].full > 0 {
			sc.groups[i].full = niceCeil(sc.groups[i].full)
		}
	}
	return sc
}

// legend is the first part of the legend: the scale, or one per unit.
func (sc scaled) legend(n int, opt Options) []string {
	var scales []string
	for _, g := range sc.groups {
		if g.full > 0 {
			scales = append(scales, opt.format(g.full, g.unit))
		}
	}
	switch {
	case n == 0:
		return []string{"nothing to draw"}
	case len(scales) == 1:
		return []string{"scale: + = " + scales[0]}
	case len(scales) > 1:
		return append([]string{"own scale per unit, + = " + scales[0]}, scales[1:]...)
	}
	return nil
}

// plot draws the axes and arrows on a width × h canvas and reports the
// labels it found no room for; ok is false when the area is too small.
func plot(items []Item, sc scaled, width, h int, opt Options) (cv *canvas, unplaced []string, ok bool) {
	maxW := 0
	for _, l := range sc.labels {
		maxW = max(maxW, len(l))
	}
	cv = newCanvas(width, h)
	cx, cy := (width-1)/2, (h-1)/2
	rx := min(cx, width-1-cx) - min(maxW+1, width/5)
	ry := min(cy, h-1-cy)
	R := float64(min(rx, 2*ry)) // radius in columns; a row counts as two
	if R < 2 {
		return nil, nil, false
	}
	cv.axes(cx, cy, R, opt)
	arrows := arrowsOf(items, sc, cx, cy, R)
	cv.arrows(arrows, cx, cy)
	// Longer labels are harder to fit: place them first.
	order := make([]int, len(arrows))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(i, j int) bool { return len(arrows[order[i]].label) > len(arrows[order[j]].label) })
	for _, i := range order {
		a := arrows[i]
		if !cv.place(a.label, labelSpots(a, cx, cy, h)) {
			unplaced = append(unplaced, string(a.label))
		}
	}
	return cv, unplaced, true
}

// axes draws the axes through (cx, cy), with + at full scale R and the
// real axis's name.
func (cv *canvas) axes(cx, cy int, R float64, opt Options) {
	hAxis, vAxis := '.', ':'
	if !opt.ASCII && runewidth.RuneWidth('·') == 1 {
		hAxis, vAxis = '·', '·'
	}
	for col := 0; col < cv.w; col++ {
		cv.set(cy, col, hAxis, kAxis)
	}
	for r := 0; r < cv.h; r++ {
		cv.set(r, cx, vAxis, kAxis)
	}
	cv.set(cy, cx, '+', kAxis)
	ir := int(math.Round(R))
	jr := int(math.Round(R / 2))
	for _, p := range [][2]int{{cy, cx + ir}, {cy, cx - ir}, {cy - jr, cx}, {cy + jr, cx}} {
		cv.set(p[0], p[1], '+', kMark)
	}
	cv.write(cy, cv.w-2, []rune("Re"))
}

// arrowsOf works out each finite item's arrow from the origin (cx, cy) at
// its group's scale, R columns to full scale.
func arrowsOf(items []Item, sc scaled, cx, cy int, R float64) []arrow {
	arrows := make([]arrow, 0, len(items))
	for i, it := range items {
		if !finite(it.V) {
			continue
		}
		a := arrow{label: sc.labels[i], r: cy, c: cx}
		g := sc.groups[sc.index[it.Unit]]
		if it.V == 0 || g.full == 0 {
			a.zero = true
			arrows = append(arrows, a)
			continue
		}
		x := real(it.V) / g.full * R
		y := imag(it.V) / g.full * R / 2
		a.c = cx + int(math.Round(x))
		a.r = cy - int(math.Round(y))
		a.deg = math.Atan2(imag(it.V), real(it.V)) * 180 / math.Pi
		if a.r == cy && a.c == cx {
			// Shorter than a cell: one cell in its direction.
			rad := a.deg * math.Pi / 180
			a.c += int(math.Round(math.Cos(rad)))
			a.r -= int(math.Round(math.Sin(rad)))
		}
		arrows = append(arrows, a)
	}
	return arrows
}

// arrows draws the shafts first, then the tips over them, then the
// imaginary axis's name where no tip is.
func (cv *canvas) arrows(arrows []arrow, cx, cy int) {
	for _, a := range arrows {
		if a.zero {
			continue
		}
		g := shaftGlyph(a.deg)
		line(cy, cx, a.r, a.c, func(r, c int) {
			if (r != cy || c != cx) && (r != a.r || c != a.c) {
				cv.set(r, c, g, kShaft)
			}
		})
	}
	for _, a := range arrows {
		if a.zero {
			cv.set(cy, cx, '*', kTip)
		} else {
			cv.set(a.r, a.c, headGlyph(a.deg), kTip)
		}
	}
	// The imaginary axis's name goes at its top, beside it on either side;
	// an arrow tip there is worth more.
	// It must not touch a tip, or it would read as that arrow's label.
	for _, p := range [][2]int{{0, cx + 1}, {0, cx - 2}, {1, cx + 1}, {1, cx - 2}, {0, cx + 2}, {0, cx - 3}} {
		if cv.fits(p[0], p[1], 2, false) && cv.at(p[0], p[1]-1) != kTip && cv.at(p[0], p[1]+2) != kTip {
			cv.write(p[0], p[1], []rune("Im"))
			break
		}
	}
}

// labelSpots lists where a label may go, best first: beside the tip on the
// outward side, then the inward side, then rows above and below.
func labelSpots(a arrow, cx, cy, h int) [][2]int {
	n := len(a.label)
	out, in := a.c+1, a.c-n
	if a.c < cx {
		out, in = in, out
	}
	vs := -1 // first look above a tip in the upper half
	if a.r > cy {
		vs = 1
	}
	var spots [][2]int
	for _, dr := range []int{0, vs, -vs, 2 * vs, -2 * vs, 3 * vs, -3 * vs} {
		r := a.r + dr
		if r < 0 || r >= h {
			continue
		}
		spots = append(spots, [2]int{r, out}, [2]int{r, in})
		if dr != 0 {
			spots = append(spots, [2]int{r, a.c - n/2})
		}
	}
	return spots
}
