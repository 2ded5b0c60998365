package plant

import (
	"os"
	"path/filepath"
	"strings"
	"time"

	"gopkg.in/yaml.v3"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/internal/numfmt"
	"wattstage/profile"
)

// Bounds of a load profile.
const (
	maxBins      = 10_000
	maxYearHours = 8784 // a leap year
)

// profile reads the load profile: bins or a trend.
func (d *decoder) profile(n *yaml.Node, sys *systemSpec) Profile {
	var p Profile
	f := d.mapping(n, "profile", "bins or trend", "bins", "trend", "annual_hours")
	if f == nil {
		return p
	}
	if an := d.value(f, "annual_hours"); an != nil {
		if h, ok := d.number(an, "profile.annual_hours"); ok {
			if h <= 0 || h > maxYearHours {
				d.errorf(an, "profile.annual_hours", "%s: give the hours a year the profile stands for, above 0 and at most %d", an.Value, maxYearHours)
			} else {
				p.AnnualHours = h
			}
		}
	}
	bn, tn := d.value(f, "bins"), d.value(f, "trend")
	switch {
	case bn != nil && tn != nil:
		d.errorf(tn, "profile.trend", "give bins or trend, not both")
	case bn != nil:
		p.Bins = d.bins(bn, sys)
	case tn != nil:
		p.Trend = d.trend(tn)
	case !f.has("bins") && !f.has("trend"):
		d.errorf(f.node, "profile", "missing: give bins (flow and hours a year) or trend (a CSV log)")
	}
	return p
}

// bins reads flow bins with hours a year.
func (d *decoder) bins(n *yaml.Node, sys *systemSpec) []Bin {
	const path = "profile.bins"
	items, ok := d.sequence(n, path, "bins of flow and hours")
	if !ok {
		return nil
	}
	if len(items) == 0 || len(items) > maxBins {
		d.errorf(n, path, "has %d bins; give from 1 to %d", len(items), maxBins)
		return nil
	}
	var out []Bin
	total := 0.0
	allOK := true
	for i, it := range items {
		bp := index(path, i)
		f := d.mapping(it, bp, "a bin: flow and hours", "flow", "hours")
		if f == nil {
			allOK = false
			continue
		}
		fnode := d.required(f, "flow", "the flow through the load")
		fv, fok := d.flow(fnode, join(bp, "flow"), "design flow")
		hn := d.required(f, "hours", "the hours a year at that flow")
		h, hok := d.number(hn, join(bp, "hours"))
		if hok && h <= 0 {
			d.errorf(hn, join(bp, "hours"), "%s: hours must be above zero", hn.Value)
			hok = false
		}
		if fok && (fv.IsPct && fv.Pct == 0 || !fv.IsPct && fv.Q == 0) {
			d.errorf(fnode, join(bp, "flow"), "a bin needs a flow above zero; leave the hours the plant is off out of the profile")
			fok = false
		}
		if !fok || !hok {
			allOK = false
			continue
		}
		if fv.IsPct && (sys == nil || !sys.ok) {
			allOK = false
			continue
		}
		q := fv.of(sys.designFlowOrZero())
		if sys != nil && sys.ok && q > 10*sys.designFlow {
			d.errorf(fnode, join(bp, "flow"), "%s is %s times the design flow %s: check the flow unit (this file is read in %s)",
				d.fmtFlow(q), fmtNum(float64(q/sys.designFlow)), d.fmtFlow(sys.designFlow), d.units.FlowUnit())
			allOK = false
			continue
		}
		if sys != nil && sys.ok && q > sys.designFlow*1.0001 {
			d.warnf(fnode, join(bp, "flow"), "%s is above the design flow %s", d.fmtFlow(q), d.fmtFlow(sys.designFlow))
		}
		total += h
		out = append(out, Bin{Flow: q, Hours: h})
	}
	if allOK && total > maxYearHours {
		d.errorf(n, path, "the bins add up to %s h, more than the %d h of a year", fmtNum(total), maxYearHours)
	}
	return out
}

func (s *systemSpec) designFlowOrZero() curves.Flow {
	if s == nil {
		return 0
	}
	return s.designFlow
}

var trendKeys = []string{"file", "time_column", "time_format", "time_zone", "interval", "flow_column", "flow_unit", "max_flow",
	"dp_column", "dp_unit", "power_column"}

