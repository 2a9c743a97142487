package record

import (
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"testing"
	"time"
)

// browser returns a headless Chromium, or skips the test with a warning:
// the browser is optional (.ci/run does not install it).
func browser(t *testing.T) string {
	t.Helper()
	if testing.Short() {
		t.Skip("-short: no browser render")
	}
	for _, name := range []string{"chromium", "chromium-browser"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	t.Log("WARNING: no chromium found: the headless-browser render of the record is not tested")
	t.Skip("chromium not installed")
	return ""
}

// chromium runs the browser headless on a page with its own profile and
// returns what it printed, bounded by a generous stall limit.
func chromium(t *testing.T, bin string, args ...string) string {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	base := []string{"--headless=new", "--no-sandbox", "--disable-gpu", "--no-first-run", "--user-data-dir=" + t.TempDir()}
	out, err := exec.CommandContext(ctx, bin, append(base, args...)...).Output()
	if err != nil {
		t.Fatalf("chromium: %v", err)
	}
	return string(out)
}

// TestBrowserPhone: in a real browser, a record laid out 360 px wide (a
// phone in portrait) scrolls only down: the page is no wider than its
// view. The record has no script; the probe page around it measures it.
func TestBrowserPhone(t *testing.T) {
	bin := browser(t)
	dir := t.TempDir()
	for _, name := range []string{"bench", "plant"} {
		doc := render(t, readFile(t, "testdata/"+name+".argand"))
		if err := os.WriteFile(filepath.Join(dir, name+".html"), []byte(doc), 0o644); err != nil {
			t.Fatal(err)
		}
		probe := `<!DOCTYPE html><html><body style="margin:0"><iframe id="f" src="` + name + `.html" style="width:360px;height:640px;border:0"></iframe>` +
			`<script>document.getElementById("f").onload=function(){var d=this.contentDocument.documentElement;` +
			`document.body.setAttribute("data-sw", d.scrollWidth+" "+d.clientWidth);};</script></body></html>`
		pp := filepath.Join(dir, name+"-probe.html")
		if err := os.WriteFile(pp, []byte(probe), 0o644); err != nil {
			t.Fatal(err)
		}
		out := chromium(t, bin, "--allow-file-access-from-files", "--virtual-time-budget=5000", "--dump-dom", "file://"+pp)
		m := regexp.MustCompile(`data-sw="(\d+) (\d+)"`).FindStringSubmatch(out)
		if m == nil {
			t.Fatalf("%s: the probe measured nothing:\n%.500s", name, out)
		}
		sw, _ := strconv.Atoi(m[1])
		cw, _ := strconv.Atoi(m[2])
		if sw > cw || cw < 300 {
			t.Errorf("%s: at 360 px the page is %d px wide in a view of %d px: it scrolls sideways", name, sw, cw)
		}
	}
}

// TestBrowserPrint: the browser prints a record on A4 or US letter, as its
// paper is set (A4 595×842 pt, letter 612×792 pt: ISO 216, ANSI/ASME Y14.1).
func TestBrowserPrint(t *testing.T) {
	bin := browser(t)
	dir := t.TempDir()
	page := filepath.Join(dir, "bench.html")
	if err := os.WriteFile(page, []byte(render(t, readFile(t, "testdata/bench.argand"))), 0o644); err != nil {
		t.Fatal(err)
	}
	pdf := filepath.Join(dir, "bench.pdf")
	chromium(t, bin, "--no-pdf-header-footer", "--print-to-pdf="+pdf, "file://"+page)
	b, err := os.ReadFile(pdf)
	if err != nil {
		t.Fatal(err)
	}
	boxes := regexp.MustCompile(`MediaBox \[0 0 ([\d.]+) ([\d.]+)\]`).FindAllSubmatch(b, -1)
	if len(boxes) == 0 {
		t.Fatal("no page in the PDF")
	}
	for _, bx := range boxes {
		w, _ := strconv.ParseFloat(string(bx[1]), 64)
		h, _ := strconv.ParseFloat(string(bx[2]), 64)
		a4 := abs(w-595.3) < 1.5 && abs(h-841.9) < 1.5
		letter := abs(w-612) < 1.5 && abs(h-792) < 1.5
		if !a4 && !letter {
			t.Errorf("page %.1f×%.1f pt is neither A4 nor letter", w, h)
		}
	}
	t.Logf("%d pages", len(boxes))
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
