package tui

import (
	"fmt"
	"strings"
	"testing"

	"argand/reduce/sheet"
)

// BenchmarkAfterLongStatement is one short statement run in the app after
// a statement of n terms (Zp = 1+1+…, 60 KB at 30000): its cost must not grow with
// the long statement kept in the session.
func BenchmarkAfterLongStatement(b *testing.B) {
	for _, n := range []int{3000, 30000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			m := newModel(b, Options{})
			long := "Zp = 1" + strings.Repeat("+1", n-1)
			if _, _, err := m.s.exec(sheet.Job{}, long); err != nil {
				b.Fatal(err)
			}
			b.ResetTimer()
			for i := 0; i < b.N; i++ {
				if m.mode != modeLine {
					press(m, "tab")
				}
				for _, r := range fmt.Sprintf("Zq%d = 2 Ω", i) {
					m.Update(keyMsg(string(r)))
					_ = m.View()
				}
				press(m, "enter")
				_ = m.View()
				if m.msgErr {
					b.Fatalf("%s", m.msg)
				}
			}
		})
	}
}
