package study_test

import (
	"bufio"
	"bytes"
	"encoding/json"
	"os"
	"reflect"
	"regexp"
	"strings"
	"testing"

	"wattstage/study"
)

// jsonKeys lists every JSON key of a struct type, nested structs and
// slices of structs included.
func jsonKeys(t reflect.Type, into map[string]bool) {
	for t.Kind() == reflect.Pointer || t.Kind() == reflect.Slice {
		t = t.Elem()
	}
	if t.Kind() != reflect.Struct || t.PkgPath() == "time" {
		return
	}
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if name == "" || name == "-" {
			continue
		}
		into[name] = true
		jsonKeys(f.Type, into)
	}
}

// The JSON reference page documents every key the document and its detail
// records carry, and names no key they do not: it cannot drift from the code.
func TestJSONReferenceDocumentsEveryKey(t *testing.T) {
	b, err := os.ReadFile("../docs/plan-json.md")
	if err != nil {
		t.Fatal(err)
	}
	doc := string(b)
	keys := map[string]bool{}
	jsonKeys(reflect.TypeOf(study.JSON{}), keys)
	jsonKeys(reflect.TypeOf(study.JSONStep{}), keys)
	for k := range keys {
		if !strings.Contains(doc, "`"+k+"`") {
			t.Errorf("docs/plan-json.md does not document the key %q", k)
		}
	}
	// The first column of every table names keys (a cell may name two).
	row := regexp.MustCompile("(?m)^\\| `([a-z_0-9]+)`(?:, `([a-z_0-9]+)`)? \\|")
	for _, m := range row.FindAllStringSubmatch(doc, -1) {
		for _, k := range m[1:] {
			if k != "" && !keys[k] {
				t.Errorf("docs/plan-json.md documents %q, which the JSON does not have", k)
			}
		}
	}
}

// The document is snake_case throughout, carries its schema version, and
// --detail streams JSON Lines: the document, then one step record per step
// of each strategy.
func TestJSONShape(t *testing.T) {
	r := runPlant(t, examplePlant(t, "chilled-water.yaml"), noRange)
	var buf bytes.Buffer
	if err := r.WriteJSON(&buf, false); err != nil {
		t.Fatal(err)
	}
	var doc map[string]any
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if v := doc["schema_version"]; v != float64(study.SchemaVersion) {
		t.Errorf("schema_version %v", v)
	}
	snake := regexp.MustCompile(`^[a-z][a-z0-9_]*$`)
	var walk func(path string, v any)
	walk = func(path string, v any) {
		switch x := v.(type) {
		case map[string]any:
			for k, c := range x {
				if !snake.MatchString(k) {
					t.Errorf("%s: key %q is not snake_case", path, k)
				}
				walk(path+"."+k, c)
			}
		case []any:
			for _, c := range x {
				walk(path+"[]", c)
			}
		}
	}
	walk("", doc)
	buf.Reset()
	if err := r.WriteJSON(&buf, true); err != nil {
		t.Fatal(err)
	}
	sc := bufio.NewScanner(&buf)
	sc.Buffer(make([]byte, 1<<20), 1<<24)
	lines := 0
	for sc.Scan() {
		var rec map[string]any
		if err := json.Unmarshal(sc.Bytes(), &rec); err != nil {
			t.Fatalf("line %d: %v", lines+1, err)
		}
		if lines > 0 && rec["record"] != "step" {
			t.Errorf("line %d: record %v, want step", lines+1, rec["record"])
		}
		lines++
	}
	if want := 1 + len(r.Strategies)*len(r.Steps); lines != want {
		t.Errorf("%d JSON lines, want the document and %d × %d steps", lines, len(r.Strategies), len(r.Steps))
	}
}
