package curves

// ShutoffPower returns the fitted shaft power at zero flow and rated speed
// for a fluid of the given density: the limit of ρ g Q H₀(Q) / η₀(Q) as
// Q → 0, which is ρ g H₀(0) · scale / c₁ for the efficiency fit through the
// origin η₀(Q) = c₁ (Q/scale) + …. The fit does not use a shutoff shaft
// power given on the datasheet (it has no efficiency to fit); compare the
// two with this.
func (p *Pump) ShutoffPower(density float64) Power { return p.ShaftPower(0, 1, density) }

// ShutoffPoint returns the index of the datasheet point at zero flow that
// gives a shaft power, or −1.
func (p *Pump) ShutoffPoint() int {
	for i, pt := range p.Points {
		if pt.Flow == 0 && pt.Shaft > 0 {
			return i
		}
	}
	return -1
}

// DatasheetBest returns the index of the datasheet point with the highest
// efficiency (given, or from its shaft power), the first of equals; −1 when
// no point with flow has one.
func (p *Pump) DatasheetBest() int {
	best := -1
	for i, pt := range p.Points {
		if pt.Flow > 0 && pt.Eff > 0 && (best < 0 || pt.Eff > p.Points[best].Eff) {
			best = i
		}
	}
	return best
}
