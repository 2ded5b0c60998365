package plant_test

import (
	"bufio"
	"go/ast"
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"wattstage/plant"
)

// The plant-file reference, docs/plant-file.md, is kept from drifting by
// the tests below: every YAML example on it loads, and its field tables
// list exactly the keys the loader accepts.

const referencePage = "../docs/plant-file.md"

// TestReferenceExamplesLoad loads every ```yaml block of the reference as
// a whole plant file.
func TestReferenceExamplesLoad(t *testing.T) {
	blocks := yamlBlocks(t, referencePage)
	if len(blocks) < 2 {
		t.Fatalf("found %d YAML examples in %s; the page shows at least a US and an SI file", len(blocks), referencePage)
	}
	for _, b := range blocks {
		t.Run("line "+strconv.Itoa(b.line), func(t *testing.T) {
			// dir "" leaves a trend path unchecked: the page's trend file
			// is an example name.
			if _, err := plant.Parse("plant-file.md:"+strconv.Itoa(b.line), []byte(b.text), ""); err != nil {
				t.Errorf("the example at %s:%d does not load:\n%v", referencePage, b.line, err)
			}
		})
	}
}

// TestReferenceDocumentsEveryField reads the keys every d.mapping call of
// the loader accepts from the loader's source, and the fields the page's
// tables document (`pumps[].motor.rated_output`). The keys of one mapping
// must be documented together under one parent, and every documented
// parent's fields must be keys of one mapping: a field added to the loader
// and not to the page fails, and so does a field the page keeps after the
// loader dropped it.
func TestReferenceDocumentsEveryField(t *testing.T) {
	mappings := loaderMappings(t)
	if len(mappings) < 15 {
		t.Fatalf("found %d d.mapping calls in the loader; the source scan no longer sees them", len(mappings))
	}
	documented := documentedFields(t, referencePage)
	children := map[string][]string{} // parent path → documented keys
	for f := range documented {
		parent, key := splitPath(f)
		children[parent] = append(children[parent], key)
	}
	for _, m := range mappings {
		found := false
		for _, keys := range children {
			if containsAll(keys, m.keys) {
				found = true
				break
			}
		}
		if !found {
			var missing []string
			// Name the parent that documents most of the keys.
			best, bestN := "", -1
			for p, keys := range children {
				n := 0
				for _, k := range m.keys {
					if slices.Contains(keys, k) {
						n++
					}
				}
				if n > bestN {
					best, bestN = p, n
				}
			}
			for _, k := range m.keys {
				if !slices.Contains(children[best], k) {
					missing = append(missing, k)
				}
			}
			t.Errorf("%s: the loader accepts %v there (%s); %s does not document %v under %q",
				m.pos, m.keys, m.what, referencePage, missing, best)
		}
	}
	for parent, keys := range children {
		found := false
		for _, m := range mappings {
			if containsAll(m.keys, keys) {
				found = true
				break
			}
		}
		if !found {
			t.Errorf("%s documents %v under %q, which no mapping of the loader accepts together", referencePage, keys, parent)
		}
	}
}

type yamlBlock struct {
	line int
	text string
}

// yamlBlocks returns the fenced ```yaml blocks of a Markdown file.
func yamlBlocks(t *testing.T, path string) []yamlBlock {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var blocks []yamlBlock
	var cur *yamlBlock
	sc := bufio.NewScanner(f)
	for n := 1; sc.Scan(); n++ {
		line := sc.Text()
		switch {
		case cur == nil && strings.TrimSpace(line) == "```yaml":
			cur = &yamlBlock{line: n + 1}
		case cur != nil && strings.TrimSpace(line) == "```":
			blocks = append(blocks, *cur)
			cur = nil
		case cur != nil:
			cur.text += line + "\n"
		}
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return blocks
}

var fieldRow = regexp.MustCompile("^\\| `([a-z_\\[\\]\\.]+)` \\|")

// documentedFields returns the field paths in the first column of the
// page's tables.
func documentedFields(t *testing.T, path string) map[string]bool {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	fields := map[string]bool{}
	inFieldTable := false
	for _, line := range strings.Split(string(b), "\n") {
		if strings.HasPrefix(line, "| field |") {
			inFieldTable = true
			continue
		}
		if !strings.HasPrefix(line, "|") {
			inFieldTable = false
			continue
		}
		if m := fieldRow.FindStringSubmatch(line); m != nil && inFieldTable {
			fields[m[1]] = true
		}
	}
	return fields
}

// splitPath splits "pumps[].motor.rated_output" into its parent
// "pumps[].motor" and key "rated_output"; a top-level key has parent "".
func splitPath(p string) (string, string) {
	i := strings.LastIndex(p, ".")
	if i < 0 {
		return "", p
	}
	return p[:i], p[i+1:]
}

func containsAll(have, want []string) bool {
	for _, w := range want {
		if !slices.Contains(have, w) {
			return false
		}
	}
	return true
}

// mapping is one d.mapping call of the loader: the keys it accepts.
type mapping struct {
	pos  string
	what string
	keys []string
}

// loaderMappings parses the loader's Go source and returns, for every call
// d.mapping(node, path, what, keys...), the keys as string literals or as
// the package-level []string variable passed with "...".
func loaderMappings(t *testing.T) []mapping {
	t.Helper()
	fset := token.NewFileSet()
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	var parsed []*ast.File
	vars := map[string][]string{}
	for _, name := range files {
		if strings.HasSuffix(name, "_test.go") {
			continue
		}
		f, err := parser.ParseFile(fset, name, nil, 0)
		if err != nil {
			t.Fatal(err)
		}
		parsed = append(parsed, f)
		for _, decl := range f.Decls {
			g, ok := decl.(*ast.GenDecl)
			if !ok || g.Tok != token.VAR {
				continue
			}
			for _, spec := range g.Specs {
				vs := spec.(*ast.ValueSpec)
				for i, id := range vs.Names {
					if i < len(vs.Values) {
						if cl, ok := vs.Values[i].(*ast.CompositeLit); ok {
							vars[id.Name] = stringLits(cl.Elts)
						}
					}
				}
			}
		}
	}
	var out []mapping
	for _, f := range parsed {
		ast.Inspect(f, func(n ast.Node) bool {
			call, ok := n.(*ast.CallExpr)
			if !ok {
				return true
			}
			sel, ok := call.Fun.(*ast.SelectorExpr)
			if !ok || sel.Sel.Name != "mapping" || len(call.Args) < 4 {
				return true
			}
			m := mapping{pos: fset.Position(call.Pos()).String()}
			if lit, ok := call.Args[2].(*ast.BasicLit); ok {
				m.what, _ = strconv.Unquote(lit.Value)
			}
			rest := call.Args[3:]
			if call.Ellipsis.IsValid() && len(rest) == 1 {
				id, ok := rest[0].(*ast.Ident)
				if !ok || vars[id.Name] == nil {
					t.Errorf("%s: cannot resolve the keys %v of this mapping", m.pos, rest[0])
					return true
				}
				m.keys = vars[id.Name]
			} else {
				m.keys = stringLits(rest)
				if len(m.keys) != len(rest) {
					t.Errorf("%s: a key of this mapping is not a string literal", m.pos)
				}
			}
			out = append(out, m)
			return true
		})
	}
	return out
}

func stringLits(es []ast.Expr) []string {
	var out []string
	for _, e := range es {
		if lit, ok := e.(*ast.BasicLit); ok && lit.Kind == token.STRING {
			if s, err := strconv.Unquote(lit.Value); err == nil {
				out = append(out, s)
			}
		}
	}
	return out
}
