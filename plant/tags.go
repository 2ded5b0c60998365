package plant

import (
	"fmt"
	"strings"
)

// maxTagLen bounds a unit tag: it is printed in tables and the sequence.
const maxTagLen = 24

// tagsAndStandby reads a pump model's unit tags and the number of its units
// held in standby. The model's Count becomes the units the plan may run
// (installed less standby); Standby keeps the rest, which the plan never
// runs and the one-unit-out check brings in for a failed unit.
func (d *decoder) tagsAndStandby(s *pumpSpec) {
	m, f, path := &s.model, s.f, s.path
	if n := d.value(f, "standby"); n != nil {
		if v, ok := d.integer(n, join(path, "standby")); ok {
			switch {
			case m.Count > 0 && (v < 0 || v >= m.Count):
				d.errorf(n, join(path, "standby"), "%d units in standby of %d installed: give from 0 to %d (at least one unit must be on duty)", v, m.Count, m.Count-1)
			default:
				m.Standby = v
			}
		}
	}
	if n := d.value(f, "tags"); n != nil {
		items, ok := d.sequence(n, join(path, "tags"), "one tag per installed unit")
		if ok {
			seen := map[string]bool{}
			var tags []string
			for i, it := range items {
				tp := index(join(path, "tags"), i)
				t, ok := d.text(it, tp)
				switch {
				case !ok:
				case strings.TrimSpace(t) == "" || len(t) > maxTagLen:
					d.errorf(it, tp, "a tag needs 1 to %d characters", maxTagLen)
				case seen[t]:
					d.errorf(it, tp, "tag %q is given twice", t)
				default:
					seen[t] = true
					tags = append(tags, t)
				}
			}
			if len(items) == len(tags) {
				if m.Count > 0 && len(tags) != m.Count {
					d.errorf(n, join(path, "tags"), "%d tags for %d installed units: give one tag per unit", len(tags), m.Count)
				} else {
					m.Tags = tags
				}
			}
		}
	}
	if m.Standby > 0 {
		m.Count -= m.Standby
	}
}

// Installed is the number of units of the model installed: on duty and in
// standby.
func (m Model) Installed() int { return m.Count + m.Standby }

// Tag names unit k (0-based among the installed units) of the model: its
// tag from the file, else the model's name and the unit's number.
func (m Model) Tag(k int) string {
	if k < len(m.Tags) {
		return m.Tags[k]
	}
	if m.Installed() == 1 {
		return m.Name
	}
	return fmt.Sprintf("%s #%d", m.Name, k+1)
}

// TagList names every installed unit of the model, comma-separated.
func (m Model) TagList() string {
	var out []string
	for k := 0; k < m.Installed(); k++ {
		out = append(out, m.Tag(k))
	}
	return strings.Join(out, ", ")
}
