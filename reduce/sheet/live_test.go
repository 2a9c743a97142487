package sheet

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"argand/calc"
)

// A value taken from a function's or a statement's named result follows
// it when the frequency changes (X_L = ωL, common practice, moves with f).
func TestExtrasFollowFrequency(t *testing.T) {
	src := `network nw reference g
voltage source V1 = 10 V from g to a
resistor Ra = 10 Ω from a to b
inductor Lb = 10 mH from b to g
end
thevenin T = nw between b and g
z1 = T.zth
th = thevenin(10 V, 10 Ω, zl(10 mH))
thz = th.z
frequency 60 Hz
check z1 is T.zth within 1e-12 Ω
check thz is th.z within 1e-12 Ω
`
	s := New()
	sum, err := s.Run(strings.NewReader(src), nil)
	if err != nil || sum.Err != nil {
		t.Fatal(err, sum.Err)
	}
	if sum.Fail != 0 || sum.Pass != 2 {
		t.Errorf("checks: %d passed, %d failed; want 2, 0", sum.Pass, sum.Fail)
	}
}

// A sweep point at a parallel resonance is marked as an open circuit
// (X_L = −X_C at ω0 = 1/√(LC), common practice), and a definition the
// swept value does not read cannot stop the sweep.
func TestSweepThroughResonance(t *testing.T) {
	src := `inductor L = 1 H
capacitor Cx = 1 F
Zp = L || Cx
Zs = L + Cx
sweep Zp from 0.5 rad/s to 1.5 rad/s points 3 linear
sweep Zs from 0.5 rad/s to 1.5 rad/s points 3 linear
`
	s := New()
	sum, err := s.Run(strings.NewReader(src), nil)
	if err != nil || sum.Err != nil {
		t.Fatal(err, sum.Err)
	}
	sw := s.Sweeps()
	if len(sw) != 2 {
		t.Fatalf("%d sweeps, want 2", len(sw))
	}
	if m := sw[0].Table.Points[1].Mark; m == "" {
		t.Error("parallel resonance not marked")
	}
	if v := sw[1].Table.Points[1].Value.V; v != 0 {
		t.Errorf("series resonance: Z = %v, want exactly 0 (the reactances cancel)", v)
	}
}

// TestElementFollowsNames: an element whose value is written with names
// (resistor R1 = Rnom, voltage source V2 = Vf) follows them as any
// definition does, in a network and out of one; given a number later it
// stops following; a name changed to a value of the wrong kind is
// refused naming the element. The divider (common practice): V_Rb =
// V·Rb/(Ra + Rb).
func TestElementFollowsNames(t *testing.T) {
	s := New()
	runLines(t, s,
		"Rnom = 100 Ω",
		"Vf = 10 V",
		"Lnom = 10 mH",
		"inductor L1 = 2 * Lnom",
		"network d reference g",
		"voltage source V2 = Vf from g to a",
		"resistor Ra = Rnom from a to b",
		"resistor Rb = 300 Ω from b to g",
		"end",
		"Rnom = 200 Ω",
		"Vf = 5 V",
		"Lnom = 1 mH",
		"frequency 1 kHz")
	want := func(name string, v complex128) {
		t.Helper()
		got, ok := s.Lookup(name)
		if !ok || cmplx.Abs(got.V-v) > 1e-12*cmplx.Abs(v) {
			t.Errorf("%s = %v (%v), want %v", name, got.V, ok, v)
		}
	}
	want("d.Rb.v", 5*300.0/500)
	want("L1", complex(0, 2*math.Pi*1000*2e-3))
	runLines(t, s, "Ra = 300 Ω", "Rnom = 1 Ω")
	want("d.Rb.v", 5*300.0/600)
	if _, _, err := s.Exec("Vf = 3 A"); err == nil || !strings.Contains(err.Error(), "while re-evaluating V2 (line 6): V2 is a voltage source: its value is in V, got A") {
		t.Errorf("a source fed a current: %v", err)
	}
	// an element reading a result of its own network, or of a network
	// fed by it, would close a loop: refused as any circular definition
	runLines(t, s,
		"network fed reference g",
		"voltage source V3 = d.Rb.v from g to x",
		"resistor Rx = 1 kΩ from x to g",
		"end")
	for stmt, loop := range map[string]string{
		"Ra = 1 Ω + d.Rb.v / 1 mA":   "circular definition: Ra → d.Rb.v → Ra",
		"Ra = 1 Ω + fed.Rx.v / 1 mA": "circular definition: Ra → fed.Rx.v → V3 → d.Rb.v → Ra",
	} {
		if _, _, err := s.Exec(stmt); err == nil || !strings.Contains(err.Error(), loop) {
			t.Errorf("%s: %v, want %q", stmt, err, loop)
		}
	}
	want("d.Rb.v", 5*300.0/600)
}

