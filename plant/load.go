package plant

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"unicode/utf16"
	"unicode/utf8"
	"wattstage/profile"

	"gopkg.in/yaml.v3"

	"wattstage/curves"
)

// MaxFileSize is the largest plant file Load and Parse accept, in bytes.
// A plant file with a few pumps and an hourly bin for every hour of a year
// stays well under 1 MiB.
const MaxFileSize = 4 << 20

// topKeys are the keys of a plant file, in the order they are documented.
var topKeys = []string{"name", "description", "units", "fluid", "pumps", "system", "profile", "tariff", "retrofit", "sequence", "suction"}

// Load reads and checks the plant file at path. Relative paths inside the
// file (the trend log) are resolved against the file's folder. Every
// problem is returned at once as an ErrorList; errors.Is(err, ErrInvalid)
// is true for all of them, including a file that cannot be read.
//
// Only a regular file (or a link to one) is read: a named pipe, a device or
// a folder is refused before it is opened, so that reading cannot wait
// forever; the read stops after MaxFileSize bytes.
func Load(path string) (*Plant, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, ErrorList{{File: path, Msg: "cannot read the plant file: " + describeFSError(err), Err: err}}
	}
	if !st.Mode().IsRegular() {
		return nil, ErrorList{{File: path, Msg: fmt.Sprintf("is %s, not a regular file: give the plant file itself (a pipe or a device could keep the read waiting forever)", profile.FileKind(st.Mode()))}}
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, ErrorList{{File: path, Msg: "cannot read the plant file: " + describeFSError(err), Err: err}}
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileSize+1))
	if err != nil {
		return nil, ErrorList{{File: path, Msg: "cannot read the plant file: " + describeFSError(err), Err: err}}
	}
	return Parse(path, data, filepath.Dir(path))
}

// describeFSError words an fs error without repeating the path.
func describeFSError(err error) string {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}

// Parse checks the plant file held in data. name is used in error messages
// and as Plant.Source; dir is the folder against which the trend path is
// resolved and checked for existence (empty leaves the path as written and
// does not check it).
func Parse(name string, data []byte, dir string) (p *Plant, err error) {
	d := &decoder{file: name, dir: dir, density: curves.ReferenceDensity}
	data, e := decodeText(name, data)
	if e != nil {
		return nil, ErrorList{e}
	}
	root, e := parseYAML(name, data)
	if e != nil {
		return nil, ErrorList{e}
	}
	p = d.plant(root)
	if len(d.errs) > 0 {
		d.errs.sortByPosition()
		return nil, d.errs
	}
	return p, nil
}

