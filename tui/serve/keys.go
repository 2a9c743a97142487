package serve

import (
	"bufio"
	"bytes"
	"crypto/ed25519"
	"crypto/rand"
	"crypto/sha256"
	"encoding/hex"
	"encoding/pem"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"argand/tui/store"

	"github.com/gliderlabs/ssh"
	gossh "golang.org/x/crypto/ssh"
)

// hostKeyName is the host key's file in the state directory.
const hostKeyName = "ssh_host_ed25519_key"

// maxKeysFile bounds the authorized-keys file read at each login.
const maxKeysFile = 1 << 20

func defaultKeysFile(dir string) string { return filepath.Join(dir, "authorized_keys") }

// HostKey returns the server's ed25519 host key from dir, making it on the
// first start. The key is kept 0600 and never replaced: a client that has
// seen it once can tell this server from another. A key file that others
// may read, or that is not a key, is refused rather than replaced.
func HostKey(dir string) (gossh.Signer, error) {
	if _, err := store.PrepareDir(dir); err != nil {
		return nil, fmt.Errorf("state directory: %w", err)
	}
	path := filepath.Join(dir, hostKeyName)
	f, err := os.OpenFile(path, os.O_RDONLY|noFollow, 0)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return newHostKey(path)
	case err != nil:
		return nil, fmt.Errorf("host key: %w", err)
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return nil, fmt.Errorf("host key: %w", err)
	}
	if !fi.Mode().IsRegular() {
		return nil, fmt.Errorf("host key %s is not a regular file", path)
	}
	if fi.Mode().Perm()&0o077 != 0 {
		return nil, fmt.Errorf("host key %s can be read by others (mode %04o); make it 0600 or remove it to have a new one made", path, fi.Mode().Perm())
	}
	data, err := io.ReadAll(io.LimitReader(f, 64<<10))
	if err != nil {
		return nil, fmt.Errorf("host key: %w", err)
	}
	signer, err := gossh.ParsePrivateKey(data)
	if err != nil {
		return nil, fmt.Errorf("host key %s: %v", path, err)
	}
	if signer.PublicKey().Type() != gossh.KeyAlgoED25519 {
		return nil, fmt.Errorf("host key %s is %s, not ed25519", path, signer.PublicKey().Type())
	}
	return signer, nil
}

func newHostKey(path string) (gossh.Signer, error) {
	_, priv, err := ed25519.GenerateKey(rand.Reader)
	if err != nil {
		return nil, fmt.Errorf("host key: %w", err)
	}
	block, err := gossh.MarshalPrivateKey(priv, "argand host key")
	if err != nil {
		return nil, fmt.Errorf("host key: %w", err)
	}
	// store.Save writes 0600 and renames into place, so a crash never
	// leaves half a key
	if err := store.Save(path, pem.EncodeToMemory(block)); err != nil {
		return nil, fmt.Errorf("host key: %w", err)
	}
	return gossh.NewSignerFromKey(priv)
}

// allowed reports whether key is in the authorized-keys file. The file is
// read at each login; lines with options (from=, command=, ...) are not
// honoured by this server and so do not let a key in.
func (s *Server) allowed(ctx ssh.Context, key ssh.PublicKey) bool {
	ok, err := authorized(s.keys, key)
	if err != nil {
		s.cfg.Log.Printf("refused addr=%s reason=authorized-keys-unreadable", ctx.RemoteAddr())
		return false
	}
	if !ok {
		s.cfg.Log.Printf("refused fp=%s addr=%s reason=unknown-key", gossh.FingerprintSHA256(key), ctx.RemoteAddr())
	}
	return ok
}

// authorized looks key up in the authorized-keys file at path.
func authorized(path string, key gossh.PublicKey) (bool, error) {
	f, err := os.OpenFile(path, os.O_RDONLY|noFollow, 0)
	if err != nil {
		return false, err
	}
	defer f.Close()
	want := key.Marshal()
	sc := bufio.NewScanner(io.LimitReader(f, maxKeysFile))
	sc.Buffer(make([]byte, 0, 4096), 64<<10)
	for sc.Scan() {
		line := bytes.TrimSpace(sc.Bytes())
		if len(line) == 0 || line[0] == '#' {
			continue
		}
		k, _, opts, _, err := gossh.ParseAuthorizedKey(line)
		if err != nil || len(opts) > 0 {
			continue
		}
		if bytes.Equal(k.Marshal(), want) {
			return true, nil
		}
	}
	return false, sc.Err()
}

// keyDir names a key's directory of session state: the SHA-256 of the
// key in hex, which any file system can hold.
func keyDir(key gossh.PublicKey) string {
	sum := sha256.Sum256(key.Marshal())
	return hex.EncodeToString(sum[:])
}

// ParseKeys reads an authorized-keys text for the keys that would let a
// client in, for a test or a check of the file: the count of keys and the
// lines skipped (with options, or not a key), by line number.
func ParseKeys(data []byte) (keys int, skipped []int) {
	for i, line := range bytes.Split(data, []byte("\n")) {
		line = bytes.TrimSpace(line)
		if len(line) == 0 || line[0] == '#' {
			continue
		}
		_, _, opts, _, err := gossh.ParseAuthorizedKey(line)
		if err != nil || len(opts) > 0 {
			skipped = append(skipped, i+1)
			continue
		}
		keys++
	}
	return keys, skipped
}
