package curves

// doeFloor is the least combined motor-and-drive input the DOE default may
// give: the motor alone at that load, shaft plus the motor's own part-load
// loss (the appendix A motor loss factor, or the user's table). The
// appendix A motor-and-drive polynomial is a fit that, at light load,
// falls below the motor's own loss, as if the drive had negative losses;
// the floor removes that gain and leaves the fit untouched where it is
// above. The drive's own loss is then not modelled (shown at 100 %), which
// still understates the input a little at very light load.
func doeFloor(m Motor, shaft Power) Power {
	return shaft + m.Loss(shaft)
}
