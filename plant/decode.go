package plant

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"wattstage/curves"
)

// maxNodes bounds the number of YAML nodes one file may expand to, aliases
// included, so that an alias bomb is an error rather than a hang.
const maxNodes = 200_000

// decoder walks the YAML node tree of one plant file, collecting every
// problem it meets instead of stopping at the first.
type decoder struct {
	file       string
	dir        string
	errs       ErrorList
	units      curves.UnitSystem
	unitsKnown bool    // false when the units key is missing or wrong
	density    float64 // kg/m³ of the pumped fluid, for heads given as pressure
	defaults   []string
	warnings   []Warning
	visited    int
	overflow   bool
}

// errorf records a problem at node n (its line and column).
func (d *decoder) errorf(n *yaml.Node, path, format string, args ...any) {
	e := &Error{File: d.file, Path: path, Msg: fmt.Sprintf(format, args...)}
	if n != nil {
		e.Line, e.Column = n.Line, n.Column
	}
	d.errs = append(d.errs, e)
}

// defaultf records a value the loader filled in.
func (d *decoder) defaultf(path, format string, args ...any) {
	d.defaults = append(d.defaults, path+": "+fmt.Sprintf(format, args...))
}

// warnf records something usable but questionable at node n (its line and
// column), as errorf does for problems.
func (d *decoder) warnf(n *yaml.Node, path, format string, args ...any) {
	w := Warning{File: d.file, Path: path, Message: fmt.Sprintf(format, args...)}
	if n != nil {
		w.Line, w.Column = n.Line, n.Column
	}
	d.warnings = append(d.warnings, w)
}

// resolve follows aliases and counts the nodes visited.
func (d *decoder) resolve(n *yaml.Node) *yaml.Node {
	for i := 0; n != nil && n.Kind == yaml.AliasNode && i < 100; i++ {
		n = n.Alias
	}
	if n != nil && n.Kind == yaml.AliasNode {
		return nil
	}
	d.visited++
	if d.visited > maxNodes && !d.overflow {
		d.overflow = true
		d.errorf(n, "", "the file expands to more than %d values (anchors and aliases?)", maxNodes)
	}
	return n
}

// join builds a field path.
func join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

func index(path string, i int) string { return fmt.Sprintf("%s[%d]", path, i) }

// kindName names a node's kind for "must be a number, not a list".
func kindName(n *yaml.Node) string {
	switch n.Kind {
	case yaml.MappingNode:
		return "a mapping"
	case yaml.SequenceNode:
		return "a list"
	case yaml.ScalarNode:
		switch n.Tag {
		case "!!null":
			return "empty"
		case "!!bool":
			return "true/false"
		case "!!int", "!!float":
			return "a number (" + n.Value + ")"
		}
		return fmt.Sprintf("the text %q", clip(n.Value))
	}
	return "something else"
}

// clip shortens long values quoted in messages.
func clip(s string) string {
	r := []rune(s)
	if len(r) > 40 {
		return string(r[:37]) + "..."
	}
	return s
}

// fields is a decoded mapping: its keys, checked against the allowed set.
type fields struct {
	node      *yaml.Node
	path      string
	vals      map[string]*yaml.Node
	suggested map[string]bool // allowed keys offered for a misspelt key
}

// has reports whether the key was given (with any value).
func (f *fields) has(key string) bool { _, ok := f.vals[key]; return ok }

