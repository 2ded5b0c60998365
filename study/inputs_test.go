package study

import (
	"crypto/sha256"
	"encoding/hex"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

func TestInputsSHA256(t *testing.T) {
	dir := t.TempDir()
	a := filepath.Join(dir, "plant.yaml")
	b := filepath.Join(dir, "trend.csv")
	if err := os.WriteFile(a, []byte("abc"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(b, []byte("time,flow\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	got, err := InputsSHA256(a)
	if err != nil {
		t.Fatal(err)
	}
	// SHA-256("abc"), FIPS 180-2 Appendix B.1 example (verbatim); the outer
	// digest is the standard library's SHA-256 of that line.
	const abc = "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
	sum := sha256.Sum256([]byte(abc + "\n"))
	if want := hex.EncodeToString(sum[:]); got != want {
		t.Errorf("InputsSHA256(abc) = %s, want %s", got, want)
	}

	two, err := InputsSHA256(a, b)
	if err != nil {
		t.Fatal(err)
	}
	if two == got {
		t.Error("adding a file does not change the fingerprint")
	}
	moved := filepath.Join(dir, "renamed.yaml")
	if err := os.Rename(a, moved); err != nil {
		t.Fatal(err)
	}
	if again, _ := InputsSHA256(moved, b); again != two {
		t.Errorf("renaming the plant file changed the fingerprint: %s, was %s", again, two)
	}
	if _, err := InputsSHA256(a); err == nil {
		t.Error("a missing file gave a fingerprint")
	}

	// The recipe the doc comment and docs/plan-json.md give, run by the
	// coreutils sha256sum where it is installed.
	if _, err := exec.LookPath("sha256sum"); err != nil {
		t.Skip("sha256sum not installed: the shell recipe is not checked")
	}
	sh := exec.Command("sh", "-c", "sha256sum renamed.yaml trend.csv | cut -d' ' -f1 | sha256sum")
	sh.Dir = dir
	out, err := sh.Output()
	if err != nil {
		t.Fatal(err)
	}
	if f := strings.Fields(string(out)); len(f) == 0 || f[0] != two {
		t.Errorf("shell recipe gives %q, InputsSHA256 %s", out, two)
	}
}