// TestChainedNetworkSolvedOnce: when the frequency changes, a network fed
// by another's result (V2 = Vf = net1.C1.v) is solved once, after Vf has
// followed, not first with Vf's old value: the trail holds no results
// that never held. The value is the divider of net1 at the new frequency
// (common practice): V_C = V·Z_C/(R + Z_C).
func TestChainedNetworkSolvedOnce(t *testing.T) {
	s := New()
	runLines(t, s,
		"network net1 reference g",
		"voltage source V1 = 230 V from g to a",
		"resistor Ra = 220 Ω from a to b",
		"capacitor C1 = 10 µF from b to g",
		"end",
		"Vf = net1.C1.v",
		"network net2 reference g",
		"voltage source V2 = Vf from g to p",
		"resistor Rb = 47 Ω from p to q",
		"inductor Lb = 100 mH from q to g",
		"end")
	steps, _, err := s.Exec("frequency 60 Hz")
	if err != nil {
		t.Fatal(err)
	}
	// each solution's first step notes why it was made; net2's names Lb
	solves := 0
	for _, st := range steps {
		for _, n := range st.Notes {
			if strings.HasPrefix(n, "re-solved because") && strings.Contains(n, "Lb") {
				solves++
			}
		}
	}
	if solves != 1 {
		t.Errorf("net2 solved %d times after the frequency changed, want once", solves)
	}
	zc := 1 / complex(0, 2*math.Pi*60*10e-6)
	v2, _ := s.Lookup("V2")
	if want := 230 * zc / (220 + zc); cmplx.Abs(v2.V-want) > 1e-9*cmplx.Abs(want) {
		t.Errorf("V2 = %v, want %v", v2.V, want)
	}
}

// TestElementFollowsFrequency: an element whose value reads only the
// frequency (resistor Rf = f·1 Ω/Hz) follows it as one reading other
// names does. A resistor's value is its written value; an inductor's
// impedance is jωL (common practice), with L the written value at the
// frequency in force.
func TestElementFollowsFrequency(t *testing.T) {
	tests := []struct {
		stmt, name string
		want       complex128 // at 60 Hz
	}{
		{"resistor Rf = f * 1 Ω/Hz", "Rf", 60},
		{"resistor Rf = 1 Ω + f * 1 Ω/Hz", "Rf", 61},
		{"inductor Lf = f * 1 µH/Hz", "Lf", complex(0, 2*math.Pi*60*60e-6)},
	}
	for _, tt := range tests {
		s := New()
		runLines(t, s, "frequency 50 Hz", tt.stmt, "frequency 60 Hz")
		got, ok := s.Lookup(tt.name)
		if !ok || cmplx.Abs(got.V-tt.want) > 1e-12*cmplx.Abs(tt.want) {
			t.Errorf("%s, then frequency 60 Hz: %s = %v, want %v", tt.stmt, tt.name, got.V, tt.want)
		}
	}
}

// TestLiveCheckLargeWorksheet: the live check while typing (Validate)
// does not carry a change through the networks of a worksheet of more
// than liveElements network elements, nor solve a Thevenin equivalent of
// one, so that no key waits for them: an error only that work would find
// is reported when the statement runs. On a small worksheet the live
// check finds it. A node missing from a large network is named with a
// few of its nodes, not all of them.
func TestLiveCheckLargeWorksheet(t *testing.T) {
	small := New()
	runLines(t, small, "a = 1 Ω", "b = a + 1 Ω")
	if err := small.Validate("a = 1 V"); err == nil {
		t.Error("small worksheet: the live check missed the error of b")
	}
	big := New()
	runLines(t, big, gridBlock(60)...)
	runLines(t, big, "end", "a = 1 Ω", "b = a + 1 Ω")
	if err := big.Validate("a = 1 V"); err != nil {
		t.Errorf("large worksheet: the live check carried the change through: %v", err)
	}
	if _, _, err := big.Exec("a = 1 V"); err == nil {
		t.Error("large worksheet: the statement ran despite the error of b")
	}
	if err := big.Validate("thevenin T = g between g30_30 and gnd"); err != nil {
		t.Errorf("thevenin: %v", err)
	}
	err := big.Validate("thevenin T = g between g30_30 and gx")
	if err == nil || !strings.Contains(err.Msg, "and 3589 more") || len(err.Msg) > 300 {
		t.Errorf("a missing node: %v", err)
	}
}

// TestRefusedChangeUndone: a new value refused because something that
// reads it cannot take it leaves the worksheet as it was, the name and
// everything computed from it, so that later lines of a run read the
// values the saved worksheet replays to.
func TestRefusedChangeUndone(t *testing.T) {
	s := New()
	runLines(t, s, "Rnom = 2 Ω", "Rx = Rnom * 3", "resistor R1 = Rnom")
	if _, _, err := s.Exec("Rnom = 1 A"); err == nil {
		t.Fatal("a resistor fed an ampere was accepted")
	}
	for name, want := range map[string]complex128{"Rnom": 2, "Rx": 6, "R1": 2} {
		if v, ok := s.Lookup(name); !ok || v.V != want || v.Dim != calc.DimImpedance {
			t.Errorf("%s = %v %v after the refusal, want %v Ω", name, v.V, v.Dim, want)
		}
	}
	runLines(t, s, "y = Rx + R1")
	if v, _ := s.Lookup("y"); v.V != 8 {
		t.Errorf("y = %v, want 8 Ω", v.V)
	}
}
