package curves

// ScaledLoss wraps a drive (or an across-the-line start) and scales every
// loss between shaft and wire by Factor (1 = unchanged): the motor's and the
// drive's alike. The savings range uses it to ask how savings depend on the
// motor and drive part-load defaults, which are the least certain inputs.
type ScaledLoss struct {
	Drive  Drive
	Factor float64
}

var _ Drive = ScaledLoss{}

func (d ScaledLoss) Variable() bool   { return d.Drive.Variable() }
func (d ScaledLoss) Describe() string { return d.Drive.Describe() }

// Electrical is shaft + Factor × (the wrapped drive's input − shaft).
func (d ScaledLoss) Electrical(m Motor, shaft Power, speed float64) Power {
	return shaft + Power(d.Factor*float64(d.Drive.Electrical(m, shaft, speed)-shaft))
}

// Input scales the wrapped chain's loss and keeps the proportions of the
// motor's and the drive's shares.
func (d ScaledLoss) Input(m Motor, shaft Power, speed float64) Chain {
	c := d.Drive.Input(m, shaft, speed)
	loss := float64(c.Electrical - c.Shaft)
	c.Electrical = c.Shaft + Power(d.Factor*loss)
	if c.MotorEff > 0 && c.DriveEff > 0 {
		motorLoss := float64(shaft)/c.MotorEff - float64(shaft)
		motorIn := float64(shaft) + d.Factor*motorLoss
		c.MotorEff = float64(shaft) / motorIn
		c.DriveEff = motorIn / float64(c.Electrical)
	}
	return c
}

// Rewire returns repl standing in for old with old's loss scale kept: a
// fixed-speed or partial-retrofit variant of a plant whose losses were
// scaled keeps the same scale on its across-the-line motors, so that a
// sensitivity case varies the baseline and the studied strategy alike.
func Rewire(old, repl Drive) Drive {
	if s, ok := old.(ScaledLoss); ok {
		if _, already := repl.(ScaledLoss); !already {
			return ScaledLoss{Drive: repl, Factor: s.Factor}
		}
	}
	return repl
}
