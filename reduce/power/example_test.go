package power_test

import (
	"fmt"

	"argand/calc"
	"argand/reduce/power"
)

// Example data: a workshop load of 100 kW at 0.75 lagging on a 400 V,
// 50 Hz three-phase supply, corrected to 0.95 lagging. By hand (common
// practice): Q_c = 100 kW·(tan acos 0.75 − tan acos 0.95) = 100 kW·(0.8819 −
// 0.3287) = 55.32 kvar; C_Y = Q_c/(ω·V_L²) = 1.101 mF; C_Δ = C_Y/3;
// I = S/(√3·V_L) = 133.3 kVA/692.8 V = 192.5 A before, 105.3 kVA/692.8 V
// = 151.9 A after.
func ExampleCorrect() {
	load, _, err := power.FromPF(calc.Real(100e3, calc.DimPower), 0.75, power.Lagging)
	if err != nil {
		fmt.Println(err)
		return
	}
	k, _, err := power.Correct(power.Target{
		Load: load.S, PF: 0.95, V: calc.Real(400, calc.DimVoltage), Freq: 50, Phases: power.ThreePhase,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	f := calc.Format{}
	fmt.Println("Qc =", f.Rect(k.Qc))
	fmt.Println("C_Y =", f.Rect(k.CY), "per phase; C_Δ =", f.Rect(k.CDelta), "per phase")
	fmt.Println("I:", f.Rect(k.I1), "→", f.Rect(k.I2))
	fmt.Println("PF:", k.Before.PF, "→", k.After.PF)
	// Output:
	// Qc = 55.32 kvar
	// C_Y = 1.101 mF per phase; C_Δ = 366.9 µF per phase
	// I: 192.5 A → 151.9 A
	// PF: 0.75 lagging → 0.95 lagging
}

// Example data: the power of an element from its phasors; by hand S =
// V·I* = 230·(8 + j6) = 1840 + j1380 VA, PF 0.8 lagging (IEEE Std
// 1459-2010 definitions).
func ExampleFromPhasors() {
	p, _, err := power.FromPhasors(calc.Real(230, calc.DimVoltage), calc.Q(8-6i, calc.DimCurrent), calc.RMS)
	if err != nil {
		fmt.Println(err)
		return
	}
	f := calc.Format{}
	fmt.Println("S =", f.Rect(p.S))
	fmt.Println("P =", f.Rect(p.P), " Q =", f.Rect(p.Q), " |S| =", f.Rect(p.Apparent))
	fmt.Println("PF", p.PF)
	// Output:
	// S = 1.840 + j1.380 kVA
	// P = 1.840 kW  Q = 1.380 kvar  |S| = 2.300 kVA
	// PF 0.8 lagging
}
