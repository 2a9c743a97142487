// Package harmonic works with periodic waveforms that are not sinusoids:
// a spectrum of harmonic orders and what follows from it (RMS, distortion,
// crest factor, transformer derating factors, the reading of an
// average-responding meter, the power quantities of IEEE Std 1459-2010 for
// a voltage and a current together), and capacitor banks on a distorted
// supply (detuning reactors, derated output, resonance with the supply).
//
// A spectrum holds the RMS value of each order, as harmonic analysers
// report it, with an optional angle: the waveform is
// x(t) = Σ √2·X_h·cos(h·ωt + φ_h). Angles of different orders are each on
// their own order's time base, so only the angles of one order in a voltage
// and a current spectrum can be compared with each other.
package harmonic

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"

	"argand/calc"
)

// MaxOrder is the highest harmonic order a spectrum may hold. Analysers
// usually report up to the 50th; twice that leaves room without letting a
// hostile file grow the work without bound.
const MaxOrder = 100

// Component is one harmonic order of a spectrum.
type Component struct {
	Order    int
	RMS      float64 // RMS value of this order, in the spectrum's unit
	Angle    float64 // radians, of cos(h·ωt + φ)
	HasAngle bool
}

// Spectrum is a periodic waveform given by its harmonic orders. Dim is
// the dimension of every magnitude: a voltage, a current, or
// dimensionless for a spectrum given only as fractions of its fundamental
// (the fundamental is then 1).
type Spectrum struct {
	Dim   calc.Dim
	Comps []Component // ascending orders, each once; order 1 present and > 0
}

// Entry is one order as written, before percentages are resolved.
type Entry struct {
	Order    int
	Value    calc.Quantity // a phasor or magnitude; a fraction when Percent
	Percent  bool          // Value is a fraction of the fundamental
	HasAngle bool
}

// EntryError names the entry of a Build that was refused.
type EntryError struct {
	Index int // into the entries given; −1 for the spectrum as a whole
	Msg   string
}

func (e *EntryError) Error() string { return e.Msg }

func entryErr(i int, format string, a ...any) error {
	return &EntryError{Index: i, Msg: fmt.Sprintf(format, a...)}
}

// Build makes a spectrum from entries in any order. The fundamental (order
// 1) must be given as a voltage or a current, or as 100 % for a spectrum of
// fractions; every other order is a quantity of the same dimension or a
// percentage of the fundamental. An order given twice, an order outside 1
// to MaxOrder, a negative, complex-without-angle or non-finite magnitude
// are refused with the index of the entry.
func Build(entries []Entry) (Spectrum, error) {
	if len(entries) == 0 {
		return Spectrum{}, entryErr(-1, "a spectrum needs at least the fundamental, as in h1 230 V")
	}
	if len(entries) > MaxOrder {
		return Spectrum{}, entryErr(MaxOrder, "a spectrum holds at most %d orders", MaxOrder)
	}
	seen := map[int]int{}
	fund := -1
	for i, e := range entries {
		if e.Order < 1 || e.Order > MaxOrder {
			return Spectrum{}, entryErr(i, "harmonic order %d is outside 1 to %d", e.Order, MaxOrder)
		}
		if j, dup := seen[e.Order]; dup {
			_ = j
			return Spectrum{}, entryErr(i, "order %d is given twice", e.Order)
		}
		seen[e.Order] = i
		if _, err := e.Value.Check("spectrum"); err != nil {
			return Spectrum{}, entryErr(i, "order %d: %v", e.Order, err)
		}
		if e.Order == 1 {
			fund = i
		}
	}
	if fund < 0 {
		return Spectrum{}, entryErr(-1, "the fundamental (h1) is missing: percentages and ratios are taken of it")
	}
	f := entries[fund]
	dim := f.Value.Dim
	switch {
	case f.Percent:
		if !approxOne(cmplxAbs(f.Value.V)) {
			return Spectrum{}, entryErr(fund, "the fundamental in percent must be 100 %% (a spectrum of fractions of the fundamental); give it in V or A otherwise")
		}
		dim = calc.Dim{}
	case dim == calc.DimVoltage || dim == calc.DimCurrent:
	case dim.IsDimensionless():
		return Spectrum{}, entryErr(fund, "the fundamental needs a unit: V, A, or 100 %% for a spectrum of fractions")
	default:
		return Spectrum{}, entryErr(fund, "a spectrum is of a voltage or a current, not %s", calc.DimName(dim, false))
	}
	h1 := cmplxAbs(f.Value.V)
	if !(h1 > 0) {
		return Spectrum{}, entryErr(fund, "the fundamental must be greater than 0: distortion is measured against it")
	}
	out := Spectrum{Dim: dim, Comps: make([]Component, 0, len(entries))}
	for i, e := range entries {
		v := e.Value.V
		switch {
		case e.Percent || dim.IsDimensionless():
			if !e.Value.Dim.IsDimensionless() || e.Value.Kind == calc.KindAngle {
				return Spectrum{}, entryErr(i, "order %d: the fundamental is 100 %%, so give every order in %%", e.Order)
			}
			if !e.Percent && i != fund {
				return Spectrum{}, entryErr(i, "order %d: write the fraction with %% (as in 20 %%)", e.Order)
			}
			if dim.IsDimensionless() {
				v /= complex(h1, 0)
			} else {
				v *= complex(h1, 0)
			}
		case e.Value.Dim != dim:
			return Spectrum{}, entryErr(i, "order %d is in %s but the fundamental is in %s; give it in %s or in %% of the fundamental",
				e.Order, calc.DimName(e.Value.Dim, false), calc.DimName(dim, false), calc.UnitSymbol(dim, 0, false))
		}
		c := Component{Order: e.Order, RMS: cmplxAbs(v), HasAngle: e.HasAngle}
		if e.HasAngle {
			c.Angle = math.Atan2(imag(v), real(v))
		} else if imag(v) != 0 || real(v) < 0 {
			return Spectrum{}, entryErr(i, "order %d: a magnitude is a positive number; write an angle with ∠", e.Order)
		}
		if math.IsInf(c.RMS, 0) || math.IsNaN(c.RMS) {
			return Spectrum{}, entryErr(i, "order %d: the magnitude overflows", e.Order)
		}
		out.Comps = append(out.Comps, c)
	}
	sort.Slice(out.Comps, func(i, j int) bool { return out.Comps[i].Order < out.Comps[j].Order })
	// the fundamental is the reference of every ratio; normalise rounding
	if dim.IsDimensionless() {
		out.Comps[0].RMS = 1
	}
	// the waveform's peak is at most √2·Σ X_h: keep it representable
	sum := 0.0
	for _, c := range out.Comps {
		sum += c.RMS
	}
	if math.IsInf(sum*math.Sqrt2, 0) {
		return Spectrum{}, entryErr(-1, "the magnitudes are too large to add up (overflow)")
	}
	return out, nil
}