// mapping checks that n is a mapping with only the allowed keys, each at
// most once. It returns nil (after recording the problem) when n is not a
// mapping.
func (d *decoder) mapping(n *yaml.Node, path, what string, allowed ...string) *fields {
	n = d.resolve(n)
	if n == nil {
		return nil
	}
	if n.Kind != yaml.MappingNode {
		d.errorf(n, path, "must be a mapping of keys (%s), not %s", what, kindName(n))
		return nil
	}
	f := &fields{node: n, path: path, vals: map[string]*yaml.Node{}, suggested: map[string]bool{}}
	keyLine := map[string]int{}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := d.resolve(n.Content[i]), n.Content[i+1]
		if k == nil {
			continue
		}
		if k.Kind != yaml.ScalarNode {
			d.errorf(k, path, "a key must be a plain word, not %s", kindName(k))
			continue
		}
		key := k.Value
		if key == "<<" {
			d.errorf(k, join(path, key), "merge keys (<<) are not supported; write the keys out")
			continue
		}
		if !contains(allowed, key) {
			d.errorf(k, join(path, key), "%s", unknownKey(key, allowed))
			if s := nearest(key, allowed); s != "" {
				f.suggested[s] = true
			}
			continue
		}
		if line, dup := keyLine[key]; dup {
			d.errorf(k, join(path, key), "given twice (first at line %d)", line)
			continue
		}
		keyLine[key] = k.Line
		f.vals[key] = v
	}
	return f
}

func contains(list []string, s string) bool {
	for _, v := range list {
		if v == s {
			return true
		}
	}
	return false
}

// unknownKey words the error for a key not in the allowed set, suggesting
// the nearest allowed key.
func unknownKey(key string, allowed []string) string {
	if s := nearest(key, allowed); s != "" {
		return fmt.Sprintf("unknown key %q (did you mean %q?)", clip(key), s)
	}
	return fmt.Sprintf("unknown key %q (expected one of: %s)", clip(key), strings.Join(allowed, ", "))
}

// value returns the node of an optional key, or nil when absent. A key
// given with no value is an error.
func (d *decoder) value(f *fields, key string) *yaml.Node {
	if f == nil {
		return nil
	}
	v, ok := f.vals[key]
	if !ok {
		return nil
	}
	v = d.resolve(v)
	if v == nil {
		return nil
	}
	if v.Kind == yaml.ScalarNode && v.Tag == "!!null" {
		d.errorf(v, join(f.path, key), "has no value (remove the key to use the default)")
		return nil
	}
	return v
}

// required returns the node of a required key, recording a problem at the
// mapping when it is missing.
func (d *decoder) required(f *fields, key, what string) *yaml.Node {
	if f == nil {
		return nil
	}
	v, ok := f.vals[key]
	if !ok {
		// A misspelling of this key was already reported with the
		// suggestion; saying it is missing as well would be noise.
		if !f.suggested[key] {
			d.errorf(f.node, join(f.path, key), "missing: %s is required", what)
		}
		return nil
	}
	v = d.resolve(v)
	if v != nil && v.Kind == yaml.ScalarNode && v.Tag == "!!null" {
		d.errorf(v, join(f.path, key), "has no value: %s is required", what)
		return nil
	}
	return v
}

// sequence checks that n is a list and returns its items.
func (d *decoder) sequence(n *yaml.Node, path, what string) ([]*yaml.Node, bool) {
	if n == nil {
		return nil, false
	}
	if n.Kind != yaml.SequenceNode {
		d.errorf(n, path, "must be a list (%s), not %s", what, kindName(n))
		return nil, false
	}
	return n.Content, true
}

// text reads a string scalar.
func (d *decoder) text(n *yaml.Node, path string) (string, bool) {
	if n == nil {
		return "", false
	}
	if n.Kind != yaml.ScalarNode || n.Tag == "!!null" {
		d.errorf(n, path, "must be text, not %s", kindName(n))
		return "", false
	}
	s := strings.TrimSpace(n.Value)
	if s == "" {
		d.errorf(n, path, "must not be empty")
		return "", false
	}
	return s, true
}

// Lengths of the names a plant file gives, in characters: longer ones do
// not fit the columns and title rows of the text tables and the workbook
// (a spreadsheet row is at most 409 points high).
const (
	MaxNameLen        = 200  // the plant's name
	MaxModelNameLen   = 60   // a pump model's or a tariff period's name
	MaxCurrencyLen    = 8    // the currency: an ISO 4217 code (USD) or a symbol
	MaxDescriptionLen = 2000 // the plant's description
)

