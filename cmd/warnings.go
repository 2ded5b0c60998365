package cmd

import "wattstage/profile"

// warningJSON is a warning in --json output: where it points (file:line or
// file:line:col: path) and what it says.
type warningJSON struct {
	Source  string `json:"source"`
	Message string `json:"message"`
}

// trendWarningsJSON lists a trend reader's warnings for --json output; nil
// (JSON null) when there are none.
func trendWarningsJSON(ws []profile.Warning) []warningJSON {
	var out []warningJSON
	for _, w := range ws {
		out = append(out, warningJSON{Source: w.Origin(), Message: w.Message})
	}
	return out
}
