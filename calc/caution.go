package calc

// SafetyText is argand's safety text (shared design card), the one copy:
// help, the README, the app's help screen and every caution of the mains
// topic read it from here.
const SafetyText = "argand is a calculation aid, not a substitute for measurement, isolation procedures or a qualified person. " +
	"Work on energised or mains equipment only if qualified, under local electrical codes and licensed practice. " +
	"Capacitors can hold a lethal charge after disconnection: discharge and verify before touching. " +
	"Verify every result by measurement before relying on it."

// Caution is a safety topic a result carries where the work can hurt
// someone. A step names its topics; how much of the text is shown is the
// reader's choice: the whole text once per session for each topic, then
// one line.
type Caution uint8

const (
	CautionMains       Caution = iota + 1 // energised or mains equipment: the safety text
	CautionCapacitor                      // capacitor banks: stored charge, resonance
	CautionCable                          // cable sizing and voltage drop
	CautionFault                          // fault levels and protective devices
	CautionCT                             // current transformer secondaries
	CautionLoop                           // earth-fault loops: limits are the user's
	CautionMotor                          // motor starting: dip, starter, protection
	CautionTransformer                    // transformer loading, paralleling, taps
)

// cautionTexts holds each topic's name, one line and whole text.
var cautionTexts = [...]struct{ name, line, text string }{
	CautionMains: {"mains", "mains work only if qualified, under local codes",
		SafetyText},
	CautionCapacitor: {"capacitors", "capacitors can hold a lethal charge: discharge, verify",
		"Capacitor banks: a capacitor can hold a lethal charge after disconnection; discharge it and verify with a meter before touching. " +
			"Adding capacitance can create a harmonic resonance with the supply; check the resonance order before installing. " +
			"Install only by qualified people under local electrical codes and licensed practice."},
	CautionCable: {"cables", "cable size and drop limits follow local wiring rules",
		"Cable sizing and the permitted voltage drop are set by local wiring rules; argand computes, it does not approve."},
	CautionFault: {"faults", "protection and arc-flash work follow local codes",
		"Protective device selection and arc-flash work follow local codes and licensed practice; " +
			"a prospective fault current here is a calculation aid, not a study."},
	CautionCT: {"current transformers", "never open-circuit a live CT secondary",
		"Never open-circuit a CT secondary while the primary carries current: the secondary voltage can rise to a dangerous level. " +
			"Short the secondary before disconnecting a meter or relay."},
	CautionLoop: {"earth-fault loops", "no national limit built in: the limit and approval are yours",
		"argand names no national limit: the maximum Z_s or the disconnection current is yours to give, " +
			"from the protective device and the local wiring rules; the comparison here does not approve an installation."},
	CautionMotor: {"motor starting", "permitted dip and starter follow the supply's rules",
		"Motor starting: the permitted voltage dip, the starter and its protection are set by the supply's " +
			"rules and local electrical codes; a starting study is confirmed by a qualified person under licensed practice. " +
			"Locked-rotor data come from the motor's maker, not from this calculation."},
	CautionTransformer: {"transformers", "check vector groups, ratios and phasing before closing",
		"Transformer loading, paralleling and tap changes are switching work on mains plant: check the vector groups, " +
			"ratios and phasing by measurement before closing, and follow the maker's data, local electrical codes and licensed practice."},
}

// Cautions lists every topic, in the order help shows them.
func Cautions() []Caution {
	return []Caution{CautionMains, CautionCapacitor, CautionCable, CautionFault, CautionCT, CautionLoop, CautionMotor, CautionTransformer}
}

func (c Caution) valid() bool { return c > 0 && int(c) < len(cautionTexts) }

// String names the topic.
func (c Caution) String() string {
	if !c.valid() {
		return "caution"
	}
	return cautionTexts[c].name
}

// Line returns the topic's caution in one short line.
func (c Caution) Line() string {
	if !c.valid() {
		return SafetyText
	}
	return cautionTexts[c].line
}

// Text returns the topic's whole caution.
func (c Caution) Text() string {
	if !c.valid() {
		return SafetyText
	}
	return cautionTexts[c].text
}

// StepCaution is a caution as a step carries it: the topic, and whether
// the step shows its whole text (the first of its topic in a session) or
// the one line.
type StepCaution struct {
	Topic Caution
	Full  bool
}

// Shown returns the text the step shows for the caution.
func (c StepCaution) Shown() string {
	if c.Full {
		return c.Topic.Text()
	}
	return c.Topic.Line()
}

// CautionsOf returns the cautions of the given topics, as a step or a
// function's result carries them; the worksheet decides which are shown
// whole.
func CautionsOf(topics ...Caution) []StepCaution {
	out := make([]StepCaution, len(topics))
	for i, t := range topics {
		out[i] = StepCaution{Topic: t}
	}
	return out
}
