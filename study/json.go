package study

import (
	"bufio"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"time"

	"wattstage/internal/version"
	"wattstage/optimize"
)

// SchemaVersion is the version of the plan JSON (docs/plan-json.md). It
// changes when a key is removed or its meaning changes; added keys keep it.
const SchemaVersion = 1

// JSON is the plan's JSON document: the Result in the plant's display
// units, snake_case keys, null for a value that does not exist.
type JSON struct {
	SchemaVersion  int            `json:"schema_version"`
	Tool           string         `json:"tool"`
	Version        string         `json:"version"`
	InputsSHA256   *string        `json:"inputs_sha256"`
	Plant          string         `json:"plant"`
	Units          JSONUnits      `json:"units"`
	Profile        JSONProfile    `json:"profile"`
	Period         JSONPeriod     `json:"period"`
	Baseline       string         `json:"baseline"`
	Appraised      bool           `json:"appraised"`
	Strategies     []JSONStrategy `json:"strategies"`
	SavingsRange   *JSONRange     `json:"savings_range"`
	Checks         JSONChecks     `json:"checks"`
	Recommendation string         `json:"recommendation"`
	Warnings       []Warning      `json:"warnings"`
	Cautions       []string       `json:"cautions"`
}

// JSONUnits names the unit of every quantity in the document.
type JSONUnits struct {
	Flow      string `json:"flow"`
	Head      string `json:"head"`
	Pressure  string `json:"pressure"`
	Power     string `json:"power"`
	Energy    string `json:"energy"`
	Currency  string `json:"currency"`
	Emissions string `json:"emissions"`
}

// JSONProfile says what the steps were.
type JSONProfile struct {
	Kind         string   `json:"kind"` // "bins", "trend" (every interval) or "trend_bins"
	Source       string   `json:"source"`
	Steps        int      `json:"steps"`
	LoadBinWidth *float64 `json:"load_bin_width"` // flow groups of the load points; null when each step is a point
}

// JSONPeriod is what the profile covers.
type JSONPeriod struct {
	Start               *time.Time `json:"start"`
	End                 *time.Time `json:"end"`
	Hours               float64    `json:"hours"`
	CoveredHours        float64    `json:"covered_hours"`
	AnnualisationFactor float64    `json:"annualisation_factor"`
}

// JSONStrategy is one strategy.
type JSONStrategy struct {
	Key                string          `json:"key"`
	Name               string          `json:"name"`
	Note               string          `json:"note"`
	Drives             int             `json:"drives"`
	DrivesAdded        int             `json:"drives_added"`
	PeriodKWh          float64         `json:"period_kwh"`
	PeriodEnergyCost   float64         `json:"period_energy_cost"`
	PeriodHoursUnmet   float64         `json:"period_hours_unmet"`
	AnnualKWh          float64         `json:"annual_kwh"`
	AnnualEnergyCost   float64         `json:"annual_energy_cost"`
	AnnualDemandCost   float64         `json:"annual_demand_cost"`
	AnnualCost         float64         `json:"annual_cost"`
	AnnualEmissionsKg  float64         `json:"annual_emissions_kg"`
	AnnualBilledDemand float64         `json:"annual_billed_demand_kw_months"`
	PeakKW             float64         `json:"peak_kw"`
	StageChanges       *int            `json:"stage_changes"`
	Savings            *JSONSavings    `json:"savings"`
	Appraisal          *JSONAppraisal  `json:"appraisal"`
	LoadPoints         []JSONLoadPoint `json:"load_points"`
	Regions            JSONRegions     `json:"regions"`
}

// JSONRegions are a strategy's unit-hours a year by operating region.
type JSONRegions struct {
	UnitHours        float64 `json:"unit_hours"`
	OutsidePreferred float64 `json:"outside_preferred_unit_hours"`
	OutsideAllowable float64 `json:"outside_allowable_unit_hours"`
	Overspeed        float64 `json:"above_rated_speed_unit_hours"`
	Overload         float64 `json:"into_service_factor_unit_hours"`
}

// JSONSavings are a year's savings against the baseline.
type JSONSavings struct {
	AnnualKWh         float64 `json:"annual_kwh"`
	AnnualEnergyCost  float64 `json:"annual_energy_cost"`
	AnnualDemandCost  float64 `json:"annual_demand_cost"`
	AnnualCost        float64 `json:"annual_cost"`
	AnnualEmissionsKg float64 `json:"annual_emissions_kg"`
	Share             float64 `json:"share_of_baseline_energy"`
}

