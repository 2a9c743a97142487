package serve

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"argand/tui"
	"argand/tui/cli"
	"argand/tui/termbg"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/gliderlabs/ssh"
	"github.com/muesli/termenv"
	gossh "golang.org/x/crypto/ssh"
)

// refusedRequest reports the session requests answered no: running a
// command, a subsystem (file transfer), agent forwarding and X11. Only a
// terminal, its size and environment, and the shell (which is argand) are
// served; the library refuses the other kinds itself.
func refusedRequest(kind string) bool {
	switch kind {
	case "exec", "subsystem", "auth-agent-req@openssh.com", "x11-req":
		return true
	}
	return false
}

// sessionChannel serves a session channel, answering the refused
// requests itself before the library sees them: the library would grant
// agent forwarding and start the handler for a command.
func (s *Server) sessionChannel(srv *ssh.Server, conn *gossh.ServerConn, nc gossh.NewChannel, ctx ssh.Context) {
	ssh.DefaultSessionHandler(srv, conn, filtered{NewChannel: nc, s: s, ctx: ctx}, ctx)
}

type filtered struct {
	gossh.NewChannel
	s   *Server
	ctx ssh.Context
}

func (f filtered) Accept() (gossh.Channel, <-chan *gossh.Request, error) {
	ch, reqs, err := f.NewChannel.Accept()
	if err != nil {
		return ch, reqs, err
	}
	out := make(chan *gossh.Request)
	go func() {
		defer close(out)
		for r := range reqs {
			if refusedRequest(r.Type) {
				f.s.cfg.Log.Printf("refused fp=%s addr=%s request=%s", fingerprintOf(f.ctx), f.ctx.RemoteAddr(), r.Type)
				r.Reply(false, nil)
				continue
			}
			out <- r
		}
	}()
	return ch, out, nil
}

func fingerprintOf(ctx ssh.Context) string {
	if k, ok := ctx.Value(ssh.ContextKeyPublicKey).(ssh.PublicKey); ok && k != nil {
		return gossh.FingerprintSHA256(k)
	}
	return "-"
}

// ending records why a session ends, once: the first reason wins.
type ending struct {
	once   sync.Once
	reason string // for the log: a word, never the user's input
	line   string // for the client, "" when the user quit
	done   chan struct{}
}

func newEnding() *ending { return &ending{reason: "quit", done: make(chan struct{})} }

func (e *ending) end(reason, line string) {
	e.once.Do(func() {
		e.reason, e.line = reason, line
		close(e.done)
	})
}

// handle runs argand for one session.
func (s *Server) handle(sess ssh.Session) {
	start := time.Now()
	key := sess.PublicKey()
	fp, kd := gossh.FingerprintSHA256(key), keyDir(key)
	addr := sess.RemoteAddr().String()
	if c, ok := sess.Context().Value(connKey{}).(*countedConn); ok {
		c.start() // the handshake is over: the idle limit takes over
	}
	s.cfg.Log.Printf("connect fp=%s addr=%s", fp, addr)
	e := newEnding()
	defer func() {
		s.cfg.Log.Printf("disconnect fp=%s addr=%s duration=%s reason=%s", fp, addr, time.Since(start).Round(time.Millisecond), e.reason)
	}()
	pty, winch, ok := sess.Pty()
	if !ok {
		e.end("no-terminal", "")
		refuse(sess, "argand needs a terminal; connect with ssh -t")
		return
	}
	if msg := s.acquire(kd); msg != "" {
		e.end("limit-sessions", "")
		refuse(sess, msg)
		return
	}
	defer s.release(kd)

	getenv := envOf(sess.Environ(), pty.Term)
	if getenv("TERM") == "dumb" || getenv("TERM") == "" {
		e.end("no-terminal", "")
		refuse(sess, "argand needs a terminal that can address the screen (TERM is "+printableTerm(getenv("TERM"))+")")
		return
	}
	out := &lockedWriter{w: sess}
	in := &input{r: sess, rate: float64(s.cfg.Rate), maxLine: s.cfg.MaxLine, last: time.Now(), e: e}
	in.tokens = in.burst()
	in.seen.Store(time.Now().UnixNano())

	sess.Exit(s.run(sess, s.options(getenv, out, kd), in, winch, e))
}

// options are the app's options for one connection: the look is the
// client's (its TERM, NO_COLOR, LANG and background, on a renderer of this
// session's own), the session state is its key's.
func (s *Server) options(getenv func(string) string, out *lockedWriter, kd string) tui.Options {
	color := tui.ColorWanted(getenv)
	r := lipgloss.NewRenderer(out)
	switch {
	case color:
		r.SetColorProfile(termenv.ANSI256)
	default:
		r.SetColorProfile(termenv.ANSI)
	}
	r.SetHasDarkBackground(termbg.Dark(getenv))
	return tui.Options{
		ASCII:      s.cfg.ASCII || !cli.UTF8Locale(getenv),
		Color:      color,
		PolarFirst: s.cfg.PolarFirst,
		Digits:     s.cfg.Digits,
		Comma:      s.cfg.Comma,
		Dir:        filepath.Join(s.cfg.Dir, "keys", kd),
		Out:        out,
		Getenv:     getenv,
		Renderer:   r,
		Limits:     s.cfg.Limits,
	}
}