// trend reads where a trend log is and how its columns map.
func (d *decoder) trend(n *yaml.Node) *profile.TrendSpec {
	const path = "profile.trend"
	f := d.mapping(n, path, "file and column mapping", trendKeys...)
	if f == nil {
		return nil
	}
	t := &profile.TrendSpec{}
	fn := d.required(f, "file", "the CSV file, relative to the plant file")
	if p, ok := d.text(fn, join(path, "file")); ok {
		t.Path = p // as written: relative to the plant file's folder
		if d.dir != "" {
			full := p
			if !filepath.IsAbs(p) {
				full = filepath.Join(d.dir, p)
			}
			if st, err := os.Stat(full); err != nil {
				d.errorf(fn, join(path, "file"), "cannot read %s: %s (paths are relative to the plant file's folder)", p, describeFSError(err))
			} else if st.IsDir() {
				d.errorf(fn, join(path, "file"), "%s is a folder, not a CSV file", p)
			} else if !st.Mode().IsRegular() {
				d.errorf(fn, join(path, "file"), "%s is %s, not a regular file: give the trend log itself (a pipe or a device could keep the read waiting forever)", p, profile.FileKind(st.Mode()))
			}
		}
	}
	if v := d.value(f, "time_column"); v != nil {
		t.TimeColumn, _ = d.text(v, join(path, "time_column"))
	} else if !f.has("time_column") {
		d.defaultf(join(path, "time_column"), "the first column of the CSV")
	}
	if v := d.value(f, "flow_column"); v != nil {
		t.FlowColumn, _ = d.text(v, join(path, "flow_column"))
	} else if !f.has("flow_column") {
		d.defaultf(join(path, "flow_column"), "the one column whose header contains \"flow\"")
	}
	if v := d.value(f, "time_format"); v != nil {
		if layout, ok := d.text(v, join(path, "time_format")); ok {
			if msg := checkLayout(layout); msg != "" {
				d.errorf(v, join(path, "time_format"), "%s", msg)
			} else if l, err := profile.TimeLayout(layout); err == nil {
				layout = l // "YYYY-MM-DD hh:mm" → "2006-01-02 15:04"
			}
			t.TimeFormat = layout
		}
	}
	if v := d.value(f, "time_zone"); v != nil {
		if zone, ok := d.text(v, join(path, "time_zone")); ok {
			if strings.EqualFold(zone, "Local") {
				d.errorf(v, join(path, "time_zone"), "Local is whatever zone the computer running wattstage is set to, so results would change from machine to machine: give the plant's IANA zone (e.g. America/Chicago) or UTC")
			} else if _, err := time.LoadLocation(zone); err != nil || zone == "" {
				d.errorf(v, join(path, "time_zone"), "%q is not a known IANA time zone (e.g. America/Chicago, Europe/Berlin)", zone)
			}
			t.TimeZone = zone
		}
	}
	if v := d.value(f, "interval"); v != nil {
		if m, ok := d.minutes(v, join(path, "interval")); ok {
			if m <= 0 || m > 24*60 {
				d.errorf(v, join(path, "interval"), "%s: a logging interval must be above zero and at most a day", v.Value)
			}
			t.Interval = time.Duration(m * float64(time.Minute))
		}
	}
	if v := d.value(f, "max_flow"); v != nil {
		if fv, ok := d.flow(v, join(path, "max_flow"), ""); ok {
			if fv.Q == 0 {
				d.errorf(v, join(path, "max_flow"), "the largest believable flow must be above zero")
			}
			t.MaxFlow = fv.Q
		}
	}
	t.Density = d.density
	if v := d.value(f, "flow_unit"); v != nil {
		t.FlowUnit = d.choice(v, join(path, "flow_unit"), []string{"gpm", "m3/h", "L/s"})
	} else if !f.has("flow_unit") {
		d.defaultf(join(path, "flow_unit"), "read from the flow column's header")
	}
	if v := d.value(f, "dp_column"); v != nil {
		t.DPColumn, _ = d.text(v, join(path, "dp_column"))
	}
	if v := d.value(f, "dp_unit"); v != nil {
		t.DPUnit = d.choice(v, join(path, "dp_unit"), []string{"psi", "kPa", "ft", "m"})
		if !f.has("dp_column") {
			d.errorf(v, join(path, "dp_unit"), "dp_unit without dp_column: name the differential-pressure column too")
		}
	} else if t.DPColumn != "" && !f.has("dp_unit") {
		d.defaultf(join(path, "dp_unit"), "read from the DP column's header")
	}
	if v := d.value(f, "power_column"); v != nil {
		t.PowerColumn, _ = d.text(v, join(path, "power_column"))
	}
	return t
}