// JSONAppraisal is the appraisal of a strategy's investment.
type JSONAppraisal struct {
	Investment         float64  `json:"investment"`
	AnnualSavings      float64  `json:"annual_savings"`
	SimplePaybackYears *float64 `json:"simple_payback_years"`
	DiscountedPayback  *float64 `json:"discounted_payback_years"`
	PresentValueFactor float64  `json:"present_value_factor"`
	PresentSavings     float64  `json:"present_savings"`
	NPV                float64  `json:"npv"`
	SIR                *float64 `json:"sir"`
	LifeYears          int      `json:"life_years"`
	DiscountRate       float64  `json:"discount_rate"`
	Escalation         float64  `json:"escalation"`
}

// JSONLoadPoint is one load point over the period.
type JSONLoadPoint struct {
	Flow         float64  `json:"flow"`
	FlowLow      float64  `json:"flow_low"`
	FlowHigh     float64  `json:"flow_high"`
	Steps        int      `json:"steps"`
	Hours        float64  `json:"hours"`
	HoursUnmet   float64  `json:"hours_unmet"`
	KW           float64  `json:"kw"`
	KWh          float64  `json:"kwh"`
	Cost         float64  `json:"cost"`
	UnitsRunning int      `json:"units_running"`
	HeaderHead   *float64 `json:"header_head"`
	RequiredHead *float64 `json:"required_head"`
	Limit        string   `json:"limit"`
}

// JSONRange is the savings range.
type JSONRange struct {
	Expected float64         `json:"expected_kwh"`
	Low      float64         `json:"low_kwh"`
	High     float64         `json:"high_kwh"`
	LowCost  float64         `json:"low_cost"`
	HighCost float64         `json:"high_cost"`
	LowBy    string          `json:"low_set_by"`
	HighBy   string          `json:"high_set_by"`
	Cases    []JSONRangeCase `json:"cases"`
}

// JSONRangeCase is one case of the savings range.
type JSONRangeCase struct {
	Case             string  `json:"case"`
	ControlHeadScale float64 `json:"control_head_scale"`
	LossScale        float64 `json:"loss_scale"`
	BaselineKWh      float64 `json:"baseline_annual_kwh"`
	LowestKWh        float64 `json:"lowest_annual_kwh"`
	SavedKWh         float64 `json:"saved_annual_kwh"`
	SavedCost        float64 `json:"saved_annual_cost"`
}

// JSONChecks are the checks.
type JSONChecks struct {
	PartLoad    []JSONPartLoad   `json:"part_load"`
	OneUnitOut  *JSONUnitOut     `json:"one_unit_out"`
	Calibration *JSONCalibration `json:"calibration"`
	Binning     *JSONBinning     `json:"binning"`
	LoggedDP    *JSONLoggedDP    `json:"logged_dp"`
	NPSH        JSONNPSH         `json:"npsh"`
}

// JSONNPSH is the NPSH check.
type JSONNPSH struct {
	Made              bool               `json:"made"`
	Note              string             `json:"note"`
	MarginRatio       *float64           `json:"margin_ratio"`
	AvailableAtDesign *float64           `json:"npsh_available_at_design_flow"`
	NotChecked        []string           `json:"models_not_checked"`
	Strategies        []JSONNPSHStrategy `json:"strategies"`
	ShortPoints       []JSONNPSHShort    `json:"short_points"`
}

// JSONNPSHStrategy is one strategy's unit-hours a year against the margin.
type JSONNPSHStrategy struct {
	Strategy     string   `json:"strategy"`
	UnitHours    float64  `json:"unit_hours"`
	Short        float64  `json:"short_unit_hours"`
	Below        float64  `json:"below_npshr_unit_hours"`
	Extrapolated float64  `json:"extrapolated_unit_hours"`
	LowestRatio  *float64 `json:"lowest_ratio"`
}

// JSONNPSHShort is one point of the lowest-power staging below the margin.
type JSONNPSHShort struct {
	Flow         float64 `json:"flow"`
	Model        string  `json:"model"`
	Units        int     `json:"units_running"`
	Speed        float64 `json:"speed"`
	UnitFlow     float64 `json:"unit_flow"`
	Available    float64 `json:"npsh_available"`
	Required     float64 `json:"npsh_required"`
	Ratio        float64 `json:"ratio"`
	Extrapolated bool    `json:"extrapolated"`
	Hours        float64 `json:"annual_hours"`
}

