package handover

import "runtime/debug"

// Version is the version of the program as the Go toolchain stamped it in
// the build (a module version such as "v1.2.0", or the VCS revision of a
// build from a checkout), or "devel" when it says nothing useful.
func Version() string {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return "devel"
	}
	if v := bi.Main.Version; v != "" && v != "(devel)" {
		return v
	}
	var rev, modified string
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.modified":
			modified = s.Value
		}
	}
	if len(rev) >= 12 {
		v := "devel " + rev[:12]
		if modified == "true" {
			v += "+"
		}
		return v
	}
	return "devel"
}
