package sheet

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"reflect"
	"strings"
	"testing"
)

// fingerprint is everything a statement could change in a worksheet, as
// text: the accepted statements, every name and value, the trail, the
// sweeps, the settings and the checks.
func fingerprint(s *Sheet) string {
	var b strings.Builder
	fmt.Fprintf(&b, "line %d settings %+v\n", s.Line(), s.Settings())
	for _, st := range s.Statements() {
		fmt.Fprintln(&b, "stmt", st)
	}
	for _, n := range s.Names() {
		q, _ := s.Lookup(n)
		fmt.Fprintf(&b, "%s = %v %v %v\n", n, q.V, q.Dim, q.Kind)
	}
	for _, st := range s.Steps() {
		fmt.Fprintf(&b, "step %d %s %s %d\n", st.Line, st.Kind, st.Source, len(st.Results))
	}
	fmt.Fprintln(&b, "sweeps", len(s.Sweeps()))
	pass, fail := s.Checks()
	fmt.Fprintln(&b, "checks", pass, fail)
	return b.String()
}

// cancelAfter returns a job whose context ends at the k-th progress
// report, and the count of reports.
func cancelAfter(k int) (Job, *int) {
	ctx, cancel := context.WithCancel(context.Background())
	n := new(int)
	return Job{Ctx: ctx, Progress: func(done, total int) {
		*n++
		if *n >= k {
			cancel()
		}
	}}, n
}

// TestStopAtAnyPoint stops long statements at many points of their work,
// from before the first sample to the last, and finds the worksheet
// exactly as it was before the statement each time.
func TestStopAtAnyPoint(t *testing.T) {
	s := New()
	runLines(t, s, tolNetwork...)
	runLines(t, s, "Zs = Ra + La", "check sp.Cb.v reads 5.5 V within 1% + 2 digits of 0.01 V")
	stmts := []struct {
		src     string
		samples int
	}{
		{"sweep sp.Cb.v from 10 Hz to 10 kHz points 300", 300},
		{"spread vc = sp.Cb.v", 17000},
		{"check sp.Cb.v reads 5.5 V within 1% + 2 digits of 0.01 V", 17000},
	}
	for _, tc := range stmts {
		before := fingerprint(s)
		points := []int{0, 1, 2, 3, 10, tc.samples / 3, tc.samples / 2, tc.samples - 1}
		for _, k := range points {
			job, _ := cancelAfter(k)
			if k == 0 {
				ctx, cancel := context.WithCancel(context.Background())
				cancel()
				job = Job{Ctx: ctx}
			}
			_, _, err := s.ExecJob(job, tc.src)
			var stop *Interrupted
			if !errors.As(err, &stop) {
				t.Fatalf("%s stopped at sample %d: error %v, want an interruption", tc.src, k, err)
			}
			if stop.Line != s.Line()+1 {
				t.Errorf("%s stopped at sample %d: interrupted at line %d, want %d", tc.src, k, stop.Line, s.Line()+1)
			}
			if after := fingerprint(s); after != before {
				t.Fatalf("%s stopped at sample %d changed the worksheet:\nbefore\n%s\nafter\n%s", tc.src, k, before, after)
			}
		}
		// and the same statement, not stopped, runs to its end
		job, n := cancelAfter(math.MaxInt)
		if _, _, err := s.ExecJob(job, tc.src); err != nil {
			t.Fatalf("%s: %v", tc.src, err)
		}
		if *n < 2 {
			t.Errorf("%s reported progress %d times", tc.src, *n)
		}
	}
}

// rcNetwork is an R–C divider fed by 10 V (invented example data).
var rcNetwork = []string{
	"network rc reference gnd",
	"voltage source V1 = 10 V from gnd to a",
	"resistor R1 = 1 kΩ from a to b",
	"capacitor C1 = 100 nF from b to gnd",
	"end",
}

