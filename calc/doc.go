// Package calc holds argand's quantities: a complex value with a physical
// dimension and a kind, units and SI prefixes, formatting, the expression
// scanner, parser and evaluator, and the step record.
//
// # Quantity kinds
//
// The dimension of a quantity says what it is measured in; its kind says
// what it means. Power has one dimension (V·A) and several kinds (IEC
// 60050-131, IEEE Std 1459-2010; names and units after IEC 80000-6):
//
//	kind            unit  angle shown  example
//	phasor          V, A  yes          230 V (a reference at 0°), 10∠-30 A
//	impedance       Ω     yes          3+j4 Ω
//	admittance      S     yes          0.1-j0.2 S
//	resistance      Ω     no           50 Ω, re(Z)
//	conductance     S     no           10 mS, re(Y)
//	reactance       Ω     no (signed)  im(Z)
//	susceptance     S     no (signed)  im(Y)
//	complex-power   VA    yes          S = V·I*, 800 W + j600 var
//	active-power    W     no (signed)  1.2 kW, re(S), |I|²·R
//	reactive-power  var   no (signed)  300 var, im(S), |I|²·X
//	apparent-power  VA    no           5 kVA, mag(S), 230 V × 10 A
//	phasor-product  V·A   yes          V·I of two phasors: not a power
//	magnitude       any   no           mag(I)
//	signed-real     any   no           re(V), 10 mH, 50 Hz
//	ratio           -     no           0.8, 4.5%
//	ratio in %      %     no           a dip, a regulation: 3.120 % (0.0312)
//	angle           rad   as an angle  30°, arg(Z)
//	count           -     no           a whole number of things
//
// How kinds combine (each row is a case of TestKindRules):
//
//	|I|² · resistance          = active power (W)         P = I²R
//	|I|² · reactance           = reactive power (var)     Q = I²X
//	|I|² · impedance           = complex power (VA)       S = I²Z
//	|V|² / resistance          = active power (W)         P = V²/R
//	|V|² / reactance           = reactive power (var)     Q = V²/X
//	V · conj(I)                = complex power (VA)       S = V·I*
//	V · I (phasors)            = phasor product (V·A)     not a power
//	|V| · |I|, 230 V × 10 A    = apparent power (VA)      |S| = V·I
//	W + j·var                  = complex power            S = P + jQ
//	W + var (both real)        refused: at right angles
//	W + VA, var + VA (|S|)     refused: |S| is a magnitude
//	complex power + W          = complex power            S + P
//	resistance + reactance     refused: write R + jX
//	phasor product + power     refused: use power(V, I) or V * conj(I)
//	a kind × a real number     = the same kind (a magnitude × −1 is signed)
//	a kind × a complex number  = a complex kind (|S|·1∠30° is S)
//	re, im of a power          = active, reactive power
//	re, im of an impedance     = resistance, reactance
//	mag of anything            = magnitude (of a power: apparent power)
//
// Only phasors and complex quantities are shown with an angle; a
// magnitude, a signed real, a ratio or a count is shown as a signed number
// with its unit.
package calc
