package site

import (
	"fmt"
	"math"
	"math/cmplx"

	"argand/calc"
)

// radialFunc exposes SolveRadial to worksheets: a chain of sections on one
// system base, each given as a per-unit impedance on that base (use rebase
// for a transformer or machine rated otherwise), as an impedance in Ω at
// the base voltage, or, for the source, as its fault level in VA (taken as
// a pure reactance, the usual assumption when X/R is not known).
func radialFunc() calc.Func {
	return calc.Func{Name: "radial", Params: []calc.Param{{Name: "Sbase", Kind: calc.ParamApparentPower, Else: "a rating is an apparent power in VA"}, {Name: "Vbase", Kind: calc.ParamVoltage, Doc: "line-to-line"}, {Name: "case", Kind: calc.ParamWord, Doc: "fault|load"}, {Name: "Z", Kind: calc.ParamAny, Doc: "pu, Ω at Vbase, or a fault level in VA"}}, Args: "(Sbase, Vbase, fault|load, Z1, Z2, ...)", Min: 4, Max: 3 + maxSections,
		Words:   []string{"fault", "load"},
		Doc:     "a radial chain solved in per unit on the base Sbase, Vbase (line-to-line): each Z in pu on that base, in Ω at Vbase, or a source fault level in VA; value is the current in pu; .i (A) .ztot .v1 .v2 ... (pu after each section)",
		Formula: "Z_pu = Z/Z_base, Z_base = V_base²/S_base; source Z_pu = j·S_base/S_sc; I = E/ΣZ_pu (E = 1 pu)",
		Call: func(c *calc.Context, args []calc.Arg) (calc.Result, error) {
			pre, err := lineVoltage(c, &args[1], "Vbase")
			if err != nil {
				return calc.Result{}, err
			}
			s, v := args[0].Q, args[1].Q
			if s.Dim != calc.DimPower || !s.IsReal() || real(s.V) <= 0 {
				return calc.Result{}, fmt.Errorf("argument 1 (Sbase) must be a positive power in VA, got %s", args[0].Text)
			}
			if v.Dim != calc.DimVoltage || !v.IsReal() || real(v.V) <= 0 {
				return calc.Result{}, fmt.Errorf("argument 2 (Vbase) must be a positive voltage, got %s", args[1].Text)
			}
			if args[2].Word == "" {
				return calc.Result{}, fmt.Errorf("argument 3 must be fault or load")
			}
			sys := Radial{SBase: real(s.V), VBase: real(v.V), Fault: args[2].Word == "fault"}
			for i, a := range args[3:] {
				sec := Section{Name: fmt.Sprintf("Z%d (%s)", i+1, a.Text), Kind: SeriesSection}
				switch q := a.Q; q.Dim {
				case calc.Dimensionless:
					sec.Z, sec.PU, sec.SRated, sec.VRated = q.V, true, sys.SBase, sys.VBase
				case calc.DimImpedance:
					sec.Z = q.V
				case calc.DimPower:
					if !q.IsReal() || real(q.V) <= 0 {
						return calc.Result{}, fmt.Errorf("argument %d: a source fault level is a positive power in VA", i+4)
					}
					sec.Kind, sec.Z, sec.PU, sec.SRated, sec.VRated = SourceSection, complex(0, sys.SBase/real(q.V)), true, sys.SBase, sys.VBase
				default:
					return calc.Result{}, fmt.Errorf("argument %d (%s) must be a per-unit value, an impedance in Ω or a fault level in VA, not %s", i+4, a.Text, calc.DimName(q.Dim, false))
				}
				sys.Sections = append(sys.Sections, sec)
			}
			r, err := SolveRadial(sys)
			if err != nil {
				return calc.Result{}, err
			}
			ib := sys.SBase / (math.Sqrt(3) * sys.VBase)
			out := calc.Result{Value: r.Ipu, Steps: append(pre, r.Steps...)}
			out.Extra = append(out.Extra, calc.Operand{Name: "i", Value: calc.Q(r.Ipu.V*complex(ib, 0), calc.DimCurrent)},
				calc.Operand{Name: "ztot", Value: r.Ztot})
			acc := complex(0, 0)
			for k, z := range r.Zpu {
				acc += z.V
				v := 1 - r.Ipu.V*acc
				if cmplx.Abs(v) < 1e-12 {
					v = 0 // rounding noise at a bolted fault
				}
				out.Extra = append(out.Extra, calc.Operand{Name: fmt.Sprintf("v%d", k+1), Value: calc.Number(v)})
			}
			return out, nil
		}}
}