// TestSweepReusesNetwork sweeps a node network whose built network is
// reused from point to point, and checks every point against the
// voltage divider worked by hand: V_C = V·Z_C/(R + Z_C) with
// Z_C = 1/(jωC) (common practice).
func TestSweepReusesNetwork(t *testing.T) {
	s := New()
	runLines(t, s, rcNetwork...)
	runLines(t, s, "sweep rc.C1.v from 100 Hz to 10 kHz points 57 linear")
	sw := s.Sweeps()
	if len(sw) != 1 || len(sw[0].Table.Points) != 57 {
		t.Fatalf("sweeps %v", sw)
	}
	for _, pt := range sw[0].Table.Points {
		w := 2 * math.Pi * pt.Freq
		zc := 1 / complex(0, w*100e-9)
		want := 10 * zc / (1000 + zc)
		if got := pt.Value.V; cmplx.Abs(got-want) > 1e-9*cmplx.Abs(want) {
			t.Errorf("at %g Hz: %v, want %v", pt.Freq, got, want)
		}
	}
	// the sweep leaves the network at the working frequency
	v, _ := s.Lookup("rc.C1.v")
	zc := 1 / complex(0, 2*math.Pi*50*100e-9)
	if want := 10 * zc / (1000 + zc); cmplx.Abs(v.V-want) > 1e-9*cmplx.Abs(want) {
		t.Errorf("after the sweep rc.C1.v = %v, want %v", v.V, want)
	}
}

// TestSweepThroughDefinitions: a sweep of a definition that reads a
// network result, and of one that reads a second network fed by the
// first (a voltage source set to a result), follows the results at every
// point: a sample marks changed each result something reads. The
// divider (common practice): V_C = V·Z_C/(R + Z_C), and the second
// network halves what it is fed.
func TestSweepThroughDefinitions(t *testing.T) {
	s := New()
	runLines(t, s, rcNetwork...)
	runLines(t, s,
		"X = 2 * rc.C1.v",
		"Vf = rc.C1.v",
		"network half reference gnd",
		"voltage source V2 = Vf from gnd to p",
		"resistor Ra = 1 kΩ from p to q",
		"resistor Rb = 1 kΩ from q to gnd",
		"end",
		"sweep X from 100 Hz to 10 kHz points 21",
		"sweep half.Rb.v from 100 Hz to 10 kHz points 21")
	sw := s.Sweeps()
	if len(sw) != 2 {
		t.Fatalf("%d sweeps", len(sw))
	}
	for i, scale := range []complex128{2, 0.5} {
		for _, pt := range sw[i].Table.Points {
			zc := 1 / complex(0, 2*math.Pi*pt.Freq*100e-9)
			want := scale * 10 * zc / (1000 + zc)
			if got := pt.Value.V; cmplx.Abs(got-want) > 1e-9*cmplx.Abs(want) {
				t.Errorf("sweep %d at %g Hz: %v, want %v", i, pt.Freq, got, want)
			}
		}
	}
}

// TestBudget refuses a statement whose estimated work exceeds the budget,
// saying the estimate, the budget and both ways out, and runs it once the
// budget is raised.
func TestBudget(t *testing.T) {
	s := New()
	runLines(t, s, sweepNetwork()...)
	runLines(t, s, "budget 0.1 s")
	if got := s.Settings().Budget; got != 0.1 {
		t.Fatalf("budget %g s, want 0.1 s", got)
	}
	before := fingerprint(s)
	_, _, err := s.Exec("sweep lad.n10.v from 10 Hz to 100 kHz points 100000")
	if err == nil {
		t.Fatal("a sweep of 100 000 points over a network ran within a budget of 0.1 s")
	}
	for _, want := range []string{"needs about", "budget of 100.0 ms", "use fewer points", "about", "budget "} {
		if !strings.Contains(err.Error(), want) {
			t.Errorf("refusal %q does not say %q", err, want)
		}
	}
	if s.Validate("sweep lad.n10.v from 10 Hz to 100 kHz points 100000") == nil {
		t.Error("the refusal is not shown while the statement is typed")
	}
	s.SetLine(s.Line() - 1) // the refused line does not count
	if after := fingerprint(s); after != before {
		t.Errorf("a refused statement changed the worksheet")
	}
	runLines(t, s, "sweep lad.n10.v from 10 Hz to 100 kHz points 50")
	for _, bad := range []string{"budget", "budget 5", "budget 0 s", "budget 1e9 s", "budget 5 V"} {
		if _, _, err := s.Exec(bad); err == nil {
			t.Errorf("%q accepted", bad)
		}
	}
}