// JSONLoggedDP sets a trend's logged DP against the modelled setpoint.
type JSONLoggedDP struct {
	N                 int     `json:"intervals"`
	Hours             float64 `json:"hours"`
	MeanLogged        float64 `json:"mean_logged_pressure"`
	MeanModel         float64 `json:"mean_modelled_pressure"`
	MeanDiff          float64 `json:"mean_difference_pressure"`
	MaxAbs            float64 `json:"largest_difference_pressure"`
	AboveShare        float64 `json:"share_of_hours_above"`
	EnergyAtLogged    float64 `json:"annual_kwh_at_logged_dp"`
	EnergyAtSetpoints float64 `json:"annual_kwh_at_modelled_setpoint"`
}

// JSONPartLoad is one ASHRAE 90.1 §6.5.4.2 style check.
type JSONPartLoad struct {
	Strategy string   `json:"strategy"`
	DesignKW *float64 `json:"design_kw"`
	HalfKW   *float64 `json:"half_flow_kw"`
	Ratio    *float64 `json:"ratio"`
	Limit    float64  `json:"limit"`
	Pass     *bool    `json:"pass"`
	Note     string   `json:"note"`
}

// JSONUnitOut is the one-unit-out check.
type JSONUnitOut struct {
	Removed      string    `json:"removed_model"`
	ServesDesign bool      `json:"serves_design_flow"`
	MaxFlow      float64   `json:"max_flow"`
	HeadAtMax    float64   `json:"head_at_max_flow"`
	MotorLoads   []float64 `json:"motor_loads_at_max"`
}

// JSONCalibration is predicted against logged power.
type JSONCalibration struct {
	Strategy   string  `json:"strategy"`
	N          int     `json:"intervals"`
	MeanKW     float64 `json:"mean_logged_kw"`
	MeanErr    float64 `json:"mean_error_kw"`
	NMBE       float64 `json:"nmbe"`
	CVRMSE     float64 `json:"cv_rmse"`
	MaxAbs     float64 `json:"largest_error_kw"`
	Calibrated bool    `json:"meets_hourly_criteria"`
}

// JSONBinning compares every interval with bins.
type JSONBinning struct {
	Width     float64 `json:"bin_width"`
	Bins      int     `json:"bins"`
	EveryKWh  float64 `json:"every_interval_annual_kwh"`
	BinnedKWh float64 `json:"binned_annual_kwh"`
	CubeError float64 `json:"cube_law_error_estimate"`
}

// JSONStep is one step of one strategy, written only with the detail.
type JSONStep struct {
	Record   string     `json:"record"` // "step"
	Strategy string     `json:"strategy"`
	Time     *time.Time `json:"time"`
	Flow     float64    `json:"flow"`
	Hours    float64    `json:"hours"`
	Status   string     `json:"status"`
	Counts   []int      `json:"counts"`
	Speeds   []float64  `json:"speeds"`
	Head     float64    `json:"header_head"`
	KW       float64    `json:"kw"`
	Cost     float64    `json:"cost"`
	Limit    string     `json:"limit"`
}

// finite returns v, or nil for NaN and ±Inf (JSON has neither).
func finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// Document builds the JSON document.
func (r *Result) Document() JSON {
	p := r.Plant
	u := p.Units
	d := JSON{SchemaVersion: SchemaVersion, Tool: "wattstage", Version: version.Short(), Plant: p.Name, Baseline: r.BaselineStrategy().Key, Appraised: r.Appraised,
		Units:          JSONUnits{Flow: u.FlowUnit(), Head: u.HeadUnit(), Power: "kW", Energy: "kWh", Currency: r.Currency(), Emissions: "kg CO₂e"},
		Recommendation: r.Recommendation, Warnings: append([]Warning{}, r.Warnings...), Cautions: r.Cautions}
	if r.InputsSHA256 != "" {
		h := r.InputsSHA256
		d.InputsSHA256 = &h
	}
	d.Profile = JSONProfile{Kind: "bins", Source: p.Source, Steps: len(r.Steps)}
	if r.Trend != nil {
		d.Profile.Kind, d.Profile.Source = "trend", r.Trend.Name
		if r.Binned != nil {
			d.Profile.Kind = "trend_bins"
		}
	}
	if r.LoadBinWidth > 0 {
		d.Profile.LoadBinWidth = finite(u.FlowOut(r.LoadBinWidth))
	}
	pd := r.Period
	d.Period = JSONPeriod{Hours: pd.Hours, CoveredHours: pd.CoveredHours, AnnualisationFactor: pd.Factor}
	if pd.Timed {
		s, e := pd.Start, pd.End
		d.Period.Start, d.Period.End = &s, &e
	}
	for _, s := range r.Strategies {
		d.Strategies = append(d.Strategies, r.strategyJSON(s))
	}
	if g := r.Range; g != nil {
		jr := &JSONRange{Expected: r.Strategy(KeyLowest).Savings.Energy, Low: g.Low, High: g.High, LowCost: g.LowCost,
			HighCost: g.HighCost, LowBy: g.LowBy, HighBy: g.HighBy}
		for _, c := range g.Cases {
			jr.Cases = append(jr.Cases, JSONRangeCase{Case: c.Sensitivity.Label, ControlHeadScale: c.Sensitivity.ControlScale,
				LossScale: c.Sensitivity.LossScale, BaselineKWh: c.BaselineKWh, LowestKWh: c.LowestKWh, SavedKWh: c.SavedKWh, SavedCost: c.SavedCost})
		}
		d.SavingsRange = jr
	}
	d.Checks = r.checksJSON()
	return d
}

