package calc

import "math"

// Context carries the worksheet settings a function may need. Functions
// read it; only the worksheet interpreter changes it.
type Context struct {
	Freq     float64 // working frequency in Hz, > 0
	Basis    Basis   // RMS or peak phasors
	Format   Format  // display settings, for notes that quote values
	Sequence int     // phase sequence: 1 for ABC (positive), −1 for ACB
}

// BareAngle converts a plain number written as an angle into radians: it
// is in the worksheet's display unit, degrees unless set to radians.
func (c *Context) BareAngle(x float64) float64 {
	if c.Format.Radians {
		return x
	}
	return x * math.Pi / 180
}

// Omega returns the working angular frequency ω = 2π·f in rad/s. It is
// the one place the worksheet turns cycles into radians: every ω of a
// frequency comes from here.
func (c Context) Omega() float64 { return 2 * math.Pi * c.Freq }

// HzOf returns the frequency in Hz of an angular frequency in rad/s, the
// inverse of Omega.
func HzOf(w float64) float64 { return w / (2 * math.Pi) }

// Arg is one argument of a function call: a quantity, or a word from the
// function's Words list (such as "lagging" or "delta") written bare.
type Arg struct {
	Q    Quantity
	Word string // non-empty when the argument was one of Func.Words
	Text string // the argument as written, for messages
	// Absent marks an optional parameter the call skipped while naming a
	// later one, as zcable(R', X', l, thetae = 70) skips n. Only a
	// function with Func.Gaps set is given one, in the skipped place.
	Absent bool
}

// Given reports whether args holds a value for parameter i: the call
// reached it and did not skip it.
func Given(args []Arg, i int) bool { return i < len(args) && !args[i].Absent }

// Result is what a function returns: its main value, further named values
// (reachable as NAME.key when the call is assigned to NAME) and the steps
// that show the work. Steps may be empty; the interpreter always records
// the call itself.
type Result struct {
	Value Quantity
	Extra []Operand
	Steps []Step
	Notes []string // remarks added to the call's own step
	// Cautions are the safety topics of the result, added to the call's
	// own step.
	Cautions []StepCaution
}

// Func is a function callable from an expression.
type Func struct {
	Name string
	Args string // argument list for help when Params is empty, such as "(P, pf1, pf2)"
	// Params names and kinds each parameter in order (the last repeats
	// when Max allows more). The evaluator binds named arguments by them and
	// refuses an argument of the wrong kind before Call runs.
	Params []Param
	Doc    string   // one line: what it computes
	Min    int      // fewest arguments
	Max    int      // most arguments; −1 for any number
	Words  []string // bare words accepted as arguments
	// Gaps says that Call reads an Arg marked Absent as a parameter not
	// given, so a call may skip optional parameters by naming a later one;
	// the arguments then keep the places of their parameters. Without it
	// a later optional parameter needs the earlier ones (a cable's R', X'
	// and length go together).
	Gaps bool
	// Formula is shown in the call's step, such as "|z| = √(re² + im²)".
	Formula string
	Call    func(c *Context, args []Arg) (Result, error)
}

// Value wraps a single quantity as a Result.
func Value(q Quantity) Result { return Result{Value: q} }

// RMSByDefinition wraps a function whose arguments are ratings, nameplate
// values or meter readings. Those are RMS by definition whatever basis the
// worksheet's phasors are on (IEC 60038 for nominal voltages; a meter
// reads RMS, common practice), so the function works in RMS on either
// basis, and on the peak basis its step says so. what names the values,
// such as "the transformer's rating S, V1, V2".
func RMSByDefinition(what string, call func(*Context, []Arg) (Result, error)) func(*Context, []Arg) (Result, error) {
	return func(c *Context, args []Arg) (Result, error) {
		r, err := call(c, args)
		if err == nil && c != nil && c.Basis == Peak {
			r.Notes = append(r.Notes, "basis peak: "+what+" are RMS by definition on either basis, and so are the results")
		}
		return r, err
	}
}