// TestPropagateOnce re-evaluates a chain of definitions once each when
// its root changes: what depends on the change, and nothing else.
func TestPropagateOnce(t *testing.T) {
	s := New()
	lines := []string{"Z0 = 10 Ω"}
	for k := 1; k <= 50; k++ {
		lines = append(lines, fmt.Sprintf("Z%d = Z%d || 100 Ω", k, k-1))
	}
	runLines(t, s, lines...)
	steps, _, err := s.Exec("Z0 = 20 Ω")
	if err != nil {
		t.Fatal(err)
	}
	var rec []string
	for _, st := range steps {
		if st.Kind == "recompute" {
			for _, r := range st.Results {
				rec = append(rec, r.Name)
			}
		}
	}
	want := make([]string, 50)
	for k := range want {
		want[k] = fmt.Sprintf("Z%d", k+1)
	}
	if !reflect.DeepEqual(rec, want) {
		t.Errorf("re-evaluated %v, want %v", rec, want)
	}
	// parallel of 20 Ω and 50 × 100 Ω in parallel: 1/(1/20 + 50/100) (common practice)
	z, _ := s.Lookup("Z50")
	if want := 1 / (1.0/20 + 50.0/100); math.Abs(real(z.V)-want) > 1e-9*want {
		t.Errorf("Z50 = %v, want %g", z.V, want)
	}
}

// pollStop is a context that cancels itself at its stopAt-th poll of Err,
// so that a test stops work part way through without depending on how
// fast the machine is; polls counts the calls.
type pollStop struct {
	context.Context
	cancel        context.CancelFunc
	polls, stopAt int
}

func (c *pollStop) Err() error {
	c.polls++
	if c.polls == c.stopAt {
		c.cancel()
	}
	return c.Context.Err()
}

// gridBlock is the node block of a side×side grid of resistors fed at one
// corner and loaded at the other (invented example data), without its
// end line: side²+1 unknowns.
func gridBlock(side int) []string {
	lines := []string{"network g reference gnd", "voltage source V1 = 230 V from gnd to g0_0"}
	k := 0
	for r := range side {
		for c := range side {
			if c+1 < side {
				lines = append(lines, fmt.Sprintf("resistor H%d = %d Ω from g%d_%d to g%d_%d", k, 10+k%7, r, c, r, c+1))
			}
			if r+1 < side {
				lines = append(lines, fmt.Sprintf("resistor W%d = %d Ω from g%d_%d to g%d_%d", k, 12+k%5, r, c, r+1, c))
			}
			k++
		}
	}
	return append(lines, fmt.Sprintf("resistor RL = 100 Ω from g%d_%d to gnd", side-1, side-1))
}

// TestStopNetworkSolve stops the factorisation of a 60×60 grid (3601
// unknowns) at the end of its block: the statement is interrupted at the
// poll that cancelled it, the worksheet is exactly as before, the block
// still open, and the same end then solves the network.
func TestStopNetworkSolve(t *testing.T) {
	s := New()
	runLines(t, s, gridBlock(60)...)
	before := fingerprint(s)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	// 3601 columns are polled 57 times; the worksheet polls a few
	// times besides.
	stop := &pollStop{Context: ctx, cancel: cancel, stopAt: 20}
	_, _, err := s.ExecJob(Job{Ctx: stop}, "end")
	var in *Interrupted
	if !errors.As(err, &in) {
		t.Fatalf("got %v, want an interruption", err)
	}
	// the factorisation stops at the poll that cancelled it; ExecJob
	// then asks once more, to tell a stop from a failure
	if stop.polls != stop.stopAt+1 {
		t.Errorf("%d polls of the context; want %d, the one that cancelled it and ExecJob's", stop.polls, stop.stopAt+1)
	}
	if got := fingerprint(s); got != before {
		t.Errorf("the worksheet changed:\n%s\nwant\n%s", got, before)
	}
	runLines(t, s, "end")
	if _, ok := s.Lookup("g.RL.v"); !ok {
		t.Error("the network was not solved after the stop")
	}
}

