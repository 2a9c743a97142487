package cli

import (
	"bytes"
	"encoding/csv"
	"math"
	"math/cmplx"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce/sheet"
)

// csvTables runs a worksheet with --csv and returns its tables, each read
// back by encoding/csv (a generic RFC 4180 reader) after splitting the
// output on its empty lines, and the exit code and error stream.
func csvTables(t *testing.T, ws string, o Options) ([][][]string, int, string) {
	t.Helper()
	o.CSV = true
	var out, errb bytes.Buffer
	code := Run(strings.NewReader(ws), "ws", &out, &errb, o)
	raw := out.String()
	if strings.Contains(strings.ReplaceAll(raw, "\r\n", ""), "\n") || strings.Contains(strings.ReplaceAll(raw, "\r\n", ""), "\r") {
		t.Fatalf("a line does not end in CRLF (RFC 4180 §2.1):\n%q", raw)
	}
	var tables [][][]string
	for _, part := range strings.Split(raw, "\r\n\r\n") {
		r := csv.NewReader(strings.NewReader(part))
		recs, err := r.ReadAll() // every record as long as the header
		if err != nil {
			t.Fatalf("not RFC 4180: %v\n%s", err, part)
		}
		if len(recs) > 0 {
			tables = append(tables, recs)
		}
	}
	return tables, code, errb.String()
}

// table returns the table whose header starts with first.
func table(t *testing.T, tables [][][]string, first string) [][]string {
	t.Helper()
	for _, tb := range tables {
		if tb[0][0] == first {
			return tb
		}
	}
	t.Fatalf("no table headed %q in %v", first, tables)
	return nil
}

// stepsOf runs the worksheet on its own and returns its steps, the values
// the CSV must carry exactly.
func stepsOf(t *testing.T, ws string) []calc.Step {
	t.Helper()
	s := sheet.New()
	for _, l := range strings.Split(ws, "\n") {
		if _, _, err := s.Exec(l); err != nil {
			t.Fatalf("%s: %v", l, err)
		}
	}
	return s.Steps()
}

func num(t *testing.T, field string) float64 {
	t.Helper()
	x, err := strconv.ParseFloat(field, 64)
	if err != nil {
		t.Fatalf("%q is not a number: %v", field, err)
	}
	return x
}

// EXAMPLE DATA, an invented bench circuit: 10 Ω in series with 20 mH.
const sweepSheet = "resistor R1 = 10 Ω\ninductor L1 = 20 mH\nsweep R1 + L1 from 10 Hz to 1 kHz points 7"

// TestCSVSweepRoundTrip: a sweep written as CSV and read back by
// encoding/csv gives the sweep's own numbers exactly, and they agree with
// Z = R + jωL, ω = 2πf (common practice) to 1e-12.
func TestCSVSweepRoundTrip(t *testing.T) {
	tables, code, _ := csvTables(t, sweepSheet, Options{})
	if code != ExitOK {
		t.Fatalf("exit %d", code)
	}
	tb := table(t, tables, "f (Hz)")
	want := []string{"f (Hz)", "re value (Ω)", "im value (Ω)", "|value| (Ω)", "arg value (°)"}
	if strings.Join(tb[0], ",") != strings.Join(want, ",") {
		t.Errorf("header %q, want %q", tb[0], want)
	}
	var rows []calc.Row
	for _, st := range stepsOf(t, sweepSheet) {
		if st.Kind == "sweep" {
			rows = st.Rows
		}
	}
	if len(tb)-1 != len(rows) || len(rows) != 7 {
		t.Fatalf("%d records for %d points", len(tb)-1, len(rows))
	}
	for i, rec := range tb[1:] {
		f, z := rows[i].Key.Value, rows[i].Values[0].Value
		if num(t, rec[0]) != real(f.V) || num(t, rec[1]) != real(z.V) || num(t, rec[2]) != imag(z.V) {
			t.Errorf("record %d %q is not the point f=%v Z=%v exactly", i+1, rec, f.V, z.V)
		}
		hz := num(t, rec[0])
		ref := complex(10, 2*math.Pi*hz*0.020)
		got := complex(num(t, rec[1]), num(t, rec[2]))
		if cmplx.Abs(got-ref) > 1e-12*cmplx.Abs(ref) {
			t.Errorf("at %g Hz: %v, R + jωL = %v", hz, got, ref)
		}
		if math.Abs(num(t, rec[3])-cmplx.Abs(ref)) > 1e-12*cmplx.Abs(ref) || math.Abs(num(t, rec[4])-cmplx.Phase(ref)*180/math.Pi) > 1e-9 {
			t.Errorf("at %g Hz: magnitude and angle %s, %s", hz, rec[3], rec[4])
		}
	}
}