// checkLayout refuses time formats that cannot be Go layouts.
func checkLayout(layout string) string {
	switch layout {
	case "unix", "unix_ms", "excel":
		return ""
	}
	if !strings.ContainsAny(layout, "0123456789%") {
		// A pattern as practitioners write it: "YYYY-MM-DD hh:mm".
		if _, err := profile.TimeLayout(layout); err != nil {
			return strings.TrimPrefix(err.Error(), "profile: ") + ` (write it as "YYYY-MM-DD hh:mm", "MM/DD/YYYY h:mm AM", or a Go layout such as "2006-01-02 15:04")`
		}
		return ""
	}
	if strings.Contains(layout, "%") {
		return "time_format is a pattern such as \"YYYY-MM-DD hh:mm\" or \"MM/DD/YYYY h:mm AM\" (or a Go layout written with the reference time, \"2006-01-02 15:04\"), not strftime codes like %Y"
	}
	// Any time other than the reference time formats differently from a
	// layout that has at least one field.
	other := time.Date(2011, 3, 4, 7, 8, 9, 0, time.UTC)
	if other.Format(layout) == layout {
		return "time_format has no date or time fields: write it with the reference time 2006-01-02 15:04:05 (e.g. \"01/02/2006 15:04\")"
	}
	return ""
}

// choice reads one of a set of words (compared without case, ³ as 3).
func (d *decoder) choice(n *yaml.Node, path string, allowed []string) string {
	s, ok := d.text(n, path)
	if !ok {
		return ""
	}
	for _, a := range allowed {
		if strings.EqualFold(normUnit(s), normUnit(a)) {
			return a
		}
	}
	d.errorf(n, path, "must be %s, not %q", orList(allowed), clip(s))
	return ""
}

var tariffKeys = []string{"currency", "energy_price", "periods", "demand_charge", "emissions_factor"}

// tariff reads the energy tariff.
func (d *decoder) tariff(n *yaml.Node) econ.Tariff {
	var t econ.Tariff
	const path = "tariff"
	f := d.mapping(n, path, "currency, energy_price, periods, demand_charge, emissions_factor", tariffKeys...)
	if f == nil {
		return t
	}
	t.Currency, _ = d.label(d.required(f, "currency", "the currency of the prices (e.g. USD, EUR)"), join(path, "currency"), MaxCurrencyLen)
	t.EnergyPrice = d.price(d.required(f, "energy_price", "the price per kWh (flat, or outside every period)"), join(path, "energy_price"), MaxEnergyPrice)
	if v := d.value(f, "periods"); v != nil {
		t.Periods = d.periods(v, join(path, "periods"))
	}
	if v := d.value(f, "demand_charge"); v != nil {
		t.DemandCharge = d.price(v, join(path, "demand_charge"), MaxDemandCharge)
	} else if !f.has("demand_charge") {
		d.defaultf(join(path, "demand_charge"), "none")
	}
	if v := d.value(f, "emissions_factor"); v != nil {
		if e, ok := d.number(v, join(path, "emissions_factor")); ok {
			switch {
			case e < 0:
				d.errorf(v, join(path, "emissions_factor"), "%s: must not be negative", v.Value)
			case e > 2:
				d.errorf(v, join(path, "emissions_factor"), "%s kg CO2e per kWh is beyond any grid (about 0.1–1.1): the factor is in kg per kWh, not g", v.Value)
			default:
				t.EmissionsFactor = e
			}
		}
	} else if !f.has("emissions_factor") {
		d.defaultf(join(path, "emissions_factor"), "not given: emissions are not reported")
	}
	return t
}

// Upper bounds of the money amounts a plant file gives, in its currency.
// They are far above any real tariff or cost in any currency (an energy
// price of a few thousand per kWh covers the currencies with the smallest
// units) and keep every total a plan computes finite and printable.
const (
	MaxEnergyPrice  = 1e5  // per kWh: tariff.energy_price, tariff.periods[].price
	MaxDemandCharge = 1e7  // per kW of a month's peak: tariff.demand_charge
	MaxCost         = 1e12 // retrofit.drive_cost, retrofit.other_cost
)