// solvedGrid is a worksheet with the 60×60 grid solved, its fingerprint,
// and a context that stops at its 20th poll.
func solvedGrid(t *testing.T) (*Sheet, string, *pollStop) {
	t.Helper()
	s := New()
	runLines(t, s, gridBlock(60)...)
	runLines(t, s, "end")
	ctx, cancel := context.WithCancel(context.Background())
	t.Cleanup(cancel)
	return s, fingerprint(s), &pollStop{Context: ctx, cancel: cancel, stopAt: 20}
}

// TestStopResolve: a changed value re-solves the 60×60 grid that reads
// it. On a working copy (Job.Copy) the factorisation of that re-solve
// stops with the job, and the worksheet the copy came from is untouched;
// on the worksheet itself the re-solve runs to its end, polling nothing,
// so that no stop leaves the worksheet half changed.
func TestStopResolve(t *testing.T) {
	s, before, stop := solvedGrid(t)
	c := s.Clone()
	_, _, err := c.ExecJob(Job{Ctx: stop, Copy: true}, "RL = 120 Ω")
	var in *Interrupted
	if !errors.As(err, &in) {
		t.Fatalf("on a working copy: got %v, want an interruption", err)
	}
	if stop.polls != stop.stopAt+1 {
		t.Errorf("%d polls of the context; want %d, the one that cancelled it and ExecJob's", stop.polls, stop.stopAt+1)
	}
	if got := fingerprint(s); got != before {
		t.Error("the worksheet changed under its working copy")
	}

	ctx2, cancel2 := context.WithCancel(context.Background())
	defer cancel2()
	never := &pollStop{Context: ctx2, cancel: cancel2, stopAt: 2}
	if _, _, err := s.ExecJob(Job{Ctx: never}, "RL = 120 Ω"); err != nil {
		t.Fatal(err)
	}
	if never.polls != 1 {
		t.Errorf("the re-solve on the worksheet itself polled the context: %d polls, want only ExecJob's first", never.polls)
	}
	if q, ok := s.Lookup("g.RL.v"); !ok || q.V == 0 {
		t.Error("the network was not re-solved")
	}
}

// TestStopThevenin stops a Thevenin equivalent of the 60×60 grid part way
// through one of its factorisations: the statement is interrupted, the
// worksheet is exactly as before, and the same statement then defines
// the equivalent.
func TestStopThevenin(t *testing.T) {
	s, before, stop := solvedGrid(t)
	const stmt = "thevenin T = g between g30_30 and gnd"
	_, _, err := s.ExecJob(Job{Ctx: stop}, stmt)
	var in *Interrupted
	if !errors.As(err, &in) {
		t.Fatalf("got %v, want an interruption", err)
	}
	if got := fingerprint(s); got != before {
		t.Errorf("the worksheet changed:\n%s\nwant\n%s", got, before)
	}
	runLines(t, s, stmt)
	if _, ok := s.Lookup("T"); !ok {
		t.Error("the equivalent was not defined after the stop")
	}
}

// TestResolveTheveninRunsToEnd: a changed value that a Thevenin
// equivalent of the 60×60 grid reads is carried through on the worksheet
// itself to its end, whatever the job's context says, as a re-solve is:
// a stop part way would leave the worksheet half changed. On a working
// copy the same change stops.
func TestResolveTheveninRunsToEnd(t *testing.T) {
	s, _, stop := solvedGrid(t)
	runLines(t, s, "thevenin T = g between g30_30 and gnd")
	before, _ := s.Lookup("T")
	c := s.Clone()
	if _, _, err := s.ExecJob(Job{Ctx: stop}, "RL = 120 Ω"); err != nil {
		t.Fatalf("on the worksheet: %v", err)
	}
	if stop.polls > 2 {
		t.Errorf("the worksheet's re-evaluation polled the context %d times", stop.polls)
	}
	if after, _ := s.Lookup("T"); after.V == before.V {
		t.Error("T did not follow RL")
	}
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	stop2 := &pollStop{Context: ctx, cancel: cancel, stopAt: 20}
	var in *Interrupted
	if _, _, err := c.ExecJob(Job{Ctx: stop2, Copy: true}, "RL = 120 Ω"); !errors.As(err, &in) {
		t.Errorf("on a working copy: got %v, want an interruption", err)
	}
}
