package record

import (
	"bytes"
	"encoding/xml"
	"io"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"argand/calc"
	"argand/reduce/sheet"

	"golang.org/x/net/html"
	"golang.org/x/net/html/atom"
)

const testDate = "2026-03-14"

// render runs a worksheet and returns its record.
func render(t *testing.T, src string) string {
	t.Helper()
	s := sheet.New()
	sum, err := s.Run(strings.NewReader(src), nil)
	if err != nil || len(sum.Problems) > 0 {
		t.Fatalf("worksheet: %v %+v", err, sum.Problems)
	}
	var b strings.Builder
	if err := Write(&b, Job{Sheet: s, Source: src, Date: testDate}); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

func readFile(t *testing.T, name string) string {
	t.Helper()
	b, err := os.ReadFile(name)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// hostile is a worksheet whose title and comments carry markup, quotes,
// a terminal escape and a bidirectional override.
const hostile = "title <script>alert(1)</script> \"quoted\" 'single' & <img src=x onerror=alert(2)>\n" +
	"# </pre><script>alert(3)</script> &amp; \x07 bell \x1b[2J\u202eevil\n" +
	"Z = 3+j4 Ω   # <b>bold</b>\n" +
	"Vx = 230∠30 V\n" +
	"Ix = Vx / Z\n" +
	"check Ix is 46∠-23.13 A within 0.1% and 0.05°\n"

// records returns the records every structural test reads.
func records(t *testing.T) map[string]string {
	return map[string]string{
		"bench":   render(t, readFile(t, "testdata/bench.argand")),
		"plant":   render(t, readFile(t, "testdata/plant.argand")),
		"hostile": render(t, hostile),
		"empty":   render(t, ""),
	}
}

// voids are the HTML elements with no end tag; a record writes them
// self-closed (<meta … />) so that every element is closed explicitly.
var voids = map[string]bool{"meta": true, "br": true, "hr": true, "img": true, "input": true, "link": true, "area": true,
	"base": true, "col": true, "embed": true, "source": true, "track": true, "wbr": true}

// TestTagsClosed: with the tokenizer of golang.org/x/net/html, every start
// tag has its end tag, in order, and every void element is self-closed.
func TestTagsClosed(t *testing.T) {
	for name, doc := range records(t) {
		z := html.NewTokenizer(strings.NewReader(doc))
		var stack []string
		for {
			tt := z.Next()
			if tt == html.ErrorToken {
				if z.Err() != io.EOF {
					t.Errorf("%s: %v", name, z.Err())
				}
				break
			}
			tok := z.Token()
			switch tt {
			case html.StartTagToken:
				if voids[tok.Data] {
					t.Errorf("%s: <%s> not self-closed", name, tok.Data)
					continue
				}
				stack = append(stack, tok.Data)
			case html.EndTagToken:
				if len(stack) == 0 || stack[len(stack)-1] != tok.Data {
					t.Errorf("%s: </%s> closes %v", name, tok.Data, stack)
					continue
				}
				stack = stack[:len(stack)-1]
			}
		}
		if len(stack) > 0 {
			t.Errorf("%s: left open: %v", name, stack)
		}
	}
}

// TestSelfContained: no element loads anything (no src, no link, no
// script, no object), no link leaves the document, no handler attribute,
// and the style sheet imports nothing.
func TestSelfContained(t *testing.T) {
	// every element that loads, embeds or sends something (media
	// elements load only through src, refused with the attributes below);
	// SVG's <use> has no atom of its own
	forbidden := map[atom.Atom]bool{atom.Script: true, atom.Link: true, atom.Img: true, atom.Iframe: true, atom.Object: true,
		atom.Embed: true, atom.Source: true, atom.Form: true, atom.Base: true,
		atom.Image: true, atom.Foreignobject: true}
	for name, doc := range records(t) {
		z := html.NewTokenizer(strings.NewReader(doc))
		for tt := z.Next(); tt != html.ErrorToken; tt = z.Next() {
			tok := z.Token()
			if tt == html.TextToken && (strings.Contains(tok.Data, "url(") || strings.Contains(tok.Data, "@import")) && !strings.Contains(tok.Data, "argand") {
				t.Errorf("%s: style loads something: %q", name, tok.Data)
			}
			if tt != html.StartTagToken && tt != html.SelfClosingTagToken {
				continue
			}
			if tag := strings.ToLower(tok.Data); forbidden[atom.Lookup([]byte(tag))] || tag == "use" {
				t.Errorf("%s: <%s> element", name, tok.Data)
			}
			for _, a := range tok.Attr {
				k, v := strings.ToLower(a.Key), strings.ToLower(strings.TrimSpace(a.Val))
				switch {
				case k == "xmlns" && v == "http://www.w3.org/2000/svg":
					// a namespace name, never fetched
				case strings.HasPrefix(k, "on") || k == "src" || k == "srcset" || k == "action" || k == "style" && strings.Contains(v, "url("):
					t.Errorf("%s: attribute %s=%q on <%s>", name, a.Key, a.Val, tok.Data)
				case strings.Contains(v, "http:") || strings.Contains(v, "https:") || strings.HasPrefix(v, "//") || strings.Contains(v, "javascript:") || strings.Contains(v, "data:"):
					t.Errorf("%s: external reference %s=%q on <%s>", name, a.Key, a.Val, tok.Data)
				case k == "href" && !strings.HasPrefix(v, "#"):
					t.Errorf("%s: link out of the document: %q", name, a.Val)
				}
			}
		}
	}
}

// TestTreeStable: the tree an HTML parser builds is the tree the tags
// write (the parser moved or added no element), and parse, render and
// parse again gives the same tree.
func TestTreeStable(t *testing.T) {
	for name, doc := range records(t) {
		first, err := html.Parse(strings.NewReader(doc))
		if err != nil {
			t.Fatal(err)
		}
		var out bytes.Buffer
		if err := html.Render(&out, first); err != nil {
			t.Fatal(err)
		}
		second, err := html.Parse(&out)
		if err != nil {
			t.Fatal(err)
		}
		a, b := dump(first), dump(second)
		if a != b {
			t.Errorf("%s: the tree changed through render and parse:\n%s", name, firstDiff(a, b))
		}
		if w := written(t, doc); w != a {
			t.Errorf("%s: the parser built another tree than the tags write:\n%s", name, firstDiff(w, a))
		}
	}
}

// dump writes a parsed tree as one line per element and text, whitespace
// text left out (the parser drops some of it between head elements).
func dump(n *html.Node) string {
	var b strings.Builder
	var walk func(n *html.Node, depth int)
	walk = func(n *html.Node, depth int) {
		switch n.Type {
		case html.ElementNode:
			b.WriteString(strings.Repeat(" ", depth) + "<" + n.Data + attrs(n.Attr) + ">\n")
		case html.TextNode:
			if strings.TrimSpace(n.Data) != "" {
				b.WriteString(strings.Repeat(" ", depth) + "text " + strings.TrimPrefix(n.Data, "\n") + "\n")
			}
		}
		for c := n.FirstChild; c != nil; c = c.NextSibling {
			walk(c, depth+1)
		}
	}
	walk(n, -1)
	return b.String()
}

func attrs(as []html.Attribute) string {
	var b strings.Builder
	for _, a := range as {
		// the parser writes SVG's attributes in their own case (viewBox)
		b.WriteString(" " + strings.ToLower(a.Key) + "=" + a.Val)
	}
	return b.String()
}

// written builds the tree the tokens state, in dump's form.
func written(t *testing.T, doc string) string {
	z := html.NewTokenizer(strings.NewReader(doc))
	var b strings.Builder
	depth := 0
	// the parser's tree has a document node at depth -1 whose children
	// (html) are at 0; pre and textarea drop one leading line feed
	for tt := z.Next(); tt != html.ErrorToken; tt = z.Next() {
		tok := z.Token()
		switch tt {
		case html.StartTagToken, html.SelfClosingTagToken:
			b.WriteString(strings.Repeat(" ", depth) + "<" + strings.ToLower(tok.Data) + attrs(tok.Attr) + ">\n")
			if tt == html.StartTagToken {
				depth++
			}
		case html.EndTagToken:
			depth--
		case html.TextToken:
			if strings.TrimSpace(tok.Data) != "" {
				b.WriteString(strings.Repeat(" ", depth) + "text " + strings.TrimPrefix(tok.Data, "\n") + "\n")
			}
		}
	}
	return b.String()
}

func firstDiff(a, b string) string {
	al, bl := strings.Split(a, "\n"), strings.Split(b, "\n")
	for i := 0; i < min(len(al), len(bl)); i++ {
		if al[i] != bl[i] {
			return "line " + al[i] + "\n   vs " + bl[i]
		}
	}
	return "one is longer"
}

var svgRe = regexp.MustCompile(`(?s)<svg .*?</svg>`)

// TestSVGStrictXML: every inline SVG is well-formed XML, read by
// encoding/xml in strict mode, in the SVG namespace.
func TestSVGStrictXML(t *testing.T) {
	total := 0
	for name, doc := range records(t) {
		for _, svg := range svgRe.FindAllString(doc, -1) {
			total++
			d := xml.NewDecoder(strings.NewReader(svg))
			d.Strict = true
			root := ""
			for {
				tok, err := d.Token()
				if err == io.EOF {
					break
				}
				if err != nil {
					t.Fatalf("%s: %v in\n%s", name, err, svg)
				}
				if se, ok := tok.(xml.StartElement); ok && root == "" {
					root = se.Name.Space + " " + se.Name.Local
				}
			}
			if root != "http://www.w3.org/2000/svg svg" {
				t.Errorf("%s: root element %q", name, root)
			}
		}
	}
	if total < 4 {
		t.Errorf("only %d diagrams drawn", total)
	}
}

// TestLayoutRules: the rules that carry the phone and the print promises.
func TestLayoutRules(t *testing.T) {
	doc := records(t)["bench"]
	head := doc[:strings.Index(doc, "</head>")]
	for _, want := range []*regexp.Regexp{
		regexp.MustCompile(`<meta name="viewport" content="width=device-width, initial-scale=1" />`),
		regexp.MustCompile(`<meta charset="utf-8" />`),
		regexp.MustCompile(`\nsvg \{[^}]*max-width: 100%`),
		regexp.MustCompile(`\ntable \{[^}]*max-width: 100%`),
		regexp.MustCompile(`\npre \{[^}]*white-space: pre-wrap`),
		regexp.MustCompile(`\nbody \{[^}]*overflow-wrap: break-word`),
		regexp.MustCompile(`\nth, td \{[^}]*overflow-wrap: anywhere`),
		regexp.MustCompile(`@media print[^{]*\{ @page \{ size: A4;`),
		regexp.MustCompile(`@media print[^{]*\{ @page \{ size: letter;`),
		regexp.MustCompile(`@media \(max-width: 36rem\) \{\n  table.values, `),
	} {
		if !want.MatchString(head) {
			t.Errorf("head lacks %s", want)
		}
	}
	// no fixed width in the flow wider than a 360 px phone: the only
	// widths given are the diagrams' own, which max-width scales down
	for _, m := range regexp.MustCompile(`(?:width|min-width):\s*(\d+)px`).FindAllStringSubmatch(doc, -1) {
		t.Errorf("fixed width in the style: %s", m[0])
	}
}

// TestEscaping: hostile text from the worksheet reaches the record only as
// text: no element, attribute or control character comes from it.
func TestEscaping(t *testing.T) {
	doc := records(t)["hostile"]
	for _, bad := range []string{"<script", "<img", "<b>", "\x1b", "\x07", "\u202e"} {
		if strings.Contains(doc, bad) {
			t.Errorf("record holds %q", bad)
		}
	}
	for _, want := range []string{"&lt;script&gt;alert(1)&lt;/script&gt;", "&#34;quoted&#34;", "&#39;single&#39;", `\x1b[2J`, `\u202e`, "&amp;lt;/pre&amp;gt;"} {
		if !strings.Contains(doc, want) && !strings.Contains(doc, strings.ReplaceAll(want, "&amp;lt;/pre&amp;gt;", "&lt;/pre&gt;")) {
			t.Errorf("record lacks %q", want)
		}
	}
	for i := 0; i < len(doc); i++ {
		if c := doc[i]; c < 0x20 && c != '\n' || c == 0x7f {
			t.Fatalf("control byte %#x at %d", c, i)
		}
	}
	if got := calc.Printable(doc); got != doc {
		t.Error("record holds text calc.Printable would change")
	}
}

// TestRoundTrip: the worksheet taken out of a record runs to the same
// steps, value for value (the JSON form of each step, shortest round-trip
// numbers), with the same checks.
func TestRoundTrip(t *testing.T) {
	for _, src := range []string{readFile(t, "testdata/bench.argand"), readFile(t, "testdata/plant.argand"), hostile} {
		doc := render(t, src)
		got, err := Extract(strings.NewReader(doc))
		if err != nil {
			t.Fatal(err)
		}
		if got != Worksheet(src) {
			t.Errorf("extracted worksheet differs:\n%q\n%q", got, Worksheet(src))
		}
		a, b := stepsJSON(t, src), stepsJSON(t, got)
		if a != b {
			t.Errorf("replay differs:\n%s", firstDiff(a, b))
		}
		if doc2 := render(t, got); doc2 != doc {
			t.Errorf("the record of the extracted worksheet differs:\n%s", firstDiff(doc, doc2))
		}
	}
	if _, err := Extract(strings.NewReader("<html><body>no record</body></html>")); err == nil {
		t.Error("Extract found a worksheet in a page without one")
	}
}

func stepsJSON(t *testing.T, src string) string {
	s := sheet.New()
	var b strings.Builder
	sum, err := s.Run(strings.NewReader(src), func(st []calc.Step) {
		for i := range st {
			b.WriteString(st[i].JSON() + "\n")
		}
	})
	if err != nil || len(sum.Problems) > 0 {
		t.Fatalf("%v %+v", err, sum.Problems)
	}
	return b.String()
}

// TestReadmeRecord: the README's record example is testdata/bench.argand,
// and the size the README gives is the size of its record.
func TestReadmeRecord(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Skip("README.md not found:", err)
	}
	readme := string(b)
	src := readFile(t, "testdata/bench.argand")
	if !strings.Contains(readme, "```\n"+src+"```\n") {
		t.Error("README's record example is not testdata/bench.argand")
	}
	m := regexp.MustCompile(`export --html bench-record.html --date 2026-03-14 bench.argand\nwrote \S+ \((\d+) bytes\)`).FindStringSubmatch(readme)
	if m == nil {
		t.Fatal("README shows no export of bench.argand")
	}
	if got := strconv.Itoa(len(render(t, src))); got != m[1] {
		t.Errorf("README says %s bytes, the record has %s", m[1], got)
	}
}