// label reads a one-line name of at most max characters: no line break
// (LF, CR, NEL, U+2028, U+2029) that would split a table row. Other control
// characters are accepted and escaped wherever text is printed.
func (d *decoder) label(n *yaml.Node, path string, max int) (string, bool) {
	s, ok := d.text(n, path)
	if !ok {
		return "", false
	}
	if i := strings.IndexAny(s, "\n\r\u0085\u2028\u2029"); i >= 0 {
		d.errorf(n, path, "must be one line; it has a line break after %q", clip(s[:i]))
		return "", false
	}
	if r := []rune(s); len(r) > max {
		d.errorf(n, path, "is %d characters long; at most %d fit the reports", len(r), max)
		return "", false
	}
	return s, true
}

// boolean reads true or false.
func (d *decoder) boolean(n *yaml.Node, path string) (bool, bool) {
	if n == nil {
		return false, false
	}
	if n.Kind != yaml.ScalarNode || n.Tag != "!!bool" {
		d.errorf(n, path, "must be true or false, not %s", kindName(n))
		return false, false
	}
	var b bool
	if err := n.Decode(&b); err != nil {
		d.errorf(n, path, "must be true or false")
		return false, false
	}
	return b, true
}

// isNumber reports whether n is a numeric scalar.
func isNumber(n *yaml.Node) bool {
	return n.Kind == yaml.ScalarNode && (n.Tag == "!!int" || n.Tag == "!!float")
}

// number reads a plain finite number.
func (d *decoder) number(n *yaml.Node, path string) (float64, bool) {
	if n == nil {
		return 0, false
	}
	if !isNumber(n) {
		d.errorf(n, path, "must be a number, not %s", kindName(n))
		return 0, false
	}
	if n.Tag == "!!int" && nonDecimal.MatchString(n.Value) {
		var v int64
		_ = n.Decode(&v)
		d.errorf(n, path, "%s is not a decimal number: YAML reads a leading 0 (or 0o, 0x, 0b) as another base, here %d; write it without the leading zeros", n.Value, v)
		return 0, false
	}
	var v float64
	if err := n.Decode(&v); err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		d.errorf(n, path, "must be a finite number, not %q", clip(n.Value))
		return 0, false
	}
	return v, true
}

// nonDecimal matches the integers YAML reads in a base other than ten:
// zero-padded ("0600", octal in YAML 1.1) and 0o, 0x or 0b prefixed.
var nonDecimal = regexp.MustCompile(`^[-+]?0(?:[0-9_]+|[oOxXbB].*)$`)

// integer reads a whole number.
func (d *decoder) integer(n *yaml.Node, path string) (int, bool) {
	v, ok := d.number(n, path)
	if !ok {
		return 0, false
	}
	if v != math.Trunc(v) || math.Abs(v) > 1e9 {
		d.errorf(n, path, "must be a whole number, not %s", n.Value)
		return 0, false
	}
	return int(v), true
}

// numberUnit matches a number followed by an optional unit: "15 psi",
// "30%", "25 L/s".
var numberUnit = regexp.MustCompile(`^([-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]+)?)\s*(\S.*?)?\s*$`)

// sepNumber matches a number written with a decimal comma or with
// thousands separators ("600,5", "1,200", "1.200,5"), with or without a
// unit after it.
var sepNumber = regexp.MustCompile(`^\s*[-+]?[0-9]+(?:[.,][0-9]+)*,[0-9]+(?:[.,][0-9]+)*(?:\s*\S.*)?$`)

