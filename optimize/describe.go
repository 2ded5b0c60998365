package optimize

import (
	"fmt"

	"wattstage/plant"
)

// describeCounts writes a combination as "2 × CHWP-A + 1 × CHWP-B".
// DescribeCounts names a combination of running units, e.g. "2 × L + 1 × S".
func DescribeCounts(p *plant.Plant, cnt []int) string {
	s := ""
	for i, n := range cnt {
		if n == 0 {
			continue
		}
		if s != "" {
			s += " + "
		}
		s += fmt.Sprintf("%d × %s", n, p.Models[i].Name)
	}
	if s == "" {
		return "no unit"
	}
	return s
}

func sum(v []int) int {
	n := 0
	for _, x := range v {
		n += x
	}
	return n
}
