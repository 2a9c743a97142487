// Package serve runs argand for several people over SSH: each connection
// gets its own app on the client's terminal, and each public key its own
// session state, kept as the local app keeps it (package store).
//
// The server runs argand and nothing else. Only public-key authentication
// is offered, against an authorized-keys file; shell requests start the
// app, and exec, subsystem (file transfer), port-forwarding, agent and X11
// requests are refused. Connection-level limits (sessions in all, sessions
// per key, idle time, input rate and line size) end the connection that
// hits them with one line of text; the session state stays on disk.
package serve

import (
	"context"
	"errors"
	"fmt"
	"io"
	"log"
	"net"
	"sync"
	"sync/atomic"
	"time"

	"argand/reduce/sheet"

	"github.com/gliderlabs/ssh"
	gossh "golang.org/x/crypto/ssh"
)

// DefaultListen is the address served unless another is asked for: the
// loopback interface only, so that nothing is exposed by accident.
const DefaultListen = "127.0.0.1:2222"

// Defaults of the limits.
const (
	DefaultMaxSessions = 32
	DefaultMaxPerKey   = 4
	DefaultIdle        = 30 * time.Minute
	// DefaultRate is the sustained input allowed, bytes a second; a burst
	// of a whole line (DefaultMaxLine) and a second's worth is taken at
	// once, so that a paste of the longest statement arrives whole.
	DefaultRate = 16 << 10
	// DefaultMaxLine bounds the input between two line ends or escape
	// sequences (a paste counts as one line). It is four times the
	// longest statement (calc.MaxLine), so an over-long paste still gets
	// the app's own message and only a flood ends the connection.
	DefaultMaxLine = 256 << 10
)

// DefaultLimits bound each worksheet on the server: what drives memory
// (its size, its names, a sweep's points, a network's elements, the
// earlier states kept for undo) and the largest budget of estimated work
// a statement may be given (package sheet refuses work estimated beyond
// the budget before it starts). An undo state is a whole worksheet, about
// 1 MB at 5000 names, so 50 of them bound a session near 50 MB.
func DefaultLimits() sheet.Limits {
	return sheet.Limits{Names: 5000, Bytes: 1 << 20, Points: 10000, Elements: 2000, Budget: 30, Undo: 50}
}

// DefaultHandshake bounds the time from connecting to opening a session:
// a client that neither authenticates nor asks for anything is dropped.
const DefaultHandshake = 30 * time.Second

// Config is the server's configuration; the zero value of a field is its
// default.
type Config struct {
	// Dir is the state directory: host key, authorized keys (by default),
	// and one directory of session state per key under keys/.
	Dir string
	// AuthorizedKeys is the file of public keys allowed in; "" is
	// authorized_keys in Dir. It is read at each login, so a key added
	// to it works at once.
	AuthorizedKeys string
	MaxSessions    int           // sessions at once, all keys together
	MaxPerKey      int           // sessions at once with one key
	Idle           time.Duration // no input for this long ends a session
	Rate           int           // sustained input, bytes a second
	MaxLine        int           // input between line ends, bytes
	Handshake      time.Duration // from connecting to a session started
	// Limits bound each worksheet; a zero field is its DefaultLimits.
	Limits sheet.Limits
	// The app's options that apply to every session (digits, polar form
	// first, ASCII only, the decimal comma for a new session); the look is
	// set per client.
	Digits     int
	PolarFirst bool
	ASCII      bool
	Comma      bool
	// Log receives one line per connection and disconnection: key
	// fingerprint, address, duration, why it ended. Never a value of the
	// user's work. nil discards.
	Log *log.Logger
}

func (c *Config) fill() {
	if c.MaxSessions <= 0 {
		c.MaxSessions = DefaultMaxSessions
	}
	if c.MaxPerKey <= 0 {
		c.MaxPerKey = DefaultMaxPerKey
	}
	if c.Idle <= 0 {
		c.Idle = DefaultIdle
	}
	if c.Rate <= 0 {
		c.Rate = DefaultRate
	}
	if c.MaxLine <= 0 {
		c.MaxLine = DefaultMaxLine
	}
	if c.Handshake <= 0 {
		c.Handshake = DefaultHandshake
	}
	d := DefaultLimits()
	if c.Limits.Names <= 0 {
		c.Limits.Names = d.Names
	}
	if c.Limits.Bytes <= 0 {
		c.Limits.Bytes = d.Bytes
	}
	if c.Limits.Points <= 0 {
		c.Limits.Points = d.Points
	}
	if c.Limits.Elements <= 0 {
		c.Limits.Elements = d.Elements
	}
	if c.Limits.Budget <= 0 {
		c.Limits.Budget = d.Budget
	}
	// whatever the limits, a server opens none of its own files for a
	// path a client types (readings, spectrum from FILE)
	c.Limits.NoFiles = true
	if c.Limits.Undo <= 0 {
		c.Limits.Undo = d.Undo
	}
	if c.Log == nil {
		c.Log = log.New(io.Discard, "", 0)
	}
}

// Server serves argand over SSH.
type Server struct {
	cfg     Config
	srv     *ssh.Server
	hostKey gossh.Signer
	keys    string // authorized keys file

	mu     sync.Mutex
	total  int            // sessions running
	perKey map[string]int // sessions running per key directory
	conns  int            // connections open, authenticated or not
	apps   sync.WaitGroup // apps running, for Shutdown
	ending bool           // Shutdown has begun: no new app starts
}

