package cmd

import "github.com/spf13/cobra"

// NewCmdBins builds `wattstage bins`.
func NewCmdBins(streams *IO, runF func(*IO) error) *cobra.Command {
	return &cobra.Command{Use: "bins TREND.csv", Short: "Bin a trend log by flow", Hidden: true}
}
