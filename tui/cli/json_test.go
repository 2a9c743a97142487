package cli

import (
	"bytes"
	"encoding/json"
	"strconv"
	"strings"
	"testing"
)

// TestJSONContract checks the --json contract of shared DESIGN.md: one
// object per line; a result has name, re, im, mag, deg, unit ("" when
// dimensionless) and basis ("rms" or "peak"); numbers in shortest
// round-trip form (strconv 'g', -1); an error has error, line and col.
func TestJSONContract(t *testing.T) {
	ws := strings.Join([]string{
		"Za = 3+j4 Ω",        // impedance
		"k1 = 2.5",           // dimensionless: unit ""
		"x1 = 1/3",           // a number needing all 17 digits
		"Ia = 230 V / Za",    // current
		"basis peak",         // basis changes
		"Vp = 325∠-30 V",     // peak phasor
		"Sp = Vp * conj(Ia)", // power
		"check mag(Za) is 5 Ω within 0.1%",
		"Zbad = 1 V + 1 Ω", // error on line 9
	}, "\n")
	var out, errb bytes.Buffer
	code := Run(strings.NewReader(ws), "j", &out, &errb, Options{JSON: true})
	if code != ExitBadInput {
		t.Fatalf("exit %d, want 2", code)
	}
	if errb.Len() != 0 {
		t.Errorf("in JSON mode errors go to standard output; stderr has %q", errb.String())
	}
	lines := strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
	results := map[string]map[string]any{}
	for i, l := range lines {
		d := json.NewDecoder(strings.NewReader(l))
		d.UseNumber()
		var obj map[string]any
		if err := d.Decode(&obj); err != nil {
			t.Fatalf("line %d is not one JSON object: %v\n%s", i+1, err, l)
		}
		if d.More() {
			t.Fatalf("line %d holds more than one value: %s", i+1, l)
		}
		checkNumbers(t, obj, l)
		if name, ok := obj["name"].(string); ok {
			results[name] = obj
		}
	}
	want := []struct {
		name, unit, basis string
		re, im            float64
	}{
		{"Za", "Ω", "rms", 3, 4},
		{"k1", "", "rms", 2.5, 0},
		{"x1", "", "rms", 1.0 / 3, 0},
		{"Ia", "A", "rms", 230 * 3 / 25.0, -230 * 4 / 25.0},
		{"Sp", "VA", "peak", 0, 0},
		{"Vp", "V", "peak", 325 * 0.8660254037844387, -162.49999999999997},
	}
	for _, w := range want {
		r, ok := results[w.name]
		if !ok {
			t.Errorf("no result named %s", w.name)
			continue
		}
		for _, k := range []string{"name", "re", "im", "mag", "deg", "unit", "basis"} {
			if _, ok := r[k]; !ok {
				t.Errorf("%s: key %q missing", w.name, k)
			}
		}
		if r["unit"] != w.unit || r["basis"] != w.basis {
			t.Errorf("%s: unit %q basis %q, want %q %q", w.name, r["unit"], r["basis"], w.unit, w.basis)
		}
		if w.re != 0 || w.im != 0 {
			re, _ := r["re"].(json.Number).Float64()
			im, _ := r["im"].(json.Number).Float64()
			if !closeTo(re, w.re) || !closeTo(im, w.im) {
				t.Errorf("%s: re %v im %v, want %v %v", w.name, re, im, w.re, w.im)
			}
		}
	}
	if x := results["x1"]; x != nil && x["re"].(json.Number).String() != "0.3333333333333333" {
		t.Errorf("1/3 written as %s, want 0.3333333333333333", x["re"])
	}
	if d, _ := results["Za"]["deg"].(json.Number).Float64(); d != 53.13010235415598 {
		t.Errorf("deg of 3+j4 = %v, want 53.13010235415598 (atan2(4,3) in degrees)", d)
	}
	// the error object, in its place before the run's summary
	var e map[string]any
	json.Unmarshal([]byte(lines[len(lines)-2]), &e)
	if e["error"] == nil || e["line"] != 9.0 || e["col"] != 12.0 {
		t.Errorf("error object %v, want error at line 9 col 12", e)
	}
	for _, k := range []string{"error", "line", "col"} {
		if _, ok := e[k]; !ok {
			t.Errorf("error object lacks %q", k)
		}
	}
}

// checkNumbers asserts every number in a decoded JSON value is written in
// the shortest form that reads back to the same float64.
func checkNumbers(t *testing.T, v any, line string) {
	t.Helper()
	switch x := v.(type) {
	case json.Number:
		f, err := strconv.ParseFloat(x.String(), 64)
		if err != nil {
			t.Errorf("number %s: %v", x, err)
			return
		}
		if want := strconv.FormatFloat(f, 'g', -1, 64); x.String() != want && !(f == 0 && x.String() == "0") {
			t.Errorf("number written %s, shortest round-trip form is %s\n%s", x, want, line)
		}
	case map[string]any:
		for _, y := range x {
			checkNumbers(t, y, line)
		}
	case []any:
		for _, y := range x {
			checkNumbers(t, y, line)
		}
	}
}

func closeTo(a, b float64) bool {
	d := a - b
	if d < 0 {
		d = -d
	}
	m := b
	if m < 0 {
		m = -m
	}
	return d <= 1e-12*m+1e-300
}

// TestJSONEval: argand eval --json writes one object per argument and an
// error object for a bad one.
func TestJSONEval(t *testing.T) {
	var out, errb bytes.Buffer
	code := Eval([]string{"-j4", "3+j4 Ω", "(1"}, &out, &errb, Options{JSON: true})
	if code != ExitBadInput {
		t.Errorf("exit %d", code)
	}
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	if len(lines) != 3 {
		t.Fatalf("%d lines, want 3:\n%s", len(lines), out.String())
	}
	var a, e map[string]any
	json.Unmarshal([]byte(lines[0]), &a)
	json.Unmarshal([]byte(lines[2]), &e)
	if a["im"] != -4.0 || a["unit"] != "" || a["basis"] != "rms" {
		t.Errorf("-j4: %v", a)
	}
	if e["line"] != 3.0 || e["col"] != 1.0 || e["error"] == nil {
		t.Errorf("error: %v", e)
	}
}