// New prepares a server: the state directory, the host key (made on the
// first start, then kept), the SSH configuration.
func New(cfg Config) (*Server, error) {
	cfg.fill()
	if cfg.Dir == "" {
		return nil, errors.New("serve: no state directory")
	}
	hk, err := HostKey(cfg.Dir)
	if err != nil {
		return nil, err
	}
	s := &Server{cfg: cfg, hostKey: hk, perKey: map[string]int{}}
	s.keys = cfg.AuthorizedKeys
	if s.keys == "" {
		s.keys = defaultKeysFile(cfg.Dir)
	}
	s.srv = &ssh.Server{
		Handler:          s.handle,
		PublicKeyHandler: s.allowed,
		// no password or keyboard-interactive handler: public keys only
		HostSigners: []ssh.Signer{hk},
		ChannelHandlers: map[string]ssh.ChannelHandler{
			// sessions only: no direct-tcpip (port forwarding) channels
			"session": nil, // set in New, below
		},
		// no RequestHandlers: tcpip-forward and every other global
		// request is refused; no SubsystemHandlers: sftp is refused
		ConnCallback: s.accept,
		// the server's banner names no software beyond the protocol
		ServerConfigCallback: func(ssh.Context) *gossh.ServerConfig {
			return &gossh.ServerConfig{ServerVersion: "SSH-2.0-argand"}
		},
	}
	s.srv.ChannelHandlers["session"] = s.sessionChannel
	return s, nil
}

// HostKey returns the public half of the host key.
func (s *Server) HostKey() gossh.PublicKey { return s.hostKey.PublicKey() }

// KeysFile returns the authorized-keys file the server reads.
func (s *Server) KeysFile() string { return s.keys }

// Serve accepts connections on ln until Close or Shutdown.
func (s *Server) Serve(ln net.Listener) error {
	err := s.srv.Serve(ln)
	if errors.Is(err, ssh.ErrServerClosed) {
		return nil
	}
	return err
}

// Close closes the listener and every connection at once; apps still
// running end as their input goes.
func (s *Server) Close() error { return s.srv.Close() }

// Shutdown stops accepting connections, asks every running app to quit
// (each saves as it goes, so nothing is lost) and waits for them, up to
// ctx.
func (s *Server) Shutdown(ctx context.Context) error {
	s.mu.Lock()
	s.ending = true
	s.mu.Unlock()
	err := s.srv.Close()
	done := make(chan struct{})
	go func() { s.apps.Wait(); close(done) }()
	select {
	case <-done:
	case <-ctx.Done():
		return ctx.Err()
	}
	if errors.Is(err, ssh.ErrServerClosed) {
		return nil
	}
	return err
}

// connKey is where the context of a connection keeps its countedConn, so
// that a session can mark it started.
type connKey struct{}

// accept counts a new connection and bounds its handshake. Beyond twice
// the session limit (and a few spare) connections are closed unanswered:
// unauthenticated clients must not hold the server.
func (s *Server) accept(ctx ssh.Context, c net.Conn) net.Conn {
	s.mu.Lock()
	if s.conns >= 2*s.cfg.MaxSessions+8 {
		s.mu.Unlock()
		s.cfg.Log.Printf("refused addr=%s reason=too-many-connections", c.RemoteAddr())
		return nil
	}
	s.conns++
	s.mu.Unlock()
	cc := &countedConn{Conn: c, s: s}
	// a timer, not a deadline: the library resets deadlines at each read
	cc.timer = time.AfterFunc(s.cfg.Handshake, func() {
		if !cc.started.Load() {
			s.cfg.Log.Printf("dropped addr=%s reason=no-session-in-%s", c.RemoteAddr(), s.cfg.Handshake)
			cc.Close()
		}
	})
	ctx.SetValue(connKey{}, cc)
	return cc
}

// countedConn gives its place back when closed, and is closed if no
// session starts on it within the handshake time.
type countedConn struct {
	net.Conn
	s       *Server
	once    sync.Once
	timer   *time.Timer
	started atomic.Bool
}

// start marks a session started: the connection is kept from now on.
func (c *countedConn) start() {
	c.started.Store(true)
	c.timer.Stop()
}

func (c *countedConn) Close() error {
	c.once.Do(func() {
		c.timer.Stop()
		c.s.mu.Lock()
		c.s.conns--
		c.s.mu.Unlock()
	})
	return c.Conn.Close()
}

// acquire takes a place for a session with key directory k, or says why
// there is none. A place taken is counted in s.apps until release.
func (s *Server) acquire(k string) string {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.ending {
		return "the server is stopping"
	}
	if s.total >= s.cfg.MaxSessions {
		return fmt.Sprintf("the server is full (%d sessions, its limit); try again later", s.cfg.MaxSessions)
	}
	if s.perKey[k] >= s.cfg.MaxPerKey {
		return fmt.Sprintf("this key already has %d sessions open, the most allowed; close one and try again", s.cfg.MaxPerKey)
	}
	s.total++
	s.perKey[k]++
	s.apps.Add(1)
	return ""
}

func (s *Server) release(k string) {
	defer s.apps.Done()
	s.mu.Lock()
	defer s.mu.Unlock()
	s.total--
	if s.perKey[k]--; s.perKey[k] <= 0 {
		delete(s.perKey, k)
	}
}

// Sessions reports the sessions running.
func (s *Server) Sessions() int {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.total
}
