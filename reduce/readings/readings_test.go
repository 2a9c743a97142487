package readings

import (
	"bytes"
	"math"
	"math/cmplx"
	"strconv"
	"strings"
	"testing"

	"argand/calc"
)

// testOptions reads as a worksheet would: the reserved words here stand
// for the worksheet's (its own test checks a reading against those).
func testOptions(comma bool) Options {
	reserved := map[string]string{"frequency": "a statement keyword", "pi": "the constant π", "f": "the working frequency"}
	return Options{Comma: comma, Reserved: func(n string) string { return reserved[n] }}
}

// TestReadingsValues reads each form a value may take, with and without
// the header, BOM, CRLF or LF, and a comment. Polar values are checked
// against m·(cos θ + j sin θ) (common practice).
func TestReadingsValues(t *testing.T) {
	polar := cmplx.Rect(1.18, -38*math.Pi/180)
	want := map[string]calc.Quantity{
		"V_R1": calc.Real(229.6, calc.DimVoltage),
		"I_L1": calc.Q(polar, calc.DimCurrent),
		"Zm":   calc.Q(3+4i, calc.DimImpedance),
		"Rk":   calc.Real(4700, calc.DimImpedance),
		"P1":   calc.Real(1500, calc.DimPower),
		"k":    calc.Number(0.05),
	}
	// example data: invented readings of a bench circuit
	rows := "# EXAMPLE DATA\nV_R1,229.6,V\nI_L1,\"1.18∠-38\",A\nZm, 3+j4 ,Ω\nRk,4.7,kΩ\nP1,1.5,kW\nk,5,%\n"
	for name, body := range map[string]string{
		"LF":          rows,
		"CRLF":        strings.ReplaceAll(rows, "\n", "\r\n"),
		"header":      "name,value,unit\n" + rows,
		"BOM+header":  "\ufeffName, Value ,UNIT\r\n" + strings.ReplaceAll(rows, "\n", "\r\n"),
		"no last EOL": strings.TrimSuffix(rows, "\n"),
	} {
		t.Run(name, func(t *testing.T) {
			rs, err := Parse([]byte(body), testOptions(false))
			if err != nil {
				t.Fatal(err)
			}
			if len(rs) != len(want) {
				t.Fatalf("%d readings, want %d", len(rs), len(want))
			}
			for _, r := range rs {
				w := want[r.Name]
				if r.Value.Dim != w.Dim || cmplx.Abs(r.Value.V-w.V) > 1e-12*cmplx.Abs(w.V) {
					t.Errorf("%s = %v %v, want %v %v", r.Name, r.Value.V, r.Value.Dim, w.V, w.Dim)
				}
			}
		})
	}
}

// TestErrors: every bad file gives one error naming the line and
// the column (1-based, in characters) and what to type.
func TestErrors(t *testing.T) {
	for _, c := range []struct {
		name, body string
		comma      bool
		line, col  int
		says       string
	}{
		{"two fields", "V1,230\n", false, 1, 1, "2 fields where 3 belong"},
		{"four fields", "V1,230,V,x\n", false, 1, 1, "4 fields where 3 belong"},
		{"missing name", "name,value,unit\n,230,V\n", false, 2, 1, "the name is missing"},
		{"reserved keyword", "frequency,50,Hz\n", false, 1, 1, "reserved"},
		{"reserved constant", "ok,1,V\npi,3,V\n", false, 2, 1, "reserved"},
		{"working frequency", "f,50,Hz\n", false, 1, 1, "reserved"},
		{"dotted", "N.R1.v,1,V\n", false, 1, 1, "cannot contain '.'"},
		{"not a name", "2x,1,V\n", false, 1, 1, "not a name"},
		{"percent name", "%,1,V\n", false, 1, 1, "not a name"},
		{"twice", "a,1,V\nb,2,V\na,3,V\n", false, 3, 1, "given twice (lines 1 and 3)"},
		{"no value", "a, ,V\n", false, 1, 3, "value of a is missing"},
		{"bad number", "a,23O.1,V\n", false, 1, 3, "name,value,unit"},
		{"bad unit", "a,1,Vx\n", false, 1, 5, "name,value,unit"},
		{"compound unit", "a,2,/C\n", false, 1, 5, "not in a unit of one measured quantity"},
		{"compound in the value", "a,2 /C,\n", false, 1, 3, "not in a unit of one measured quantity"},
		{"a name as value", "a,b,V\n", false, 1, 3, "not a number with a unit"},
		{"a function", "a,sqrt(2),V\n", false, 1, 3, "not a number with a unit"},
		{"arithmetic", "a,2*3,V\n", false, 1, 3, "not a number with a unit"},
		{"comma under point", "a,\"229,6\",V\n", false, 1, 3, `write "229.6", or put decimal comma`},
		{"both markers", "a,\"1.229,6\",V\n", true, 1, 3, "both a comma and a point"},
		{"bare quote", "a,2\"3,V\n", false, 1, 4, "double the quote"},
		{"open quote", "a,\"23,V\n", false, 1, 0, "close the quote"},
		{"bad UTF-8", "ok,1,V\nab\xffc,1,V\n", false, 2, 3, "UTF-8"},
		{"after a wide char", "µ1,1,V\nΩa,2x,V\n", false, 2, 4, "name,value,unit"},
		// a control character in a name is shown escaped once, never sent
		{"control in a name", "V\x1b[31mx,1,V\n", false, 1, 1, `"V\x1b[31mx" is not a name`},
		{"empty", "# nothing\n\n", false, 0, 0, "no readings"},
		{"header only", "name,value,unit\n", false, 0, 0, "no readings"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := Parse([]byte(c.body), testOptions(c.comma))
			if err == nil {
				t.Fatal("accepted")
			}
			if !strings.Contains(err.Error(), c.says) {
				t.Errorf("%v: does not say %q", err, c.says)
			}
			re, ok := err.(*Error)
			if c.line == 0 {
				return
			}
			if !ok {
				t.Fatalf("%v: not located", err)
			}
			if re.Line != c.line || (c.col != 0 && re.Col != c.col) {
				t.Errorf("%v: at %d:%d, want %d:%d", err, re.Line, re.Col, c.line, c.col)
			}
		})
	}
}

