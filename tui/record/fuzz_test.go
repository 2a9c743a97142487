package record

import (
	"strings"
	"testing"

	"argand/reduce/sheet"
)

// FuzzExtract: whatever text a record embeds comes back from Extract as
// the record embeds it (Worksheet of the text), and Extract never fails
// on a record nor panics on anything else.
func FuzzExtract(f *testing.F) {
	for _, s := range []string{"", "Z = 3+j4 Ω\n", "# </pre><pre id=\"argand-worksheet\" class=\"source\">\nx", "&amp;&lt;\r\n\x1b[2J\u202e\ufeff", "\n\n\nlast"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		var b strings.Builder
		if err := Write(&b, Job{Sheet: sheet.New(), Source: src, Date: testDate}); err != nil {
			t.Fatal(err)
		}
		got, err := Extract(strings.NewReader(b.String()))
		if err != nil {
			t.Fatal(err)
		}
		if want := Worksheet(src); got != want {
			t.Fatalf("extracted %q, want %q", got, want)
		}
		Extract(strings.NewReader(src))
	})
}
