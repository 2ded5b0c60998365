package cmd_test

import (
	"os"
	"path/filepath"
	"reflect"
	"testing"

	"wattstage/cmd"
)

func TestInitFlags(t *testing.T) {
	var got *cmd.InitOptions
	c := cmd.NewCmdInit(&cmd.IO{}, func(o *cmd.InitOptions) error { got = o; return nil })
	if err := execute(t, c, "--units", "SI", "--system", "fixed", "-o", "p.yaml", "--force"); err != nil {
		t.Fatal(err)
	}
	got.IO = nil
	want := cmd.InitOptions{Units: "SI", System: "fixed", Output: "p.yaml", Force: true}
	if !reflect.DeepEqual(*got, want) {
		t.Errorf("options %+v, want %+v", *got, want)
	}
	for _, bad := range [][]string{{"--units", "metric"}, {"--system", "open"}, {"extra.yaml"}} {
		called := false
		c := cmd.NewCmdInit(&cmd.IO{}, func(*cmd.InitOptions) error { called = true; return nil })
		if err := execute(t, c, bad...); err == nil || called {
			t.Errorf("%v: error %v, run called %v; want an error before the run", bad, err, called)
		}
	}
}

// TestInitThenCheckAndPlan writes each starting file and runs check and
// plan on it, as a new user would; then checks that -o does not replace a
// file without --force.
func TestInitThenCheckAndPlan(t *testing.T) {
	dir := t.TempDir()
	for _, units := range []string{"US", "SI"} {
		for _, sys := range []string{"dp", "fixed"} {
			name := filepath.Join(dir, units+"-"+sys+".yaml")
			t.Run(units+"-"+sys, func(t *testing.T) {
				if r := run(t, "init", "--units", units, "--system", sys, "-o", name); r.code != 0 {
					t.Fatal(r.describe([]string{"init", "-o", name}))
				}
				for _, args := range [][]string{{"check", name}, {"plan", name}} {
					if r := run(t, args...); r.code != 0 || r.out == "" {
						t.Errorf("%s", r.describe(args))
					}
				}
			})
		}
	}
	name := filepath.Join(dir, "US-dp.yaml")
	if err := os.WriteFile(name, []byte("mine\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if r := run(t, "init", "-o", name); r.code != cmd.ExitBadInput {
		t.Errorf("init -o over an existing file: exit %d, want %d", r.code, cmd.ExitBadInput)
	}
	if b, _ := os.ReadFile(name); string(b) != "mine\n" {
		t.Errorf("init without --force changed the existing file to %q", b)
	}
	if r := run(t, "init", "-o", name, "--force"); r.code != 0 {
		t.Errorf("init -o --force: %s", r.describe(nil))
	}
	if r := run(t, "init", "-o", filepath.Join(dir, "plant.txt")); r.code != cmd.ExitBadInput {
		t.Errorf("init -o plant.txt: exit %d, want %d", r.code, cmd.ExitBadInput)
	}
	if r := run(t, "init"); r.code != 0 || r.out == "" {
		t.Errorf("init to standard output: %s", r.describe([]string{"init"}))
	}
}
