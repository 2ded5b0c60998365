package cmd_test

import (
	"bytes"
	"reflect"
	"testing"
	"time"

	"github.com/spf13/cobra"

	"wattstage/cmd"
)

// Flag parsing, apart from the work: each NewCmdX is given a run function
// that records the options it would run with.

func execute(t *testing.T, c *cobra.Command, args ...string) error {
	t.Helper()
	var sink bytes.Buffer
	c.SetArgs(args)
	c.SetOut(&sink)
	c.SetErr(&sink)
	c.SilenceUsage, c.SilenceErrors = true, true
	return c.Execute()
}

func TestPointFlags(t *testing.T) {
	cases := []struct {
		name string
		args []string
		want cmd.PointOptions
	}{
		{"flow only", []string{"p.yaml", "--flow", "1800"}, cmd.PointOptions{PlantPath: "p.yaml", Flow: "1800"}},
		{"percent and units", []string{"p.yaml", "--flow", "60%", "--units", "3"}, cmd.PointOptions{PlantPath: "p.yaml", Flow: "60%", Units: 3}},
		{"flags first", []string{"--json", "--common-speed", "--flow=450", "p.yaml"},
			cmd.PointOptions{PlantPath: "p.yaml", Flow: "450", CommonSpeed: true, JSON: true}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var got *cmd.PointOptions
			if err := execute(t, cmd.NewCmdPoint(&cmd.IO{}, func(o *cmd.PointOptions) error { got = o; return nil }), c.args...); err != nil {
				t.Fatal(err)
			}
			got.IO = nil
			if !reflect.DeepEqual(*got, c.want) {
				t.Errorf("options %+v, want %+v", *got, c.want)
			}
		})
	}
	called := false
	if err := execute(t, cmd.NewCmdPoint(&cmd.IO{}, func(*cmd.PointOptions) error { called = true; return nil }), "p.yaml"); err == nil || called {
		t.Errorf("point without --flow: error %v, run called %v; want an error before the run", err, called)
	}
}

func TestPlanFlags(t *testing.T) {
	var got *cmd.PlanOptions
	c := cmd.NewCmdPlan(&cmd.IO{}, func(o *cmd.PlanOptions) error { got = o; return nil })
	if err := execute(t, c, "p.yaml", "-o", "w.xlsx", "--force", "--baseline", "current", "--bin-width", "150", "--json"); err != nil {
		t.Fatal(err)
	}
	got.IO = nil
	want := cmd.PlanOptions{PlantPath: "p.yaml", Output: "w.xlsx", OutputSet: true, Force: true, Baseline: "current", BinWidth: "150", JSON: true}
	if !reflect.DeepEqual(*got, want) {
		t.Errorf("options %+v, want %+v", *got, want)
	}
	got = nil
	c = cmd.NewCmdPlan(&cmd.IO{}, func(o *cmd.PlanOptions) error { got = o; return nil })
	if err := execute(t, c, "p.yaml", "--output=w.xlsx"); err != nil || got.Output != "w.xlsx" || got.Force {
		t.Errorf("--output=w.xlsx: %v, %+v", err, got)
	}
}

func TestSetpointsFlags(t *testing.T) {
	var got *cmd.SetpointsOptions
	c := cmd.NewCmdSetpoints(&cmd.IO{}, func(o *cmd.SetpointsOptions) error { got = o; return nil })
	if err := execute(t, c, "p.yaml", "--deadband", "0.15", "--up-delay", "3m", "--down-delay", "15m", "--signal", "speed", "--json"); err != nil {
		t.Fatal(err)
	}
	got.IO = nil
	want := cmd.SetpointsOptions{PlantPath: "p.yaml", Deadband: 0.15, UpDelay: 3 * time.Minute, DownDelay: 15 * time.Minute, Signal: "speed", Format: "json", JSON: true}
	if !reflect.DeepEqual(*got, want) {
		t.Errorf("options %+v, want %+v", *got, want)
	}
	for _, bad := range [][]string{{"p.yaml", "--signal", "dp"}, {"p.yaml", "--format", "xml"}, {"p.yaml", "--deadband", "0.5"}, {"p.yaml", "--deadband", "-0.1"}} {
		called := false
		c := cmd.NewCmdSetpoints(&cmd.IO{}, func(*cmd.SetpointsOptions) error { called = true; return nil })
		if err := execute(t, c, bad...); err == nil || called {
			t.Errorf("%v: error %v, run called %v; want an error before the run", bad, err, called)
		}
	}
}

func TestBinsAndCheckFlags(t *testing.T) {
	var got *cmd.BinsOptions
	c := cmd.NewCmdBins(&cmd.IO{}, func(o *cmd.BinsOptions) error { got = o; return nil })
	if err := execute(t, c, "log.csv", "--plant", "p.yaml", "--flow-column", "CHW Flow", "--time-column", "Time",
		"--flow-unit", "L/s", "--power-column", "kW", "--time-zone", "Europe/Berlin", "--width", "20", "--json"); err != nil {
		t.Fatal(err)
	}
	got.IO = nil
	want := cmd.BinsOptions{TrendPath: "log.csv", PlantPath: "p.yaml", FlowColumn: "CHW Flow", TimeColumn: "Time",
		FlowUnit: "L/s", PowerColumn: "kW", TimeZone: "Europe/Berlin", Width: "20", JSON: true}
	if !reflect.DeepEqual(*got, want) {
		t.Errorf("options %+v, want %+v", *got, want)
	}
	var chk *cmd.CheckOptions
	if err := execute(t, cmd.NewCmdCheck(&cmd.IO{}, func(o *cmd.CheckOptions) error { chk = o; return nil }), "p.yaml"); err != nil || chk.PlantPath != "p.yaml" {
		t.Errorf("check p.yaml: %v, %+v", err, chk)
	}
}