// price reads a money amount from 0 to max.
func (d *decoder) price(n *yaml.Node, path string, max float64) float64 {
	v, ok := d.number(n, path)
	switch {
	case ok && v < 0:
		d.errorf(n, path, "%s: a price must not be negative", n.Value)
		return 0
	case ok && v > max:
		d.errorf(n, path, "%s is above %s, the largest amount accepted here (check the unit: per kWh, per kW, or a cost)", n.Value, fmtGrouped(max))
		return 0
	}
	return v
}

// fmtGrouped writes a whole number with thousands separators.
func fmtGrouped(v float64) string { return numfmt.Grouped(v, 0) }

// periods reads time-of-use periods and checks that none overlap.
func (d *decoder) periods(n *yaml.Node, path string) []econ.Period {
	items, ok := d.sequence(n, path, "time-of-use periods")
	if !ok {
		return nil
	}
	if len(items) > 48 {
		d.errorf(n, path, "has %d periods; at most 48 are accepted", len(items))
		return nil
	}
	var out []econ.Period
	// owner[day type][hour] is the index+1 of the period holding that hour.
	var owner [2][24]int
	names := make([]string, len(items))
	for i, it := range items {
		pp := index(path, i)
		f := d.mapping(it, pp, "a period: name, price, start_hour, end_hour, days", "name", "price", "start_hour", "end_hour", "days")
		if f == nil {
			continue
		}
		var p econ.Period
		p.Name, _ = d.label(d.required(f, "name", "the period's name"), join(pp, "name"), MaxModelNameLen)
		names[i] = p.Name
		p.Price = d.price(d.required(f, "price", "the price per kWh in the period"), join(pp, "price"), MaxEnergyPrice)
		sn := d.required(f, "start_hour", "the first hour of the period (0–23)")
		start, sok := d.integer(sn, join(pp, "start_hour"))
		if sok && (start < 0 || start > 23) {
			d.errorf(sn, join(pp, "start_hour"), "%d is outside 0–23", start)
			sok = false
		}
		en := d.required(f, "end_hour", "the hour the period ends (1–24)")
		end, eok := d.integer(en, join(pp, "end_hour"))
		if eok && (end < 1 || end > 24) {
			d.errorf(en, join(pp, "end_hour"), "%d is outside 1–24", end)
			eok = false
		}
		if sok && eok && end <= start {
			d.errorf(en, join(pp, "end_hour"), "%d is not after start_hour %d; split a period that runs past midnight in two", end, start)
			eok = false
		}
		p.StartHour, p.EndHour = start, end
		p.Weekdays, p.Weekends = true, true
		dok := true
		if dn := d.value(f, "days"); dn != nil {
			switch v := d.choice(dn, join(pp, "days"), []string{"weekdays", "weekends", "all"}); v {
			case "weekdays":
				p.Weekends = false
			case "weekends":
				p.Weekdays = false
			case "":
				dok = false
			}
		} else if !f.has("days") {
			d.defaultf(join(pp, "days"), "all days")
		}
		if sok && eok && dok {
		overlap:
			for day, on := range []bool{p.Weekdays, p.Weekends} {
				if !on {
					continue
				}
				for h := start; h < end; h++ {
					if j := owner[day][h]; j != 0 {
						d.errorf(f.node, pp, "overlaps %s (%q) at hour %d", index(path, j-1), names[j-1], h)
						break overlap
					}
					owner[day][h] = i + 1
				}
			}
		}
		out = append(out, p)
	}
	return out
}

var retrofitKeys = []string{"drive_cost", "other_cost", "life_years", "discount_rate", "escalation"}

// Default appraisal terms of a retrofit.
const (
	// DefaultLifeYears is the appraisal life of a drive retrofit: about 15
	// years is the usual service life quoted for VFDs (common practice).
	DefaultLifeYears = 15
)

