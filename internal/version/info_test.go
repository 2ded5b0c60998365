package version

import (
	"runtime/debug"
	"strings"
	"testing"
)

func TestFromBuildInfo(t *testing.T) {
	// Settings as `go version -m` prints them for a build in a git clone
	// (keys documented in runtime/debug.BuildSetting).
	const rev = "3953a60c0ffee0123456789abcdef0123456789a"
	cases := []struct {
		name      string
		bi        debug.BuildInfo
		wantShort string
		wantLine  []string // substrings of String()
	}{
		{"release", debug.BuildInfo{GoVersion: "go1.26.8", Main: debug.Module{Path: "wattstage", Version: "v1.2.0"},
			Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}, {Key: "vcs.time", Value: "2026-12-04T15:26:00Z"}, {Key: "vcs.modified", Value: "false"}}},
			"v1.2.0", []string{"wattstage v1.2.0", "commit 3953a60c0ffe", "2026-12-04T15:26:00Z", "go1.26.8"}},
		{"dirty pseudo-version", debug.BuildInfo{Main: debug.Module{Path: "wattstage", Version: "v0.0.0-20261204152600-3953a60c0ffe+dirty"},
			Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}, {Key: "vcs.time", Value: "2026-12-04T15:26:00Z"}, {Key: "vcs.modified", Value: "true"}}},
			"v0.0.0-20261204152600-3953a60c0ffe+dirty", []string{"with uncommitted changes"}},
		{"devel with commit", debug.BuildInfo{Main: debug.Module{Path: "wattstage", Version: "(devel)"},
			Settings: []debug.BuildSetting{{Key: "vcs.revision", Value: rev}, {Key: "vcs.modified", Value: "true"}}},
			"(devel) 3953a60c0ffe+modified", []string{"commit 3953a60c0ffe with uncommitted changes", "unknown)"}},
		{"nothing recorded", debug.BuildInfo{Main: debug.Module{Path: "wattstage", Version: "(devel)"}},
			"(devel)", []string{"(devel) (commit unknown, unknown)", "built without version control information"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			in := FromBuildInfo(&c.bi)
			if got := in.Short(); got != c.wantShort {
				t.Errorf("Short() = %q, want %q", got, c.wantShort)
			}
			line := in.String()
			for _, w := range c.wantLine {
				if !strings.Contains(line, w) {
					t.Errorf("String() = %q, want it to contain %q", line, w)
				}
			}
		})
	}
}

func TestZeroInfo(t *testing.T) {
	var in Info
	if in.Short() == "" || !strings.Contains(in.String(), "unknown") {
		t.Errorf("zero Info: Short %q, String %q; want a non-empty version and unknown commit", in.Short(), in.String())
	}
}
