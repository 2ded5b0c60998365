package profile_test

import (
	"fmt"
	"os"
	"strings"

	"wattstage/curves"
	"wattstage/profile"
)

func ExampleReadTrend() {
	const log = `timestamp,plant_flow_gpm,loop_dp_psi
2025-11-02 00:00,1210,12.1
2025-11-02 01:00,1185,12.0
2025-11-02 01:00,1170,12.0
2025-11-02 02:00,#N/A,12.0
2025-11-02 03:00,1150,
`
	spec := profile.TrendSpec{
		TimeColumn: "timestamp", FlowColumn: "plant_flow_gpm", FlowUnit: "gpm",
		DPColumn: "loop_dp_psi", DPUnit: "psi", TimeZone: "America/Chicago",
	}
	tr, err := profile.ReadTrend(spec, strings.NewReader(log), "plant.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range tr.Points {
		dp := "no DP"
		if p.HasDP {
			dp = fmt.Sprintf("%.1f ft", float64(p.DP)/curves.Foot)
		}
		fmt.Printf("line %d  %s  %6.1f gpm  %s\n", p.Line, p.Time.Format("15:04 MST"), float64(p.Flow)/curves.GPM, dp)
	}
	fmt.Println(tr.Report.Summary())
	fmt.Printf("coverage %.0f %% of %.0f h\n", 100*tr.Coverage(), tr.Span)
	// Output:
	// line 2  00:00 CDT  1210.0 gpm  28.0 ft
	// line 3  01:00 CDT  1185.0 gpm  27.7 ft
	// line 4  01:00 CST  1170.0 gpm  27.7 ft
	// line 6  03:00 CST  1150.0 gpm  no DP
	// 5 rows, 4 kept, 1 dropped: 1 non-numeric flow (line 5)
	// coverage 80 % of 5 h
}

func ExampleReport_WriteTo() {
	tr, err := profile.ReadTrendFile(profile.TrendSpec{
		TimeColumn: "timestamp", FlowColumn: "plant flow (gpm)", TimeZone: "America/Chicago",
		DPColumn: "Loop DP (psi)", PowerColumn: "Pump kW", MaxFlow: 5000 * curves.GPM,
	}, "testdata/messy.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	tr.Report.WriteTo(os.Stdout)
	// Output:
	// rows                                           27
	// kept                                           15
	// dropped                                        12
	// blank lines skipped                            3
	// lines before the header                        2
	//   too few fields                               1  dropped, line 10
	//   too many fields                              1  dropped, line 12
	//   other delimiter than the header              1  dropped, line 11
	//   blank timestamp                              1  dropped, line 13
	//   bad timestamp                                1  dropped, line 14
	//   local time skipped by daylight saving        1  dropped, line 7
	//   blank flow                                   1  dropped, line 15
	//   non-numeric flow                             1  dropped, line 16
	//   negative flow                                1  dropped, line 17
	//   absurd flow                                  1  dropped, line 27
	//   duplicate timestamp                          2  dropped, lines 24, 31
	//   out of order (sorted)                        1  kept, line 26
	//   repeated local hour (read as standard time)  1  kept, line 30
	//   non-numeric DP (ignored)                     1  kept, line 20
	//   negative DP (ignored)                        1  kept, line 21
	//   non-numeric power (ignored)                  1  kept, line 22
	//   negative power (ignored)                     1  kept, line 23
	// gaps                                           2  5700.00 h missing, longest 5693h0m0s
}

func ExampleBin() {
	tr, err := profile.ReadTrendFile(profile.TrendSpec{
		TimeColumn: "timestamp", FlowColumn: "plant_flow_gpm", FlowUnit: "gpm",
		DPColumn: "loop_dp_psi", DPUnit: "psi", TimeZone: "America/Chicago",
	}, "../examples/chilled-water-trend.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	b, err := profile.Bin(tr.Points, 400*curves.GPM)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("flow, gpm        h/yr  mean DP, psi")
	for _, fb := range b.Bins {
		fmt.Printf("%5.0f–%-5.0f  %7.0f  %11.2f\n", float64(fb.Low)/curves.GPM, float64(fb.High)/curves.GPM,
			fb.Hours, float64(fb.DP)*998.2*curves.Gravity/curves.PSI)
	}
	fmt.Printf("%d h in bins; cube-law binning error %+.2f %%\n", int(b.Hours), 100*b.CubeError)
	// Output:
	// flow, gpm        h/yr  mean DP, psi
	//   400–800        651        11.99
	//   800–1200      3001        12.00
	//  1200–1600      2947        12.00
	//  1600–2000      1423        12.01
	//  2000–2400       625        12.00
	//  2400–2800        77        11.71
	// 8724 h in bins; cube-law binning error +0.62 %
}