// retrofit reads the costs and appraisal terms of a drive retrofit.
func (d *decoder) retrofit(n *yaml.Node) econ.Retrofit {
	var r econ.Retrofit
	const path = "retrofit"
	f := d.mapping(n, path, "drive_cost, other_cost, life_years, discount_rate, escalation", retrofitKeys...)
	if f == nil {
		return r
	}
	r.DriveCost = d.price(d.required(f, "drive_cost", "the installed cost of one drive"), join(path, "drive_cost"), MaxCost)
	if v := d.value(f, "other_cost"); v != nil {
		r.OtherCost = d.price(v, join(path, "other_cost"), MaxCost)
	} else if !f.has("other_cost") {
		d.defaultf(join(path, "other_cost"), "0")
	}
	if v := d.value(f, "life_years"); v != nil {
		if y, ok := d.integer(v, join(path, "life_years")); ok {
			if y < 1 || y > 50 {
				d.errorf(v, join(path, "life_years"), "%d years is outside 1–50", y)
			} else {
				r.LifeYears = y
			}
		}
	} else if !f.has("life_years") {
		r.LifeYears = DefaultLifeYears
		d.defaultf(join(path, "life_years"), "%d years (usual drive service life, common practice)", DefaultLifeYears)
	}
	if v := d.value(f, "discount_rate"); v != nil {
		if x, ok := d.ratio(v, join(path, "discount_rate"), "the real discount rate per year", 1); ok {
			if x < 0 || x > 0.5 {
				d.errorf(v, join(path, "discount_rate"), "%s %% a year is outside 0–50 %%", fmtNum(100*x))
			} else {
				r.DiscountRate = x
			}
		}
	} else if !f.has("discount_rate") {
		d.defaultf(join(path, "discount_rate"), "0 %% (undiscounted; give discount_rate for a present-value appraisal)")
	}
	if v := d.value(f, "escalation"); v != nil {
		if x, ok := d.ratio(v, join(path, "escalation"), "the energy price escalation per year", 1); ok {
			if x < -0.5 || x > 0.5 {
				d.errorf(v, join(path, "escalation"), "%s %% a year is outside −50 to 50 %%", fmtNum(100*x))
			} else {
				r.Escalation = x
			}
		}
	} else if !f.has("escalation") {
		d.defaultf(join(path, "escalation"), "0 %% a year")
	}
	return r
}

var sequenceKeys = []string{"stage_up_speed", "stage_down_speed", "stage_up_delay", "stage_down_delay", "running", "bands", "fixed_speed"}

// staging reads the sequence the plant runs today: speed thresholds, or
// units running by flow band (a fixed number always running is one band).
func (d *decoder) staging(n *yaml.Node, specs []*pumpSpec, sys *systemSpec) *Sequence {
	const path = "sequence"
	f := d.mapping(n, path, "stage_up_speed and stage_down_speed, or running, or bands", sequenceKeys...)
	if f == nil {
		return nil
	}
	speedForm := f.has("stage_up_speed") || f.has("stage_down_speed")
	bandForm := f.has("running") || f.has("bands")
	switch {
	case speedForm && bandForm:
		d.errorf(f.node, path, "give speed thresholds (stage_up_speed, stage_down_speed) or units by flow (running or bands), not both")
		return nil
	case f.has("running") && f.has("bands"):
		d.errorf(d.value(f, "bands"), join(path, "bands"), "give running (a fixed number of units) or bands, not both")
		return nil
	case bandForm:
		return d.bandSequence(f, specs, sys)
	}
	if fn := d.value(f, "fixed_speed"); fn != nil {
		d.errorf(fn, join(path, "fixed_speed"), "speed thresholds stage units on drives; fixed_speed goes with running or bands")
	}
	s := &Sequence{}
	un := d.required(f, "stage_up_speed", "the speed above which a unit is added")
	up, uok := d.ratio(un, join(path, "stage_up_speed"), "the stage-up speed", 2)
	dn := d.required(f, "stage_down_speed", "the speed below which a unit is dropped")
	down, dok := d.ratio(dn, join(path, "stage_down_speed"), "the stage-down speed", 2)
	if uok && (up <= 0 || up > 1.5) {
		d.errorf(un, join(path, "stage_up_speed"), "%s %% of rated speed is outside 0–150 %%", fmtNum(100*up))
		uok = false
	}
	if dok && (down <= 0 || down > 1.5) {
		d.errorf(dn, join(path, "stage_down_speed"), "%s %% of rated speed is outside 0–150 %%", fmtNum(100*down))
		dok = false
	}
	if uok && dok && down >= up {
		d.errorf(dn, join(path, "stage_down_speed"), "%s %% is not below the stage-up speed %s %%: the stage-down band must sit well below stage-up", fmtNum(100*down), fmtNum(100*up))
	}
	s.StageUpSpeed, s.StageDownSpeed = up, down
	d.sequenceDelays(f, s)
	variable, known := false, len(specs) > 0
	for _, sp := range specs {
		if sp == nil || !sp.driveOK {
			known = false
			continue
		}
		variable = variable || sp.model.Drive.Variable()
	}
	if known && !variable {
		d.errorf(f.node, path, "a speed-based staging sequence needs variable-speed units; every pump here is fixed speed")
	}
	return s
}