func (r *Result) strategyJSON(s Strategy) JSONStrategy {
	u := r.Plant.Units
	a := s.Annual
	js := JSONStrategy{Key: s.Key, Name: s.Name, Note: s.Note, Drives: s.Drives, DrivesAdded: s.DrivesAdded,
		PeriodKWh: s.Energy.KWh, PeriodEnergyCost: s.Bill.EnergyCost, PeriodHoursUnmet: s.Energy.HoursUnmet,
		AnnualKWh: a.Energy, AnnualEnergyCost: a.EnergyCost, AnnualDemandCost: a.DemandCost, AnnualCost: a.Total,
		AnnualEmissionsKg: a.Emissions, AnnualBilledDemand: a.BilledDemand, PeakKW: s.Energy.PeakKW,
		LoadPoints: []JSONLoadPoint{}}
	f := r.Period.Factor
	g := s.Regions
	js.Regions = JSONRegions{UnitHours: g.UnitHours * f, OutsidePreferred: g.OutsidePreferred * f, OutsideAllowable: g.OutsideAllowable * f,
		Overspeed: g.Overspeed * f, Overload: g.Overload * f}
	if r.Period.Timed {
		n := s.Energy.Changes
		js.StageChanges = &n
	}
	if sv := s.Savings; sv != nil {
		js.Savings = &JSONSavings{AnnualKWh: sv.Energy, AnnualEnergyCost: sv.EnergyCost, AnnualDemandCost: sv.DemandCost,
			AnnualCost: sv.Cost, AnnualEmissionsKg: sv.Emissions, Share: sv.Share(r.BaselineStrategy())}
	}
	if ap := s.Appraisal; ap != nil {
		t := r.Plant.Retrofit
		js.Appraisal = &JSONAppraisal{Investment: ap.Investment, AnnualSavings: ap.AnnualSavings,
			SimplePaybackYears: finite(ap.SimplePayback), DiscountedPayback: finite(ap.DiscountedPayback),
			PresentValueFactor: ap.UPV, PresentSavings: ap.PresentSavings, NPV: ap.NPV, SIR: finite(ap.SIR),
			LifeYears: t.LifeYears, DiscountRate: t.DiscountRate, Escalation: t.Escalation}
		if ap.Investment == 0 && ap.AnnualSavings <= 0 {
			js.Appraisal.SIR = nil
		}
	}
	for _, lp := range s.LoadPoints {
		jl := JSONLoadPoint{Flow: u.FlowOut(lp.Flow), FlowLow: u.FlowOut(lp.Low), FlowHigh: u.FlowOut(lp.High), Steps: lp.Steps,
			Hours: lp.Hours, HoursUnmet: lp.HoursUnmet, KW: lp.KW, KWh: lp.KWh, Cost: lp.Cost,
			UnitsRunning: lp.State.Running(), Limit: string(lp.State.Limit)}
		if lp.State.Status == optimize.Served {
			jl.HeaderHead = finite(u.HeadOut(lp.State.HeaderHead))
			jl.RequiredHead = finite(u.HeadOut(lp.State.RequiredHead))
		}
		js.LoadPoints = append(js.LoadPoints, jl)
	}
	return js
}

