package harmonic

import (
	"errors"
	"math"
	"strings"
	"testing"

	"argand/calc"
)

func TestParseCSV(t *testing.T) {
	// example data: an invented analyser export
	data := "\ufeff# example data\r\norder, value, angle\r\n1, 230 V, 0\r\n3,2.5 %,150\n\n5\t6.9 V\t-60\n7, 1.5 %\n"
	es, lines, err := ParseCSV([]byte(data))
	if err != nil {
		t.Fatal(err)
	}
	if len(es) != 4 || lines[0] != 3 || lines[2] != 6 || lines[3] != 7 {
		t.Fatalf("entries %d, lines %v", len(es), lines)
	}
	s, err := Build(es)
	if err != nil {
		t.Fatal(err)
	}
	if s.Dim != calc.DimVoltage || s.Comps[1].Order != 3 || math.Abs(s.Comps[1].RMS-5.75) > 1e-12 ||
		!s.Comps[1].HasAngle || math.Abs(s.Comps[1].Angle-150*math.Pi/180) > 1e-12 || s.Comps[3].HasAngle {
		t.Errorf("spectrum %+v", s)
	}
	if math.Abs(s.Comps[2].RMS-6.9) > 1e-12 || math.Abs(s.Comps[2].Angle+60*math.Pi/180) > 1e-12 {
		t.Errorf("order 5 from a tab-separated line: %+v", s.Comps[2])
	}
}

func TestParseCSVErrors(t *testing.T) {
	cs := []struct {
		data      string
		line, col int
		want      string
	}{
		{"", 1, 1, "no orders"},
		{"1, 230 V\n3", 2, 1, "found 1 field"},
		{"1, 230 V\n3, 2 %, 10, 4", 2, 1, "found 4 field"},
		{"1, 230 V\nx3, 2 %", 2, 1, "whole number"},
		{"1, 230 V\n0, 2 %", 2, 1, "found 0"},
		{"1, 230 V\n101, 2 %", 2, 1, "found 101"},
		{"1, 230 V\n3,  two", 2, 5, "the value"},
		{"1, 230 V\n3, -2 %", 2, 4, `found "-2 %"`},
		{"1, 230 V\n3, 2 % ∠ 30", 2, 4, "number with its unit"},
		{"1, 230 V\n3, 2 %, east", 2, 9, "degrees"},
		{"1, 230 V\n3, 2 %, 1e400", 2, 9, "degrees"},
		{"1, 230 V\n3, 2 \x1b[31m%", 2, 6, "control character"},
		{"1, 230 V\n3, \xff", 2, 1, "UTF-8"},
		{"1, 230 V\n3, 2 V * 3", 2, 4, "number with its unit"},
	}
	for _, c := range cs {
		_, _, err := ParseCSV([]byte(c.data))
		var le *LineError
		if !errors.As(err, &le) || le.Line != c.line || le.Col != c.col || !strings.Contains(le.Msg, c.want) {
			t.Errorf("%q: error %v, want line %d column %d with %q", c.data, err, c.line, c.col, c.want)
		}
	}
	big := strings.Repeat("#", MaxFile+1)
	if _, _, err := ParseCSV([]byte(big)); err == nil || !strings.Contains(err.Error(), "larger than") {
		t.Errorf("oversized file: %v", err)
	}
	var b strings.Builder
	b.WriteString("1, 1 A\n")
	for i := 0; i < MaxOrder; i++ {
		b.WriteString("2, 1 A\n")
	}
	if _, _, err := ParseCSV([]byte(b.String())); err == nil || !strings.Contains(err.Error(), "at most") {
		t.Errorf("too many lines: %v", err)
	}
}

func TestBuildErrors(t *testing.T) {
	a := func(x float64) calc.Quantity { return calc.Real(x, calc.DimCurrent) }
	pc := func(x float64) calc.Quantity { return calc.Number(complex(x/100, 0)) }
	cs := []struct {
		es    []Entry
		index int
		want  string
	}{
		{nil, -1, "at least the fundamental"},
		{[]Entry{{Order: 3, Value: a(1)}}, -1, "fundamental (h1) is missing"},
		{[]Entry{{Order: 1, Value: a(10)}, {Order: 1, Value: a(1)}}, 1, "given twice"},
		{[]Entry{{Order: 1, Value: a(0)}}, 0, "greater than 0"},
		{[]Entry{{Order: 1, Value: calc.Number(3)}}, 0, "needs a unit"},
		{[]Entry{{Order: 1, Value: calc.Real(3, calc.DimImpedance)}}, 0, "voltage or a current"},
		{[]Entry{{Order: 1, Value: pc(50), Percent: true}}, 0, "must be 100 %"},
		{[]Entry{{Order: 1, Value: pc(100), Percent: true}, {Order: 3, Value: a(1)}}, 1, "give every order in %"},
		{[]Entry{{Order: 1, Value: a(10)}, {Order: 5, Value: calc.Real(1, calc.DimVoltage)}}, 1, "order 5 is in"},
		{[]Entry{{Order: 1, Value: a(10)}, {Order: 5, Value: a(-1)}}, 1, "positive number"},
		{[]Entry{{Order: 1, Value: a(10)}, {Order: 500, Value: a(1)}}, 1, "outside 1 to"},
	}
	for _, c := range cs {
		_, err := Build(c.es)
		var ee *EntryError
		if !errors.As(err, &ee) || ee.Index != c.index || !strings.Contains(ee.Msg, c.want) {
			t.Errorf("%+v: error %v, want index %d with %q", c.es, err, c.index, c.want)
		}
	}
	// a spectrum of fractions: the fundamental is 1
	s, err := Build([]Entry{{Order: 1, Value: pc(100), Percent: true}, {Order: 5, Value: pc(20), Percent: true}})
	if err != nil || !s.Dim.IsDimensionless() || s.Comps[0].RMS != 1 || math.Abs(s.Comps[1].RMS-0.2) > 1e-15 {
		t.Errorf("fractions: %+v, %v", s, err)
	}
}

func FuzzParseCSV(f *testing.F) {
	for _, s := range []string{
		"1, 230 V, 0\n3, 2.5 %, 150\n5, 6.9 V, -60\n",
		"order,value,angle\n1,100 A\n5,20 %,-30\n7,14 %\n",
		"# c\n1\t1 kA\t10\n11\t40 A\t-170\n",
		"1, 100 %\n3, 30 %\n",
		"1, 1e308 V\n2, 1e308 V\n",
		"1,,\n",
		"1, 1e308 V\n2, 1e308 V\n3, 1e308 V\n4, 1e308 V\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		es, lines, err := ParseCSV(data)
		if err != nil {
			var le *LineError
			if !errors.As(err, &le) || le.Line < 1 || le.Col < 1 {
				t.Fatalf("unlocated error %v", err)
			}
			return
		}
		if len(es) != len(lines) || len(es) > MaxOrder {
			t.Fatalf("%d entries, %d lines", len(es), len(lines))
		}
		s, err := Build(es)
		if err != nil {
			return
		}
		for _, v := range []float64{s.RMS(), s.THD(), s.FHL(), s.KFactor(s.RMS()), s.wave().Peak()} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				// only magnitudes near the float64 limit overflow a sum of
				// squares; the package scales to avoid it
				t.Fatalf("non-finite result %v from %q", v, data)
			}
		}
	})
}