// sequenceDelays reads the stage-up and stage-down delays.
func (d *decoder) sequenceDelays(f *fields, s *Sequence) {
	for _, k := range []struct {
		key string
		dst *float64
	}{{"stage_up_delay", &s.StageUpDelayMin}, {"stage_down_delay", &s.StageDownDelayMin}} {
		if v := d.value(f, k.key); v != nil {
			*k.dst, _ = d.minutes(v, join("sequence", k.key))
		} else if !f.has(k.key) {
			d.defaultf(join("sequence", k.key), "0 min (none)")
		}
	}
}

// bandSequence reads units running by plant-flow band: running (one band)
// or bands of {up_to, running}, the last without up_to.
func (d *decoder) bandSequence(f *fields, specs []*pumpSpec, sys *systemSpec) *Sequence {
	const path = "sequence"
	s := &Sequence{FixedSpeed: true}
	duty := 0
	for _, sp := range specs {
		if sp == nil {
			return nil
		}
		duty += sp.model.Count
	}
	count := func(n *yaml.Node, p string) (int, bool) {
		v, ok := d.integer(n, p)
		if ok && (v < 1 || v > duty) {
			d.errorf(n, p, "%d units running: give from 1 to the %d on duty (standby units are not run)", v, duty)
			return 0, false
		}
		return v, ok
	}
	ok := true
	if rn := d.value(f, "running"); rn != nil {
		v, vok := count(rn, join(path, "running"))
		s.Bands, ok = []SequenceBand{{Running: v}}, vok
	} else {
		items, iok := d.sequence(d.value(f, "bands"), join(path, "bands"), "bands of up_to and running")
		if !iok || len(items) == 0 {
			if iok {
				d.errorf(d.value(f, "bands"), join(path, "bands"), "give at least one band")
			}
			return nil
		}
		var last curves.Flow
		for i, it := range items {
			bp := index(join(path, "bands"), i)
			bf := d.mapping(it, bp, "a band: up_to and running", "up_to", "running")
			if bf == nil {
				ok = false
				continue
			}
			b := SequenceBand{}
			if v, vok := count(d.required(bf, "running", "the units running in the band"), join(bp, "running")); vok {
				b.Running = v
			} else {
				ok = false
			}
			un := d.value(bf, "up_to")
			switch {
			case un == nil && i != len(items)-1:
				d.errorf(it, join(bp, "up_to"), "missing: every band but the last needs the flow it runs up to")
				ok = false
			case un != nil && i == len(items)-1:
				d.errorf(un, join(bp, "up_to"), "the last band runs at every higher flow: leave up_to out")
				ok = false
			case un != nil:
				fv, fok := d.flow(un, join(bp, "up_to"), "design flow")
				if !fok || fv.IsPct && (sys == nil || !sys.ok) {
					ok = false
					break
				}
				b.UpTo = fv.of(sys.designFlowOrZero())
				if b.UpTo <= last {
					d.errorf(un, join(bp, "up_to"), "%s is not above the band before (%s): give bands in increasing flow", d.fmtFlow(b.UpTo), d.fmtFlow(last))
					ok = false
				}
				last = b.UpTo
			}
			s.Bands = append(s.Bands, b)
		}
	}
	if fn := d.value(f, "fixed_speed"); fn != nil {
		s.FixedSpeed, _ = d.boolean(fn, join(path, "fixed_speed"))
	} else if !f.has("fixed_speed") {
		d.defaultf(join(path, "fixed_speed"), "true: the units run across the line today (a throttled plant before a drive retrofit)")
	}
	d.sequenceDelays(f, s)
	if !ok {
		return nil
	}
	return s
}
