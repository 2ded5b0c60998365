package version

import (
	"fmt"
	"runtime/debug"
	"strings"
)

// Unknown stands for a value the build information does not hold.
const Unknown = "unknown"

// Info is what the build information says about this binary. The zero
// value is a build with no information at all.
type Info struct {
	Module   string // module path; "wattstage" when built from this repository
	Version  string // module version, e.g. "v1.2.0" or a pseudo-version; "(devel)" when none was recorded
	Commit   string // full git commit hash; "" when not recorded
	Date     string // commit time, RFC 3339 in UTC as git gives it; "" when not recorded
	Modified bool   // the work tree had uncommitted changes at build time
	Go       string // Go toolchain version, e.g. "go1.26.8"
}

// Get reads the running binary's build information.
func Get() Info {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return Info{}
	}
	return FromBuildInfo(bi)
}

// FromBuildInfo extracts Info from build information (exported so that it
// can be tested on build information of known content).
func FromBuildInfo(bi *debug.BuildInfo) Info {
	in := Info{Module: bi.Main.Path, Version: bi.Main.Version, Go: bi.GoVersion}
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			in.Commit = s.Value
		case "vcs.time":
			in.Date = s.Value
		case "vcs.modified":
			in.Modified = s.Value == "true"
		}
	}
	return in
}

// Short is the version alone, as written into reports: the module
// version, or "(devel)" with the first 12 characters of the commit when
// the module version is not recorded, "+modified" added for a dirty tree.
// Never empty.
func (in Info) Short() string {
	v := in.Version
	if v == "" {
		v = "(devel)"
	}
	if v == "(devel)" && in.Commit != "" {
		v += " " + shortHash(in.Commit)
	}
	if in.Modified && !strings.Contains(v, "+dirty") {
		v += "+modified"
	}
	return v
}

// String is the line `wattstage --version` prints: version, commit and
// commit date, each "unknown" where the build did not record it.
func (in Info) String() string {
	commit, date := Unknown, Unknown
	if in.Commit != "" {
		commit = shortHash(in.Commit)
		if in.Modified {
			commit += " with uncommitted changes"
		}
	}
	if in.Date != "" {
		date = in.Date
	}
	v := in.Version
	if v == "" {
		v = "(devel)"
	}
	s := fmt.Sprintf("wattstage %s (commit %s, %s)", v, commit, date)
	if in.Go != "" {
		s += " " + in.Go
	}
	if in.Commit == "" {
		s += "; built without version control information (-buildvcs=false, go run or a test binary)"
	}
	return s
}

// String is Get().String(): the line `wattstage --version` prints.
func String() string { return Get().String() }

// Short is Get().Short(): the version written into reports.
func Short() string { return Get().Short() }

func shortHash(h string) string {
	if len(h) > 12 {
		return h[:12]
	}
	return h
}