// quantity reads a number with an optional unit suffix. units lists the
// accepted suffixes (compared without case); the returned unit is the
// matching entry of units, or "" for a bare number. hint words what the
// value is for the type error.
func (d *decoder) quantity(n *yaml.Node, path, hint string, units ...string) (float64, string, bool) {
	if n == nil {
		return 0, "", false
	}
	if isNumber(n) {
		v, ok := d.number(n, path)
		return v, "", ok
	}
	if n.Kind == yaml.ScalarNode && n.Tag == "!!str" {
		if m := numberUnit.FindStringSubmatch(n.Value); m != nil {
			v, err := strconv.ParseFloat(m[1], 64)
			if err != nil || math.IsInf(v, 0) {
				d.errorf(n, path, "must be a finite number, not %q", clip(n.Value))
				return 0, "", false
			}
			if m[2] == "" {
				return v, "", true
			}
			for _, u := range units {
				if strings.EqualFold(normUnit(m[2]), normUnit(u)) {
					return v, u, true
				}
			}
			if sepNumber.MatchString(n.Value) {
				d.errorf(n, path, "%q has a comma in the number: write a decimal point and no thousands separators (e.g. 1200.5)", clip(n.Value))
				return 0, "", false
			}
			if len(units) == 0 {
				d.errorf(n, path, "must be a plain number (%s), not %q", hint, clip(n.Value))
			} else {
				d.errorf(n, path, "unit %q is not accepted here: %s, as a number or with %s", clip(m[2]), hint, orList(units))
			}
			return 0, "", false
		}
	}
	d.errorf(n, path, "must be a number (%s), not %s", hint, kindName(n))
	return 0, "", false
}

// normUnit folds the spellings of a unit: "m³/h" and "m3/h", "°F" and "F".
func normUnit(u string) string {
	u = strings.ReplaceAll(u, "³", "3")
	u = strings.ReplaceAll(u, "°", "")
	u = strings.ReplaceAll(u, " ", "")
	return u
}

func orList(units []string) string {
	q := make([]string, len(units))
	for i, u := range units {
		q[i] = fmt.Sprintf("%q", u)
	}
	if len(q) == 1 {
		return q[0]
	}
	return strings.Join(q[:len(q)-1], ", ") + " or " + q[len(q)-1]
}

// Upper bounds of the physical quantities a plant file gives, far above
// any pump group's (the largest pumps move tens of m³/s; multistage
// boiler-feed pumps reach a few thousand metres), so that no computation
// with accepted values can overflow. Unit mistakes are caught well below
// them by the plausibility checks (a pump ten times its motor, a design
// flow ten times the units' capacity).
const (
	MaxFlow        curves.Flow  = 1000 // m³/s: any flow
	MaxHead        curves.Head  = 1e4  // m: any head or pressure as head
	MaxPower       curves.Power = 1e9  // W: a motor's rating or a shaft power
	maxPercentFlow              = 1e4  // % of a base flow
)

// flowValue is a flow as written: an absolute flow, or a percentage of a
// base flow (BEP or design) resolved later.
type flowValue struct {
	Q     curves.Flow // m³/s, when !IsPct
	Pct   float64     // percent, when IsPct
	IsPct bool
	node  *yaml.Node
}

// of resolves the value against a base flow.
func (f flowValue) of(base curves.Flow) curves.Flow {
	if f.IsPct {
		return curves.Flow(f.Pct / 100 * float64(base))
	}
	return f.Q
}

// flowUnits are the flow suffixes accepted in each unit system.
func (d *decoder) flowUnits() []string {
	switch {
	case !d.unitsKnown:
		return []string{d.units.FlowUnit(), "gpm", "L/s"}
	case d.units == curves.US:
		return []string{"gpm"}
	}
	return []string{"m³/h", "L/s"}
}

