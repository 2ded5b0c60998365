package cmd

import (
	"bytes"
	"strings"
	"testing"
	"time"
)

func TestTimeLeft(t *testing.T) {
	cases := []struct {
		name  string
		spent time.Duration
		share float64
		want  string
		ok    bool
	}{
		{"too early to tell", time.Second, 0.01, "", false},
		{"done", time.Minute, 1, "", false},
		{"half done after 20 s", 20 * time.Second, 0.5, "about 20 s left", true},
		{"a quarter after 1 min", time.Minute, 0.25, "about 3 min left", true},
		{"nearly done", 30 * time.Second, 0.9, "a few seconds left", true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, ok := timeLeft(c.spent, c.share)
			if got != c.want || ok != c.ok {
				t.Errorf("timeLeft(%v, %g) = %q, %v; want %q, %v", c.spent, c.share, got, ok, c.want, c.ok)
			}
		})
	}
}

func TestProgressLine(t *testing.T) {
	var buf bytes.Buffer
	clock := time.Unix(0, 0)
	p := newProgressLine(&buf, func() time.Time { return clock })
	p.step("lowest power", 0, 4)
	clock = clock.Add(10 * time.Second)
	p.advance(0.25)
	p.clear()
	out := buf.String()
	for _, want := range []string{"[1/4] lowest power", "25 % solved", "about 30 s left"} {
		if !strings.Contains(out, want) {
			t.Errorf("progress %q lacks %q", out, want)
		}
	}
	if !strings.HasSuffix(out, "\r") {
		t.Errorf("progress %q does not end by blanking its line", out)
	}
	var nilLine *progressLine
	nilLine.clear() // silent: no terminal
}
