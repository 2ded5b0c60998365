package handover

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"

	"wattstage/plant"
)

// fieldWords are the plain words for the plant file's field names, as the
// Summary's assumptions say them to an owner who never saw the file.
var fieldWords = map[string]string{
	"name":                 "plant name",
	"fluid":                "fluid",
	"count":                "units installed",
	"min_speed":            "minimum speed",
	"max_speed":            "maximum speed",
	"head_fit":             "head curve fit",
	"speed_correction":     "efficiency at reduced speed",
	"motor":                "motor",
	"full_load_efficiency": "full-load efficiency",
	"service_factor":       "service factor",
	"part_load":            "part-load losses",
	"drive":                "drive",
	"min_flow":             "minimum flow",
	"runout":               "runout flow",
	"branch_loss":          "branch loss",
	"flow":                 "reference flow",
	"profile":              "load profile",
	"trend":                "trend log",
	"time_column":          "time column",
	"flow_column":          "flow column",
	"flow_unit":            "flow unit",
	"dp_unit":              "DP unit",
	"tariff":               "tariff",
	"demand_charge":        "demand charge",
	"emissions_factor":     "emissions factor",
	"days":                 "days",
	"retrofit":             "retrofit",
	"other_cost":           "other one-off cost",
	"life_years":           "appraisal life",
	"discount_rate":        "discount rate",
	"escalation":           "energy price escalation",
	"sequence":             "current sequence",
	"stage_up_delay":       "stage-up delay",
	"stage_down_delay":     "stage-down delay",
	"system":               "system",
	"plant_min_flow":       "plant minimum flow",
}

var indexed = regexp.MustCompile(`^([a-z_]+)\[(\d+)\]$`)

// plainDefaults are the plant's defaults with each field path ("pumps[0].
// motor.part_load: …") said in words ("CHWP-1..3, motor part-load losses:
// …"): the model's name for pumps[i], the period's name for a tariff
// period, and plain words for each field.
func plainDefaults(p *plant.Plant) []string {
	out := make([]string, 0, len(p.Defaults))
	for _, d := range p.Defaults {
		path, rest, ok := strings.Cut(d, ": ")
		if !ok || strings.ContainsAny(path, " ") {
			out = append(out, d)
			continue
		}
		out = append(out, capitalise(fieldPhrase(p, path))+": "+rest)
	}
	return out
}

// fieldPhrase says a field path in words.
func fieldPhrase(p *plant.Plant, path string) string {
	var subject string
	var words []string
	for _, seg := range strings.Split(path, ".") {
		if m := indexed.FindStringSubmatch(seg); m != nil {
			i, _ := strconv.Atoi(m[2])
			switch {
			case m[1] == "pumps" && i < len(p.Models):
				subject = p.Models[i].Name
			case m[1] == "periods" && i < len(p.Tariff.Periods):
				words = append(words, fmt.Sprintf("%s period (%d)", p.Tariff.Periods[i].Name, i+1))
			default:
				words = append(words, fmt.Sprintf("%s %d", word(m[1]), i+1))
			}
			continue
		}
		words = append(words, word(seg))
	}
	phrase := strings.Join(words, " ")
	if subject != "" {
		return subject + ", " + phrase
	}
	return phrase
}

func word(seg string) string {
	if w, ok := fieldWords[seg]; ok {
		return w
	}
	return strings.ReplaceAll(seg, "_", " ")
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	r := []rune(s)
	if r[0] >= 'a' && r[0] <= 'z' {
		r[0] -= 'a' - 'A'
	}
	return string(r)
}
