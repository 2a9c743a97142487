package tui

import (
	"fmt"
	"io"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"argand/reduce/sheet"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/creack/pty"
)

// benchModel has 100 rows and a screen whose sketch pane is 60×20 cells.
func benchModel(b *testing.B) *Model {
	m := newModel(b, Options{})
	stmts := make([]string, 0, 100)
	for i := 0; i < 100-len(m.s.rows()); i++ {
		x, sign := i%7-3, "+"
		if x < 0 {
			x, sign = -x, "-"
		}
		stmts = append(stmts, fmt.Sprintf("Zb%d = %d%sj%d Ω", i, i+1, sign, x))
	}
	if _, _, err := m.s.exec(sheet.Job{}, stmts...); err != nil {
		b.Fatal(err)
	}
	m.s.v.Marks = m.s.rows()[:6]
	m.Update(tea.WindowSizeMsg{Width: 143, Height: 42})
	if _, lowerH, sketchW := m.layout(); sketchW != 60 || lowerH-1 != 20 {
		b.Fatalf("sketch %d×%d", sketchW, lowerH-1)
	}
	return m
}

// BenchmarkKeystroke is Update plus View for one character typed into
// the entry line (live validation included).
func BenchmarkKeystroke(b *testing.B) {
	m := benchModel(b)
	press(m, "tab")
	m.View()
	k := keyMsg("1")
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if i%50 == 0 {
			m.line.f.clear()
		}
		m.Update(k)
		_ = m.View()
	}
}

// BenchmarkSelect is Update plus View for moving the selection, which
// redraws the table.
func BenchmarkSelect(b *testing.B) {
	m := benchModel(b)
	m.View()
	keys := []tea.KeyMsg{keyMsg("down"), keyMsg("up")}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		m.Update(keys[i%2])
		_ = m.View()
	}
}

// counter counts bytes read from the pseudo-terminal.
type counter struct {
	n    atomic.Int64
	last atomic.Int64 // time of the last byte, ns
}

func (c *counter) drain(r io.Reader) {
	buf := make([]byte, 32<<10)
	for {
		n, err := r.Read(buf)
		c.n.Add(int64(n))
		c.last.Store(time.Now().UnixNano())
		if err != nil {
			return
		}
	}
}

// settle waits until nothing has been written for quiet.
func (c *counter) settle(quiet time.Duration) {
	for i := 0; i < 200; i++ {
		time.Sleep(quiet / 4)
		if time.Since(time.Unix(0, c.last.Load())) > quiet {
			return
		}
	}
}

// BenchmarkTypedCharBytes measures what the terminal receives for one
// character typed into the entry line, through a pseudo-terminal at
// 80×24: the metric bytes/char.
func BenchmarkTypedCharBytes(b *testing.B) {
	master, slave, err := pty.Open()
	if err != nil {
		b.Skip("no pseudo-terminal:", err)
	}
	defer master.Close()
	defer slave.Close()
	pty.Setsize(master, &pty.Winsize{Rows: 24, Cols: 80})
	m := newModel(b, Options{})
	p := tea.NewProgram(m, tea.WithInput(slave), tea.WithOutput(slave), tea.WithAltScreen())
	var c counter
	go c.drain(master)
	var wg sync.WaitGroup
	wg.Add(1)
	go func() { defer wg.Done(); p.Run() }()
	c.settle(100 * time.Millisecond)
	master.Write([]byte("e"))
	c.settle(100 * time.Millisecond)
	var total int64
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		before := c.n.Load()
		master.Write([]byte("1"))
		c.settle(60 * time.Millisecond)
		total += c.n.Load() - before
	}
	b.StopTimer()
	b.ReportMetric(float64(total)/float64(b.N), "bytes/char")
	p.Quit()
	wg.Wait()
}
