package profile

// TrendSpec says where a trend log is and how its columns map to plant
// quantities.
type TrendSpec struct {
	Path        string // CSV file, relative to the plant file's folder
	TimeColumn  string // header of the timestamp column
	FlowColumn  string // header of the plant flow column
	DPColumn    string // optional: differential pressure column
	PowerColumn string // optional: measured total pump power column, kW
	FlowUnit    string // "gpm", "m3/h" or "L/s"
	DPUnit      string // "psi", "kPa", "ft" or "m"
	TimeFormat  string // Go time layout; empty tries the common ones
}