func approxOne(x float64) bool { return math.Abs(x-1) <= 1e-12 }

func cmplxAbs(v complex128) float64 { return math.Hypot(real(v), imag(v)) }

// Fundamental returns the RMS value of order 1.
func (s Spectrum) Fundamental() float64 { return s.Comps[0].RMS }

// Max returns the highest order present.
func (s Spectrum) Max() int { return s.Comps[len(s.Comps)-1].Order }

// sumSq returns Σ w(h)·X_h² over the orders accepted by keep, scaled by
// the largest magnitude so that neither huge nor tiny values overflow.
func (s Spectrum) sumSq(keep func(h int) bool, w func(h int) float64) (sum, scale float64) {
	for _, c := range s.Comps {
		if keep(c.Order) {
			scale = math.Max(scale, c.RMS)
		}
	}
	if scale == 0 {
		return 0, 1
	}
	for _, c := range s.Comps {
		if keep(c.Order) {
			r := c.RMS / scale
			sum += w(c.Order) * r * r
		}
	}
	return sum, scale
}

func all(int) bool         { return true }
func harmonics(h int) bool { return h >= 2 }
func one(int) float64      { return 1 }

// RMS returns the true RMS value, √(Σ X_h²).
func (s Spectrum) RMS() float64 {
	sum, k := s.sumSq(all, one)
	return k * math.Sqrt(sum)
}

// HarmonicRMS returns the RMS value of the orders above the fundamental,
// √(Σ_{h≥2} X_h²).
func (s Spectrum) HarmonicRMS() float64 {
	sum, k := s.sumSq(harmonics, one)
	return k * math.Sqrt(sum)
}

// THD returns the total harmonic distortion relative to the fundamental,
// X_H/X_1.
func (s Spectrum) THD() float64 { return s.HarmonicRMS() / s.Fundamental() }

// FHL returns the harmonic loss factor for winding eddy-current loss of
// IEEE Std C57.110: Σ (I_h/I_1)²·h² / Σ (I_h/I_1)². The fundamental
// cancels, so it is Σ I_h²·h² / Σ I_h².
func (s Spectrum) FHL() float64 {
	num, _ := s.sumSq(all, func(h int) float64 { return float64(h * h) })
	den, _ := s.sumSq(all, one)
	return num / den
}

// FHLStray returns the harmonic loss factor for other stray loss of IEEE
// Std C57.110, with the exponent 0.8 in place of 2: Σ I_h²·h^0.8 / Σ I_h².
func (s Spectrum) FHLStray() float64 {
	num, _ := s.sumSq(all, func(h int) float64 { return math.Pow(float64(h), 0.8) })
	den, _ := s.sumSq(all, one)
	return num / den
}

// KFactor returns the K-factor of UL 1561 with each order per unit of the
// rated current ir: Σ (I_h/I_R)²·h². With ir equal to the RMS current it
// equals FHL; in general K = F_HL·(I/I_R)².
func (s Spectrum) KFactor(ir float64) float64 {
	num, k := s.sumSq(all, func(h int) float64 { return float64(h * h) })
	r := k / ir
	return num * r * r
}

// missingAngles lists the orders above the fundamental that have a
// non-zero magnitude and no angle: the waveform's shape depends on them.
// The fundamental without an angle is the reference, at 0.
func (s Spectrum) missingAngles() []int {
	var out []int
	for _, c := range s.Comps[1:] {
		if !c.HasAngle && c.RMS > 0 {
			out = append(out, c.Order)
		}
	}
	return out
}

// ErrNoAngles is returned when a result depends on the waveform's shape
// and the spectrum lacks the angles that fix it.
var ErrNoAngles = errors.New("angles missing")

func orderList(h []int) string {
	s := ""
	for i, x := range h {
		if i > 0 {
			s += ", "
		}
		if i == 8 {
			return s + "…"
		}
		s += strconv.Itoa(x)
	}
	return s
}

func needAngles(fn string, s Spectrum) error {
	if m := s.missingAngles(); len(m) > 0 {
		return fmt.Errorf("%s: %w: the peak and the rectified average depend on the angle of each order; give the angle of order %s (as in h5 20 %% ∠ -30)", fn, ErrNoAngles, orderList(m))
	}
	return nil
}
