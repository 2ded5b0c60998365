// Package version says which build of wattstage is running: the module
// version, the commit and the commit date, read from the build information
// the Go toolchain embeds in every binary (runtime/debug.ReadBuildInfo).
//
// # Where the values come from
//
// `go install wattstage/cmd/wattstage@v1.2.0` records the module version
// v1.2.0. A build inside a git clone (`go install ./cmd/wattstage`,
// `go build`) records the commit (vcs.revision), its time (vcs.time) and
// whether the work tree had uncommitted changes (vcs.modified), and, from
// Go 1.24 on, a pseudo-version made from them. With -buildvcs=false (or
// `go run`, or a test binary) none of that is recorded: the version is
// "(devel)" and the commit is unknown, and String says so rather than
// inventing one.
//
// Every report that says which version made it (the plan JSON, the
// workbook's footer and Inputs sheet) calls [String] or [Get], so that
// they all agree with `wattstage --version`.
package version