// decodeText refuses empty, oversized and binary input before YAML sees
// it, decodes UTF-16 with a byte-order mark (what "Unicode text" exports
// write), drops a UTF-8 byte-order mark, and refuses what YAML would
// misread or reject without saying where: an invalid UTF-8 byte, a control
// character, or a Unicode line separator (U+0085, U+2028, U+2029), which
// YAML takes for a line break and so shifts every line number after it.
// Each refusal points at the line and column (in characters) of the byte.
func decodeText(name string, data []byte) ([]byte, *Error) {
	switch {
	case len(data) > MaxFileSize:
		return nil, &Error{File: name, Msg: fmt.Sprintf("file is larger than the %d MiB limit for a plant file", MaxFileSize>>20)}
	case bytes.HasPrefix(data, []byte{0xFF, 0xFE}), bytes.HasPrefix(data, []byte{0xFE, 0xFF}):
		if len(data)%2 != 0 {
			return nil, &Error{File: name, Msg: "file starts with a UTF-16 byte-order mark but has an odd number of bytes: save it again as UTF-8"}
		}
		data = utf16ToUTF8(data)
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	if len(bytes.TrimSpace(data)) == 0 {
		return nil, &Error{File: name, Msg: "file is empty: a plant file needs at least units, pumps, system, profile and tariff"}
	}
	if i := bytes.IndexByte(data, 0); i >= 0 && bytes.Count(data[:min(len(data), 8192)], []byte{0}) > 1 {
		line, col := position(data, i)
		return nil, &Error{File: name, Line: line, Column: col, Msg: "file is not text (zero bytes): is it a binary file, or UTF-16 without a byte-order mark? Save it as UTF-8"}
	}
	for off := 0; off < len(data); {
		r, n := utf8.DecodeRune(data[off:])
		line, col := position(data, off)
		switch {
		case r == utf8.RuneError && n <= 1:
			return nil, &Error{File: name, Line: line, Column: col, Msg: fmt.Sprintf("byte 0x%02X is not UTF-8 text: save the file as UTF-8", data[off])}
		case r == 0x85 || r == 0x2028 || r == 0x2029:
			return nil, &Error{File: name, Line: line, Column: col, Msg: fmt.Sprintf("a Unicode line separator (U+%04X), which YAML reads as a line break: replace it with a space or a real line break", r)}
		case r < 0x20 && r != '\t' && r != '\n' && r != '\r', r == 0x7f, r >= 0x80 && r <= 0x9f:
			return nil, &Error{File: name, Line: line, Column: col, Msg: fmt.Sprintf("a control character (U+%04X) that YAML does not accept in a file: remove it, or write it as an escape (\\x%02X) inside double quotes", r, r)}
		}
		off += n
	}
	return data, nil
}

// utf16ToUTF8 decodes UTF-16 text after its byte-order mark.
func utf16ToUTF8(data []byte) []byte {
	big := data[0] == 0xFE
	data = data[2:]
	u := make([]uint16, len(data)/2)
	for i := range u {
		if big {
			u[i] = uint16(data[2*i])<<8 | uint16(data[2*i+1])
		} else {
			u[i] = uint16(data[2*i+1])<<8 | uint16(data[2*i])
		}
	}
	return []byte(string(utf16.Decode(u)))
}

// position returns the 1-based line and column (in characters) of byte
// offset off in data.
func position(data []byte, off int) (line, col int) {
	before := data[:off]
	line = bytes.Count(before, []byte("\n")) + 1
	col = utf8.RuneCount(before[bytes.LastIndexByte(before, '\n')+1:]) + 1
	return line, col
}

var (
	yamlLine      = regexp.MustCompile(`^yaml: line (\d+): (.*)$`)
	unknownAnchor = regexp.MustCompile(`unknown anchor '([^']*)' referenced`)
)

// parseYAML decodes exactly one YAML document into a node tree.
func parseYAML(name string, data []byte) (root *yaml.Node, perr *Error) {
	defer func() {
		// yaml.v3 has panicked on some malformed inputs in the past; a
		// parser must not take the program down with it.
		if r := recover(); r != nil {
			root, perr = nil, &Error{File: name, Msg: fmt.Sprintf("YAML parser failed: %v", r)}
		}
	}()
	dec := yaml.NewDecoder(bytes.NewReader(data))
	var doc yaml.Node
	if err := dec.Decode(&doc); err != nil {
		if err == io.EOF {
			return nil, &Error{File: name, Msg: "file has no content (only comments?): a plant file needs at least units, pumps, system, profile and tariff"}
		}
		return nil, syntaxError(name, data, err)
	}
	var extra yaml.Node
	switch err := dec.Decode(&extra); {
	case err == nil:
		return nil, &Error{File: name, Line: extra.Line, Column: extra.Column,
			Msg: "a plant file holds one YAML document; found a second one (after ---)"}
	case err != io.EOF:
		return nil, syntaxError(name, data, err)
	}
	if doc.Kind == yaml.DocumentNode && len(doc.Content) == 1 {
		return doc.Content[0], nil
	}
	return &doc, nil
}

// syntaxError turns a yaml.v3 error into an Error with the line it names.
// yaml.v3 reports no column for syntax errors, so Column stays 0.
func syntaxError(name string, data []byte, err error) *Error {
	msg := err.Error()
	e := &Error{File: name}
	if m := yamlLine.FindStringSubmatch(msg); m != nil {
		e.Line, _ = strconv.Atoi(m[1])
		msg = m[2]
	} else {
		msg = strings.TrimPrefix(msg, "yaml: ")
		if m := unknownAnchor.FindStringSubmatch(msg); m != nil {
			e.Line, e.Column = locate(data, "*"+m[1])
		}
	}
	e.Msg = "YAML syntax: " + msg
	if strings.Contains(msg, "tab character") || strings.Contains(msg, "cannot start any token") {
		// yaml.v3 names the line before a tab-indented one; point at the tab.
		if line, col := firstIndentTab(data, max(1, e.Line-1)); line > 0 {
			e.Line, e.Column = line, col
			e.Msg = "YAML syntax: a tab in the indentation: YAML indents with spaces only"
		}
	}
	return e
}

// firstIndentTab returns the line and column of the first tab in the
// leading white space of a line at or after line from, or 0, 0.
func firstIndentTab(data []byte, from int) (line, col int) {
	for i, l := range bytes.Split(data, []byte("\n")) {
		if i+1 < from {
			continue
		}
		lead := len(l) - len(bytes.TrimLeft(l, " \t"))
		if j := bytes.IndexByte(l[:lead], '\t'); j >= 0 {
			return i + 1, j + 1
		}
	}
	return 0, 0
}

// locate returns the 1-based line and column of the first occurrence of
// s in data, or 0, 0.
func locate(data []byte, s string) (line, col int) {
	i := bytes.Index(data, []byte(s))
	if i < 0 {
		return 0, 0
	}
	before := data[:i]
	line = bytes.Count(before, []byte("\n")) + 1
	col = utf8.RuneCount(before[bytes.LastIndexByte(before, '\n')+1:]) + 1
	return line, col
}

// plant decodes the whole file.
func (d *decoder) plant(root *yaml.Node) *Plant {
	top := d.mapping(root, "", "a plant file", topKeys...)
	if top == nil {
		return nil
	}
	p := &Plant{Source: d.file}
	d.readUnits(top, p)
	if n := d.value(top, "name"); n != nil {
		p.Name, _ = d.label(n, "name", MaxNameLen)
	} else {
		p.Name = strings.TrimSuffix(filepath.Base(d.file), filepath.Ext(d.file))
		d.defaultf("name", "%q (from the file name)", p.Name)
	}
	if n := d.value(top, "description"); n != nil {
		p.Description, _ = d.text(n, "description")
		if r := []rune(p.Description); len(r) > MaxDescriptionLen {
			d.errorf(n, "description", "is %d characters long; at most %d fit the reports", len(r), MaxDescriptionLen)
		}
	}
	p.Fluid = d.fluid(d.value(top, "fluid"), top.has("fluid"))
	d.density = p.Fluid.Density

	specs := d.pumps(d.required(top, "pumps", "the list of pump models"))
	sys := d.system(d.required(top, "system", "the system (design flow and head, dp_control or fixed_curve)"))
	if sys != nil {
		p.System, p.DesignFlow, p.DesignHead, p.MinFlow = sys.curve, sys.designFlow, sys.designHead, sys.minFlow
		p.DPSensor = sys.sensor
		p.BypassAtLoopEnd = sys.loopEnd
	}
	p.Profile = d.profile(d.required(top, "profile", "the load profile (bins or trend)"), sys)
	p.Tariff = d.tariff(d.required(top, "tariff", "the tariff (at least energy_price and currency)"))
	if n := d.value(top, "retrofit"); n != nil {
		p.Retrofit, p.HasRetrofit = d.retrofit(n), true
	}
	if n := d.value(top, "sequence"); n != nil {
		p.Sequence = d.staging(n, specs, sys)
	}
	if n := d.value(top, "suction"); n != nil {
		p.Suction = d.suction(n, sys, p.Fluid)
	}
	for _, s := range specs {
		if s != nil {
			p.Models = append(p.Models, s.model)
		}
	}
	d.checkPlant(specs, sys)
	p.Defaults, p.Warnings = d.defaults, d.warnings
	return p
}

// readUnits reads the unit system; numbers elsewhere depend on it.
func (d *decoder) readUnits(top *fields, p *Plant) {
	n := d.required(top, "units", "the unit system (US or SI) in which every number of the file is read")
	s, ok := d.text(n, "units")
	if !ok {
		return
	}
	switch s {
	case "US":
		d.units, d.unitsKnown = curves.US, true
	case "SI":
		d.units, d.unitsKnown = curves.SI, true
	default:
		hint := ""
		switch strings.ToUpper(s) {
		case "US", "SI":
			hint = fmt.Sprintf(" (write %s in capitals)", strings.ToUpper(s))
		case "IMPERIAL", "USCS", "CUSTOMARY":
			hint = " (write US)"
		case "METRIC":
			hint = " (write SI)"
		}
		d.errorf(n, "units", "must be US or SI, not %q%s", clip(s), hint)
	}
	p.Units = d.units
}

// Density of water at 4 °C by Kell (1975), the reference of specific
// gravity here (docs/sources.md §2 check value 999.972 kg/m³).
const waterAt4C = 999.972

// fluid reads the pumped fluid. With no fluid section the fluid is water at
// 20 °C, recorded as a default.
func (d *decoder) fluid(n *yaml.Node, given bool) curves.Fluid {
	if !given {
		rho, _ := curves.WaterDensity(20)
		d.defaultf("fluid", "water at %s (density %.1f kg/m³, Kell 1975)", d.fmtTemp(20), rho)
		return curves.Fluid{Density: rho, Temperature: 20, SG: rho / waterAt4C}
	}
	water, _ := curves.WaterDensity(20)
	fallback := curves.Fluid{Density: water, Temperature: 20, SG: water / waterAt4C}
	f := d.mapping(n, "fluid", "temperature and/or specific_gravity", "temperature", "specific_gravity")
	if f == nil {
		return fallback
	}
	tn, sn := d.value(f, "temperature"), d.value(f, "specific_gravity")
	if tn == nil && sn == nil {
		if !f.has("temperature") && !f.has("specific_gravity") {
			d.errorf(f.node, "fluid", "give temperature (water, density by Kell 1975) or specific_gravity (glycol or brine)")
		}
		return fallback
	}
	t, tok := math.NaN(), false
	if tn != nil {
		t, tok = d.temperature(tn, "fluid.temperature")
	}
	if sn != nil {
		sg, ok := d.number(sn, "fluid.specific_gravity")
		if !ok {
			return fallback
		}
		if sg < 0.5 || sg > 2 {
			d.errorf(sn, "fluid.specific_gravity", "%s is outside 0.5–2: specific gravity is relative to water (1.0; about 1.04 for 40 %% propylene glycol)", sn.Value)
			return fallback
		}
		if tok && (t < -60 || t > 150) {
			d.errorf(tn, "fluid.temperature", "%s is outside the range of a pumped liquid here (%s to %s)", d.fmtTemp(t), d.fmtTemp(-60), d.fmtTemp(150))
		}
		if !tok {
			t = math.NaN()
		}
		return curves.Fluid{Density: sg * waterAt4C, Temperature: t, SG: sg}
	}
	if !tok {
		return fallback
	}
	rho, err := curves.WaterDensity(t)
	if err != nil {
		d.errorf(tn, "fluid.temperature", "%s is outside %s to %s, the range of the Kell (1975) water density (give specific_gravity for other liquids)",
			d.fmtTemp(t), d.fmtTemp(0), d.fmtTemp(150))
		return fallback
	}
	return curves.Fluid{Density: rho, Temperature: t, SG: rho / waterAt4C}
}

func (d *decoder) fmtTemp(c float64) string {
	return fmtNum(d.units.TempOut(c)) + " " + d.units.TempUnit()
}