// EXAMPLE DATA, an invented circuit: 12 V across 10 Ω in series with
// 20 mH parallel to 100 µF, at 50 Hz.
const netSheet = "resistor R1 = 10 Ω\ninductor L1 = 20 mH\ncapacitor C1 = 100 µF\nnetwork N = R1 + (L1 || C1) fed by 12 V"

// TestCSVNetworkTable: the element table read back gives the network's
// values exactly, and Ohm's law with the current divider (common
// practice) to 1e-9.
func TestCSVNetworkTable(t *testing.T) {
	tables, _, _ := csvTables(t, netSheet, Options{})
	tb := table(t, tables, "name")
	if got := strings.Join(tb[0][:5], ","); got != "name,re v (V),im v (V),|v| (V),arg v (°)" {
		t.Errorf("header %q", got)
	}
	var rows []calc.Row
	for _, st := range stepsOf(t, netSheet) {
		if st.Kind == "elements" {
			rows = st.Rows
		}
	}
	w := 2 * math.Pi * 50
	zl, zc := complex(0, w*0.020), complex(0, -1/(w*100e-6))
	i := 12 / (10 + zl*zc/(zl+zc))
	indep := map[string]complex128{"R1": i, "L1": i * zc / (zl + zc), "C1": i * zl / (zl + zc)}
	for k, rec := range tb[1:] {
		r := rows[k]
		if rec[0] != r.Name {
			t.Fatalf("record %d names %q, want %q", k+1, rec[0], r.Name)
		}
		for c, v := range r.Values {
			re, im := num(t, rec[1+4*c]), num(t, rec[2+4*c])
			if re != real(v.Value.V) || im != imag(v.Value.V) {
				t.Errorf("%s %s: %g%+gi, want %v exactly", r.Name, v.Name, re, im, v.Value.V)
			}
		}
		if want, ok := indep[r.Name]; ok {
			got := complex(num(t, rec[5]), num(t, rec[6]))
			if cmplx.Abs(got-want) > 1e-9*cmplx.Abs(want) {
				t.Errorf("I(%s) = %v, Ohm's law gives %v", r.Name, got, want)
			}
		}
	}
}