// flow reads a flow in the file's unit (gpm or m³/h; L/s by suffix in SI).
// With pctOf non-empty a "%" suffix gives a percentage of that base. Flows
// must not be negative.
func (d *decoder) flow(n *yaml.Node, path, pctOf string) (flowValue, bool) {
	units := d.flowUnits()
	hint := "a flow in " + units[0]
	if pctOf != "" {
		units = append(units, "%")
		hint += " or a percentage of " + pctOf
	}
	v, u, ok := d.quantity(n, path, hint, units...)
	if !ok {
		return flowValue{}, false
	}
	if v < 0 {
		d.errorf(n, path, "%s: a flow must not be negative", n.Value)
		return flowValue{}, false
	}
	fv := flowValue{node: n}
	switch u {
	case "%":
		fv.IsPct, fv.Pct = true, v
		if v > maxPercentFlow {
			d.errorf(n, path, "%s %% is above %s %%, the largest percentage of a flow accepted", fmtNum(v), fmtNum(maxPercentFlow))
			return flowValue{}, false
		}
	case "L/s":
		fv.Q = curves.Flow(v * curves.LPerS)
	default:
		fv.Q = d.units.FlowIn(v)
	}
	if fv.Q > MaxFlow {
		d.errorf(n, path, "%s is above %s, the largest flow accepted (check the unit)", n.Value, d.fmtFlow(MaxFlow))
		return flowValue{}, false
	}
	return fv, true
}

// head reads a head in ft (US) or m (SI); a pressure suffix (psi in US, kPa
// in SI) is converted with the fluid's density: h = p / (ρ g).
func (d *decoder) head(n *yaml.Node, path string) (curves.Head, bool) {
	return d.headOf(n, path, false)
}

// signedHead reads a head as head does, accepting a negative value (a
// suction lift).
func (d *decoder) signedHead(n *yaml.Node, path string) (curves.Head, bool) {
	return d.headOf(n, path, true)
}

func (d *decoder) headOf(n *yaml.Node, path string, signed bool) (curves.Head, bool) {
	units := []string{"m", "kPa"}
	hint := "a head in m, or a pressure in kPa"
	switch {
	case !d.unitsKnown:
		// Without a unit system, accept either system's units so that the
		// missing units key is the one problem reported.
		units = []string{"m", "kPa", "ft", "psi"}
	case d.units == curves.US:
		units = []string{"ft", "psi"}
		hint = "a head in ft, or a pressure in psi"
	}
	v, u, ok := d.quantity(n, path, hint, units...)
	if !ok {
		return 0, false
	}
	if v < 0 && !signed {
		d.errorf(n, path, "%s: a head must not be negative", n.Value)
		return 0, false
	}
	var h curves.Head
	switch u {
	case "psi":
		h = curves.PressureToHead(v*curves.PSI, d.density)
	case "kPa":
		h = curves.PressureToHead(v*curves.KPa, d.density)
	case "ft":
		h = curves.Head(v * curves.Foot)
	default:
		h = d.units.HeadIn(v)
	}
	if h > MaxHead || -h > MaxHead {
		d.errorf(n, path, "%s is above %s, the largest head accepted (check the unit)", n.Value, d.fmtHead(MaxHead))
		return 0, false
	}
	return h, true
}

// power reads a power in hp (US) or kW (SI); must be positive.
func (d *decoder) power(n *yaml.Node, path string) (curves.Power, bool) {
	u := d.units.PowerUnit()
	units := []string{u}
	if !d.unitsKnown {
		units = []string{"kW", "hp"}
	}
	v, _, ok := d.quantity(n, path, "a power in "+u, units...)
	if !ok {
		return 0, false
	}
	if v <= 0 {
		d.errorf(n, path, "%s: a power must be greater than zero", n.Value)
		return 0, false
	}
	if pw := d.units.RatingIn(v); pw > MaxPower {
		d.errorf(n, path, "%s is above %s, the largest power accepted (check the unit)", n.Value, d.fmtPower(MaxPower))
		return 0, false
	}
	return d.units.RatingIn(v), true
}

// temperature reads °F (US) or °C (SI) and returns °C.
func (d *decoder) temperature(n *yaml.Node, path string) (float64, bool) {
	u := d.units.TempUnit()
	units := []string{u}
	if !d.unitsKnown {
		units = []string{"°C", "°F"}
	}
	v, _, ok := d.quantity(n, path, "a temperature in "+u, units...)
	if !ok {
		return 0, false
	}
	return d.units.TempIn(v), true
}