func (r *Result) checksJSON() JSONChecks {
	u := r.Plant.Units
	c := JSONChecks{PartLoad: []JSONPartLoad{}}
	for _, pl := range r.PartLoad {
		j := JSONPartLoad{Strategy: pl.Label, Limit: pl.Limit, Note: pl.Note}
		if pl.DesignKW > 0 {
			pass := pl.Pass
			j.DesignKW, j.HalfKW, j.Ratio, j.Pass = finite(pl.DesignKW), finite(pl.HalfKW), finite(pl.Ratio), &pass
		}
		c.PartLoad = append(c.PartLoad, j)
	}
	if uo := r.UnitOut; uo != nil {
		j := &JSONUnitOut{Removed: uo.Removed, ServesDesign: uo.ServesDesign, MaxFlow: u.FlowOut(uo.MaxFlow),
			HeadAtMax: u.HeadOut(uo.AtMax.HeaderHead), MotorLoads: []float64{}}
		for _, un := range uo.AtMax.Units {
			j.MotorLoads = append(j.MotorLoads, un.Load)
		}
		c.OneUnitOut = j
	}
	if cl := r.Calibration; cl != nil {
		c.Calibration = &JSONCalibration{Strategy: cl.Strategy, N: cl.N, MeanKW: cl.MeanKW, MeanErr: cl.MeanErr, NMBE: cl.NMBE,
			CVRMSE: cl.CVRMSE, MaxAbs: cl.MaxAbs, Calibrated: cl.Calibrated()}
	}
	if d := r.DP; d != nil {
		rho := r.Plant.Fluid.Density
		c.LoggedDP = &JSONLoggedDP{N: d.N, Hours: d.Hours, MeanLogged: u.PressureOut(d.MeanLogged, rho), MeanModel: u.PressureOut(d.MeanModel, rho),
			MeanDiff: u.PressureOut(d.MeanDiff, rho), MaxAbs: u.PressureOut(d.MaxAbs, rho), AboveShare: d.AboveShare,
			EnergyAtLogged: d.EnergyAtLogged, EnergyAtSetpoints: d.EnergyAtSetpoints}
	}
	if b := r.Binning; b != nil {
		c.Binning = &JSONBinning{Width: u.FlowOut(b.Width), Bins: b.Bins, EveryKWh: b.EveryKWh, BinnedKWh: b.BinnedKWh, CubeError: b.CubeError}
	}
	c.NPSH = r.npshJSON()
	return c
}

func (r *Result) npshJSON() JSONNPSH {
	u, f := r.Plant.Units, r.Period.Factor
	j := JSONNPSH{NotChecked: []string{}, Strategies: []JSONNPSHStrategy{}, ShortPoints: []JSONNPSHShort{}}
	c := r.NPSH
	if c == nil {
		return j
	}
	j.Made, j.Note = c.Made, c.Note
	if !c.Made {
		return j
	}
	j.MarginRatio, j.AvailableAtDesign = finite(c.Margin), finite(u.HeadOut(c.DesignAvailable))
	j.NotChecked = append(j.NotChecked, c.Unchecked...)
	for _, s := range c.Strategies {
		j.Strategies = append(j.Strategies, JSONNPSHStrategy{Strategy: s.Key, UnitHours: s.UnitHours * f, Short: s.Short * f,
			Below: s.Below * f, Extrapolated: s.Extrapolated * f, LowestRatio: finite(s.LowestRatio)})
	}
	for _, p := range c.Short {
		j.ShortPoints = append(j.ShortPoints, JSONNPSHShort{Flow: u.FlowOut(p.Flow), Model: r.Plant.Models[p.Model].Name, Units: p.Units,
			Speed: p.Speed, UnitFlow: u.FlowOut(p.UnitFlow), Available: u.HeadOut(p.Available), Required: u.HeadOut(p.Required),
			Ratio: p.Ratio, Extrapolated: p.Extrapolated, Hours: p.Hours * f})
	}
	return j
}

// WriteJSON writes the document, indented. With detail it writes JSON
// Lines instead: the document on the first line, then one "step" record
// per step of each strategy, streamed as it is encoded, so that a long
// trend never sits in memory as text.
func (r *Result) WriteJSON(w io.Writer, detail bool) error {
	if !detail {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(r.Document())
	}
	bw := bufio.NewWriter(w)
	enc := json.NewEncoder(bw)
	if err := enc.Encode(r.Document()); err != nil {
		return err
	}
	u := r.Plant.Units
	for _, s := range r.Strategies {
		if len(s.Run.Points) != len(r.Steps) {
			return fmt.Errorf("study: the detail needs every state: run the study with Options.KeepStates")
		}
		for i, st := range r.Steps {
			res := s.Run.Points[i]
			js := JSONStep{Record: "step", Strategy: s.Key, Flow: u.FlowOut(st.Load), Hours: st.Hours, Status: res.Status.String(),
				Counts: res.Counts, Speeds: []float64{}, Head: u.HeadOut(res.HeaderHead), KW: s.Energy.KW[i],
				Cost: s.Bill.SampleCost[i], Limit: string(res.Limit)}
			if st.Timed() {
				t := st.Time
				js.Time = &t
			}
			for _, un := range res.Units {
				js.Speeds = append(js.Speeds, un.Speed)
			}
			if err := enc.Encode(js); err != nil {
				return err
			}
		}
	}
	return bw.Flush()
}
