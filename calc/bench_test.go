package calc

import (
	"fmt"
	"strings"
	"testing"
)

const benchExpr = "(230∠-30 V / ((3+j4 Ω) || (10 Ω + zl(10 mH)) + 1/(j*w*C1))) * 2"

func BenchmarkParse(b *testing.B) {
	for b.Loop() {
		if _, err := ParseExpr(benchExpr, 1); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkEval(b *testing.B) {
	env := newTestEnv()
	x, err := ParseExpr(benchExpr, 1)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		ev := &Evaluator{Env: env, Src: benchExpr, Line: 1}
		if _, err := ev.Eval(x); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkParseEval(b *testing.B) {
	env := newTestEnv()
	for b.Loop() {
		if _, err := evalString(env, benchExpr); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkFormat(b *testing.B) {
	q := Q(complex(12.3456789, -0.00098765), DimCurrent)
	f := Format{Digits: 4}
	for b.Loop() {
		_ = f.Both(q, false)
	}
}

func BenchmarkStepJSON(b *testing.B) {
	st := Step{Kind: "eval", Source: benchExpr, Rule: "quotient", Formula: "a / b",
		Inputs:  []Operand{{Name: "a", Value: Q(230, DimVoltage)}, {Name: "b", Value: Q(3+4i, DimImpedance)}},
		Results: []Operand{{Name: "I1", Value: Q(27.6-36.8i, DimCurrent)}}}
	for b.Loop() {
		_ = st.JSON()
	}
}

// BenchmarkParseMarker parses a sum of n decimal numbers with units under
// each decimal marker, at several sizes: the cost per number stays flat.
func BenchmarkParseMarker(b *testing.B) {
	for _, comma := range []bool{false, true} {
		for _, n := range []int{10, 100, 1000} {
			term := "2.2 kΩ + "
			if comma {
				term = "2,2 kΩ + "
			}
			src := strings.Repeat(term, n) + "1 000 Ω"
			name := fmt.Sprintf("point/n=%d", n)
			if comma {
				name = fmt.Sprintf("comma/n=%d", n)
			}
			b.Run(name, func(b *testing.B) {
				for b.Loop() {
					if _, err := ParseExprComma(src, 1, comma); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