// run runs the app on the connection until the user quits, the client
// goes or a limit ends it, and returns the exit status for the client.
func (s *Server) run(sess ssh.Session, opt tui.Options, in *input, winch <-chan ssh.Window, e *ending) int {
	out := opt.Out
	m := tui.New(opt)
	defer m.Close()
	p := tea.NewProgram(m, tea.WithInput(in), tea.WithOutput(out), tea.WithAltScreen(),
		tea.WithoutSignalHandler(), tea.WithContext(sess.Context()))

	finished := make(chan struct{})
	go func() {
		// p.Send blocks until the program runs, so window sizes are
		// passed on from here; the first is the size asked for with the
		// terminal
		for w := range winch {
			p.Send(tea.WindowSizeMsg{Width: w.Width, Height: w.Height})
		}
	}()
	go func() {
		select {
		case <-e.done:
			p.Quit()
		case <-finished:
		}
	}()
	go s.watchIdle(in, e, finished)

	_, err := p.Run()
	close(finished)
	if err != nil {
		e.end("closed", "") // the client went away
	}
	e.end("quit", "") // settles the reason: no later change
	if e.line != "" {
		fmt.Fprintf(out, "\r\nargand: %s\r\n", e.line)
		return 1
	}
	return 0
}

// watchIdle ends the session after cfg.Idle without input.
func (s *Server) watchIdle(in *input, e *ending, finished <-chan struct{}) {
	t := time.NewTimer(s.cfg.Idle)
	defer t.Stop()
	for {
		select {
		case <-finished:
			return
		case <-e.done:
			return
		case <-t.C:
			since := time.Since(time.Unix(0, in.seen.Load()))
			if since >= s.cfg.Idle {
				e.end("idle", fmt.Sprintf("no input for %s; the session is closed and your work is saved", s.cfg.Idle))
				return
			}
			t.Reset(s.cfg.Idle - since)
		}
	}
}

// refuse sends one line and ends the session.
func refuse(sess ssh.Session, msg string) {
	fmt.Fprintf(sess, "argand: %s\r\n", msg)
	sess.Exit(1)
}

// printableTerm shows a terminal name from the client for a message:
// letters, digits and a few marks only, at most 32 of them.
func printableTerm(t string) string {
	if t == "" {
		return "not set"
	}
	var b strings.Builder
	for _, r := range t {
		if b.Len() >= 32 {
			break
		}
		if r < 0x80 && (r == '-' || r == '.' || r == '_' || r >= '0' && r <= '9' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z') {
			b.WriteRune(r)
		} else {
			b.WriteByte('?')
		}
	}
	return b.String()
}

// envOf returns the client's environment, as the session's requests set
// it, for the app to read in place of the server's: TERM from the
// terminal request, then LANG, NO_COLOR and the rest as the client sent
// them.
func envOf(environ []string, term string) func(string) string {
	env := map[string]string{}
	for _, kv := range environ {
		k, v, ok := strings.Cut(kv, "=")
		if ok {
			env[k] = v
		}
	}
	if term != "" {
		env["TERM"] = term
	}
	return func(k string) string { return env[k] }
}

// lockedWriter lets the screen and the clipboard requests share the
// session, one whole write at a time.
type lockedWriter struct {
	mu sync.Mutex
	w  io.Writer
}

func (l *lockedWriter) Write(p []byte) (int, error) {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.w.Write(p)
}

// input reads the client's keys, noting when the last came, and ends the
// session when they come faster than the rate allows or a line grows past
// the bound.
//
// The rate is a token bucket: tokens are bytes, refilled at rate a second
// up to maxLine and a second's worth, so a paste of the longest line
// passes at once and a steady flood is stopped.
type input struct {
	r       io.Reader
	rate    float64
	maxLine int
	tokens  float64
	last    time.Time // of the last refill
	line    int       // bytes since the last line end or escape
	seen    atomic.Int64
	e       *ending
}

func (in *input) burst() float64 { return float64(in.maxLine) + in.rate }

func (in *input) Read(p []byte) (int, error) {
	n, err := in.r.Read(p)
	if n > 0 {
		now := time.Now()
		in.seen.Store(now.UnixNano())
		in.tokens = min(in.burst(), in.tokens+now.Sub(in.last).Seconds()*in.rate)
		in.last = now
		in.tokens -= float64(n)
		if in.tokens < 0 {
			in.e.end("limit-rate", fmt.Sprintf("input came faster than %d bytes a second; the connection is closed and your work up to the last change is saved", int(in.rate)))
			return 0, io.EOF
		}
		for _, c := range p[:n] {
			if c == '\r' || c == '\n' || c == 0x1b {
				in.line = 0
				continue
			}
			if in.line++; in.line > in.maxLine {
				in.e.end("limit-line", fmt.Sprintf("more than %d bytes of input in one line; the connection is closed and your work up to the last change is saved", in.maxLine))
				return 0, io.EOF
			}
		}
	}
	if err != nil {
		in.e.end("closed", "")
	}
	return n, err
}
