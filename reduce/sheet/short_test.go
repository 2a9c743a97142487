package sheet

import (
	"testing"
)

// IEC TR 60909-4:2000, §3, element impedances on the 0.4 kV side, seen as
// transcribed in an open-source test suite, not in the standard's own text
// (published-examples.md): Z_QT = 0.053 + j0.531 mΩ, K_T(T1) = 0.974894,
// Z_L1 = 0.385 + j0.395 mΩ, Z_L3 = 5.420 + j1.740 mΩ. Typed as a user
// would, with named arguments; tolerance half a unit of the last printed
// decimal.
func TestPublishedShortCircuitNamed(t *testing.T) {
	const ws = `zq = zfeeder(UnQ = 20 kV, Ik = 10 kA, UrHV = 20 kV, UrLV = 410 V, rx = 0.1, c = 1.1)
t1 = zxfmr(SrT = 630 kVA, UrHV = 20 kV, UrLV = 410 V, ukr = 4, loss = 6.5 kW)
l1 = zcable(Rlen = 0.077 Ω/km, Xlen = 0.079 Ω/km, length = 10 m, n = 2)
l3 = zcable(0.271 Ω/km, 0.087 Ω/km, 20 m)
`
	runPublished(t, ws, []printed{
		{"zq", "re", 0.053e-3, 0.0005e-3, "Z_QT 0.053 + j0.531 mΩ"},
		{"zq", "im", 0.531e-3, 0.0005e-3, "Z_QT 0.053 + j0.531 mΩ"},
		{"t1.kt", "re", 0.974894, 0.0000005, "K_T 0.974894"},
		{"l1", "re", 0.385e-3, 0.0005e-3, "Z_L1 0.385 + j0.395 mΩ"},
		{"l1", "im", 0.395e-3, 0.0005e-3, "Z_L1 0.385 + j0.395 mΩ"},
		{"l3", "re", 5.420e-3, 0.0005e-3, "Z_L3 5.420 + j1.740 mΩ"},
		{"l3", "im", 1.740e-3, 0.0005e-3, "Z_L3 5.420 + j1.740 mΩ"},
	})
}