// TestCSVFields: quoting per RFC 4180 (comma, quote, line break, quotes
// doubled), the formula guard on text but never on numbers, control
// characters made visible (a tab is a space, as calc.Printable writes
// it), and no NaN or Inf.
func TestCSVFields(t *testing.T) {
	st := calc.Step{Kind: "eval", Line: 3, Results: []calc.Operand{
		{Name: `a,"b"`, Value: calc.Real(-1.5, calc.DimVoltage)},
		{Name: "=cmd|x", Value: calc.Number(complex(math.NaN(), 0))},
		{Name: "+1", Value: calc.Number(-0.25)},
		{Name: "@sum", Value: calc.Number(1e-300)},
		{Name: "-x\r\ny\x1b", Value: calc.Number(complex(math.Inf(1), 2))},
		{Name: "\tz", Value: calc.Number(1)},
	}}
	var b bytes.Buffer
	if err := newCSV(&b).Steps([]calc.Step{st}); err != nil {
		t.Fatal(err)
	}
	raw := b.String()
	if !strings.Contains(raw, "\r\n3,eval,\"a,\"\"b\"\"\",-1.5,0,1.5,180,V,") {
		t.Errorf("a name with a comma and quotes is not quoted as RFC 4180 says:\n%q", raw)
	}
	recs, err := csv.NewReader(strings.NewReader(raw)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	wantName := []string{`a,"b"`, "'=cmd|x", "'+1", "'@sum", `'-x\x0d\x0ay\x1b`, " z"}
	for k, rec := range recs[1:] {
		if !strings.HasPrefix(rec[2], wantName[k]) {
			t.Errorf("name %q, want it to start %q", rec[2], wantName[k])
		}
		if strings.ContainsAny(rec[2], "\r\n\t\x1b") {
			t.Errorf("a control character in %q", rec[2])
		}
		for _, f := range rec[3:7] {
			if strings.HasPrefix(f, "'") || strings.Contains(f, "NaN") || strings.Contains(f, "Inf") {
				t.Errorf("number field %q", f)
			}
		}
	}
	if recs[3][3] != "-0.25" || recs[4][3] != "1e-300" || recs[2][3] != "" || recs[5][3] != "" {
		t.Errorf("numbers: %q %q %q %q", recs[3][3], recs[4][3], recs[2][3], recs[5][3])
	}
}

// TestCSVStreams: under --csv standard output holds only tables; the
// summary goes to the error stream and a failed check still exits 1.
// Numbers keep the decimal point under the decimal comma, and a peak
// phasor's column says so.
func TestCSVStreams(t *testing.T) {
	ws := "decimal comma\nbasis peak\nV1 = 2,5 V\ncheck V1 is 3 V within 1%\nsweep V1 from 1 Hz to 2 Hz points 2\ncheck 1 is 1"
	tables, code, errs := csvTables(t, ws, Options{})
	if code != ExitCheckFail {
		t.Errorf("exit %d, want %d", code, ExitCheckFail)
	}
	if !strings.Contains(errs, "checks: 1 passed, 1 failed") {
		t.Errorf("summary not on the error stream: %q", errs)
	}
	res := table(t, tables, "line")
	if res[0][1] != "kind" || res[1][2] != "V1" || res[1][3] != "2.5" {
		t.Errorf("results %q", res)
	}
	var verdicts []string
	for _, tb := range tables {
		if strings.Join(tb[0], ",") == "line,check,verdict" {
			for _, rec := range tb[1:] {
				verdicts = append(verdicts, rec[0]+" "+rec[2])
			}
		}
	}
	if strings.Join(verdicts, ", ") != "4 fail, 6 pass" {
		t.Errorf("checks %q", verdicts)
	}
	sw := table(t, tables, "f (Hz)")
	if sw[0][1] != "re value (V peak)" {
		t.Errorf("peak column %q", sw[0][1])
	}
}

// TestReadingsRoundTrip: a network's branch voltages and currents written
// by --csv become a readings file (sheet.FormatReadings) that checks
// against the same network pass, exit 0; perturbed by 3 % they fail,
// exit 1. Both check forms are used: is, and reads (a meter reading
// against the range the parts' tolerance allows).
func TestReadingsRoundTrip(t *testing.T) {
	tables, _, _ := csvTables(t, netSheet, Options{})
	tb := table(t, tables, "name")
	var rs []sheet.Reading
	for _, rec := range tb[1:] {
		if rec[0] == "source" {
			continue
		}
		v := complex(num(t, rec[1]), num(t, rec[2]))
		i := complex(num(t, rec[5]), num(t, rec[6]))
		rs = append(rs, sheet.Reading{Name: "V_" + rec[0], Value: calc.Q(v, calc.DimVoltage)},
			sheet.Reading{Name: "I_" + rec[0], Value: calc.Q(i, calc.DimCurrent)})
	}
	checks := netSheet + "\ntolerance R1 5%\nreadings site.csv\n" +
		"check N.R1.v is V_R1 within 0.001%\ncheck N.L1.i is I_L1 within 0.001%\ncheck N.C1.v is V_C1 within 0.001%\n" +
		"check N.R1.v reads V_R1 within 0.5%"
	run := func(rs []sheet.Reading) (int, string) {
		dir := t.TempDir()
		if err := os.WriteFile(filepath.Join(dir, "site.csv"), sheet.FormatReadings(rs), 0o644); err != nil {
			t.Fatal(err)
		}
		var out, errb bytes.Buffer
		code := Run(strings.NewReader(checks), "job", &out, &errb, Options{Dir: dir})
		return code, out.String() + errb.String()
	}
	if code, out := run(rs); code != ExitOK || !strings.Contains(out, "checks: 4 passed, 0 failed") {
		t.Fatalf("exit %d with the network's own values:\n%s", code, out)
	}
	bad := append([]sheet.Reading(nil), rs...)
	bad[0].Value.V *= 1.5 // V_R1 half as large again: outside every band
	code, out := run(bad)
	if code != ExitCheckFail || !strings.Contains(out, "checks: 2 passed, 2 failed") {
		t.Errorf("exit %d with a perturbed reading:\n%s", code, out)
	}
}
