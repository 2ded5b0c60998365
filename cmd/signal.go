package cmd

import (
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"

	"wattstage/workbook"
)

// onSignal makes SIGINT and SIGTERM end the run cleanly: the temporary file
// of a workbook being written is removed (the earlier workbook, if any, is
// untouched), a line on errw says so, and the process exits with 128 plus
// the signal's number, as a shell reports a command a signal ended. It
// returns the function that stops the handling.
func onSignal(errw io.Writer) (stop func()) {
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, syscall.SIGINT, syscall.SIGTERM)
	done := make(chan struct{})
	go func() {
		select {
		case s := <-sigs:
			removed := workbook.AbortWrites()
			msg := fmt.Sprintf("wattstage: stopped by %v", s)
			for _, n := range removed {
				msg += "; removed the unfinished " + n
			}
			if len(removed) > 0 {
				msg += "; the earlier workbook, if any, is untouched"
			}
			fmt.Fprintln(errw, msg)
			code := 128 + 15
			if sig, ok := s.(syscall.Signal); ok {
				code = 128 + int(sig)
			}
			os.Exit(code)
		case <-done:
		}
	}()
	return func() {
		signal.Stop(sigs)
		close(done)
	}
}
