package cmd

import "github.com/spf13/cobra"

// NewCmdSetpoints builds `wattstage setpoints`.
func NewCmdSetpoints(streams *IO, runF func(*IO) error) *cobra.Command {
	return &cobra.Command{Use: "setpoints PLANT.yaml", Short: "Staging setpoints a controls contractor can program", Hidden: true}
}