// ratio reads a fraction (0.95) or a percentage with a % suffix (95%) and
// returns the fraction. A bare number above bareMax is taken for a
// percentage written without its sign and refused with a hint.
func (d *decoder) ratio(n *yaml.Node, path, what string, bareMax float64) (float64, bool) {
	v, u, ok := d.quantity(n, path, what+" as a fraction (0.95) or a percentage (95%)", "%")
	if !ok {
		return 0, false
	}
	if u == "%" {
		return v / 100, true
	}
	if math.Abs(v) > bareMax {
		d.errorf(n, path, "%s reads as a fraction (%s %%); write %s%% for a percentage", n.Value, fmtNum(100*v), n.Value)
		return 0, false
	}
	return v, true
}

// percent reads a value written in percent (93.6 or 93.6%) and returns the
// fraction.
func (d *decoder) percent(n *yaml.Node, path, what string) (float64, bool) {
	v, _, ok := d.quantity(n, path, what+" in percent", "%")
	if !ok {
		return 0, false
	}
	return v / 100, true
}

// efficiency reads an efficiency in percent, above 0 and at most 100 %.
// Values at or below 1 % are refused as fractions written where a
// percentage belongs (0.85 for 85 %).
func (d *decoder) efficiency(n *yaml.Node, path string) (float64, bool) {
	e, ok := d.percent(n, path, "an efficiency")
	if !ok {
		return 0, false
	}
	switch {
	case e > 1:
		d.errorf(n, path, "efficiency %s %% is above 100 %%", fmtNum(100*e))
		return 0, false
	case e == 1:
		d.errorf(n, path, "efficiency 100 %% means no losses at all, which no pump, motor or drive reaches (and the loss models divide by the losses): give the datasheet value, below 100 %%")
		return 0, false
	case e <= 0:
		d.errorf(n, path, "efficiency %s %% must be above 0 %%", fmtNum(100*e))
		return 0, false
	case e <= 0.01:
		d.errorf(n, path, "efficiency %s %% is implausibly low: efficiencies are written in percent (write %s for %s %%)",
			fmtNum(100*e), fmtNum(10000*e), fmtNum(10000*e))
		return 0, false
	}
	return e, true
}

// minutes reads a time in minutes (bare or "min"), or in seconds or hours
// with "s" or "h".
func (d *decoder) minutes(n *yaml.Node, path string) (float64, bool) {
	v, u, ok := d.quantity(n, path, "a time in minutes", "min", "s", "h")
	if !ok {
		return 0, false
	}
	if v < 0 {
		d.errorf(n, path, "%s: a time must not be negative", n.Value)
		return 0, false
	}
	switch u {
	case "s":
		v /= 60
	case "h":
		v *= 60
	}
	return v, true
}

// fmtNum writes a number for a message with about four significant digits.
func fmtNum(v float64) string {
	a := math.Abs(v)
	var dec int
	switch {
	case a == 0 || a >= 1000:
		dec = 0
	case a >= 100:
		dec = 1
	case a >= 10:
		dec = 2
	case a >= 1:
		dec = 3
	default:
		dec = 3 - int(math.Floor(math.Log10(a)))
		if dec > 12 {
			dec = 12
		}
	}
	s := strconv.FormatFloat(v, 'f', dec, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	if s == "-0" {
		s = "0"
	}
	return s
}

// fmtFlow, fmtHead and fmtPower write a quantity in the file's units.
func (d *decoder) fmtFlow(q curves.Flow) string {
	return fmtNum(d.units.FlowOut(q)) + " " + d.units.FlowUnit()
}

func (d *decoder) fmtHead(h curves.Head) string {
	return fmtNum(d.units.HeadOut(h)) + " " + d.units.HeadUnit()
}

func (d *decoder) fmtPower(p curves.Power) string {
	return fmtNum(d.units.RatingOut(p)) + " " + d.units.PowerUnit()
}
