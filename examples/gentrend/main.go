// Command gentrend writes the invented hourly trend log of the example
// chilled-water plant (examples/chilled-water-trend.csv): one year of plant
// flow and loop differential pressure for an invented plant of three
// ~1000 gpm pumps (design 2700 gpm), local time in America/Chicago, with the
// messiness of a real export built in on purpose: a few logger gaps, a
// duplicated row, the daylight-saving hours (spring's skipped hour, fall's
// repeated one), blank and non-numeric cells, and one absurd spike. The
// pump_kw column is an invented meter reading of the pumps' total input:
// kW = 3.0 + 62·f^2.5 with f the flow over 3000 gpm, times 1 ± 3 % noise,
// with a few blank readings (meter dropouts) — a plausible plant, not the
// model's own output, so that predicted-vs-measured shows real residuals.
//
// The numbers are a made-up demo scenario, not measurements. The output is
// deterministic (fixed seed):
//
//	go run ./examples/gentrend -o examples/chilled-water-trend.csv
package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"time"
	_ "time/tzdata"
)

func main() {
	out := flag.String("o", "", "output file (default stdout)")
	flag.Parse()
	w := io.Writer(os.Stdout)
	if *out != "" {
		f, err := os.Create(*out)
		if err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(1)
		}
		defer f.Close()
		w = f
	}
	if err := write(w); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
}

const (
	designGPM = 2700.0 // invented plant design flow
	dpSet     = 12.0   // psi, invented loop DP setpoint
	layout    = "2006-01-02 15:04"
)

// edits are the deliberate faults, keyed by local wall-clock stamp.
var (
	gaps = [][2]string{ // [from, to) local stamps with no rows
		{"2025-02-11 09:00", "2025-02-11 15:00"}, // 6 h
		{"2025-04-03 02:00", "2025-04-03 04:00"}, // 2 h
		{"2025-08-14 00:00", "2025-08-15 00:00"}, // a day's logger outage
		{"2025-10-07 16:00", "2025-10-07 17:00"}, // 1 h
	}
	duplicate = "2025-06-10 10:00" // row written twice
	flowCell  = map[string]string{ // replaced flow cells
		"2025-01-22 07:00": "",      // blank
		"2025-09-03 13:00": "#N/A",  // non-numeric
		"2025-07-22 15:00": "27150", // absurd spike (a slipped decimal)
	}
	kwBlank = map[string]bool{ // meter dropouts: the row stays, without power
		"2025-05-05 05:00": true, "2025-11-20 14:00": true,
	}
	dpCell = map[string]string{
		"2025-03-28 11:00": "",    // blank: the row stays, without DP
		"2025-12-12 20:00": "---", // non-numeric: the row stays, DP ignored
	}
)

func write(w io.Writer) error {
	loc, err := time.LoadLocation("America/Chicago")
	if err != nil {
		return err
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintln(bw, "timestamp,plant_flow_gpm,loop_dp_psi,pump_kw")
	rng := rand.New(rand.NewPCG(2025, 7))
	meter := rand.New(rand.NewPCG(2025, 11)) // separate stream: the flows stay as they were
	start := time.Date(2025, 1, 1, 0, 0, 0, 0, loc)
	noise := 0.0
	for i := range 8760 {
		t := start.Add(time.Duration(i) * time.Hour) // absolute hours: the wall clock skips and repeats an hour
		stamp := t.Format(layout)
		noise = 0.8*noise + 0.6*0.03*rng.NormFloat64() // AR(1), stationary σ ≈ 0.03
		if inGap(stamp) {
			continue
		}
		frac := load(t) + noise
		frac = min(max(frac, 0.25), 0.95)
		flow := fmt.Sprintf("%.1f", frac*designGPM)
		dp := dpSet + 0.15*rng.NormFloat64()
		if frac > 0.88 { // the pumps cannot quite hold the setpoint at the top
			dp -= (frac - 0.88) * 10
		}
		dps := fmt.Sprintf("%.2f", dp)
		if v, ok := flowCell[stamp]; ok {
			flow = v
		}
		if v, ok := dpCell[stamp]; ok {
			dps = v
		}
		f := frac * designGPM / 3000
		kw := fmt.Sprintf("%.2f", (3.0+62*math.Pow(f, 2.5))*(1+0.03*meter.NormFloat64()))
		if _, dropout := kwBlank[stamp]; dropout {
			kw = ""
		}
		line := fmt.Sprintf("%s,%s,%s,%s\n", stamp, flow, dps, kw)
		bw.WriteString(line)
		if stamp == duplicate {
			bw.WriteString(line)
		}
	}
	bw.WriteString("\n") // exports often end with a blank line
	return bw.Flush()
}

func inGap(stamp string) bool {
	for _, g := range gaps {
		if stamp >= g[0] && stamp < g[1] {
			return true
		}
	}
	return false
}

// load is the invented plant's load fraction of design flow: a winter base
// (interior zones and process), a cooling season peaking in late July, and
// an occupied-hours bump on weekdays that is smaller at weekends.
func load(t time.Time) float64 {
	doy := float64(t.YearDay())
	season := 0.5 - 0.5*math.Cos(2*math.Pi*(doy-25)/365) // 0 late January, 1 late July
	h := float64(t.Hour()) + float64(t.Minute())/60
	day := 0.0
	if h > 6 && h < 20 {
		day = math.Sin(math.Pi * (h - 6) / 14) // peaks at 13:00
	}
	occ := 1.0
	if wd := t.Weekday(); wd == time.Saturday || wd == time.Sunday {
		occ = 0.35
	}
	return 0.28 + 0.30*season + occ*(0.12+0.20*season)*day
}