// TestReadingsDecimalComma: under decimal comma a quoted "229,6" is read
// as 229.6; a point is still read as a point.
func TestReadingsDecimalComma(t *testing.T) {
	rs, err := Parse([]byte("a,\"229,6\",V\nb,1.5,A\n"), testOptions(true))
	if err != nil {
		t.Fatal(err)
	}
	if rs[0].Value.V != 229.6 || rs[1].Value.V != 1.5 {
		t.Errorf("read %v and %v", rs[0].Value.V, rs[1].Value.V)
	}
}

// TestReadingsBounds: a file past the byte or row bound is refused with
// the bound in the message.
func TestReadingsBounds(t *testing.T) {
	big := bytes.Repeat([]byte("#"), MaxBytes+1)
	if _, err := Parse(big, testOptions(false)); err == nil || !strings.Contains(err.Error(), strconv.Itoa(MaxBytes)) {
		t.Errorf("too many bytes: %v", err)
	}
	var b strings.Builder
	for i := 0; i <= MaxRows; i++ {
		b.WriteString("v" + strconv.Itoa(i) + ",1,V\n")
	}
	_, err := Parse([]byte(b.String()), testOptions(false))
	re, ok := err.(*Error)
	if !ok || re.Line != MaxRows+1 || !strings.Contains(re.Msg, strconv.Itoa(MaxRows)) {
		t.Errorf("too many rows: %v", err)
	}
}

// FuzzReadings: the readings parser never panics; what it accepts,
// written back by FormatReadings, reads back to the same names and
// values exactly.
func FuzzReadings(f *testing.F) {
	for _, seed := range []string{
		"name,value,unit\nV_R1,229.6,V\nI_L1,\"1.18∠-38\",A\n",
		"\ufeffa,3+j4,Ω\r\nb,4.7,kΩ\r\nc,5,%\r\n", "# c\n\nx,1e-05,mV\n", "a,\"2,5\",V\n",
		"a,2\"3,V\n", "a,\"x\n", "p,1,W\nq,2,var\ns,3,VA\n", "t,30,°\nu,0.5,rad\n", "a,-j2,A\n",
		"frequency,50,Hz\n", "a,1,V\na,2,V\n", "\xff,1,V\n", "a,1e308,kV\n", "h,1,hp\n",
	} {
		f.Add(seed, false)
		f.Add(seed, true)
	}
	f.Fuzz(func(t *testing.T, data string, comma bool) {
		rs, err := Parse([]byte(data), testOptions(comma))
		if err != nil {
			if re, ok := err.(*Error); ok && (re.Line < 1 || re.Col < 1) {
				t.Fatalf("error outside the file: %v", err)
			}
			return
		}
		out := Format(rs)
		back, err := Parse(out, testOptions(false))
		if err != nil {
			t.Fatalf("written back %q: %v", out, err)
		}
		if len(back) != len(rs) {
			t.Fatalf("%d readings back, want %d", len(back), len(rs))
		}
		for i := range rs {
			a, b := rs[i], back[i]
			if a.Name != b.Name || a.Value.V != b.Value.V || a.Value.Dim != b.Value.Dim {
				t.Fatalf("%s = %v %v came back as %s = %v %v (file %q)", a.Name, a.Value.V, a.Value.Dim, b.Name, b.Value.V, b.Value.Dim, out)
			}
		}
	})
}
