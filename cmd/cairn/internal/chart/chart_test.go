package chart

import (
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"
)

// Tick steps of 1, 2 or 5 times a power of ten: common practice, no source.
func TestTicks(t *testing.T) {
	tests := []struct {
		lo, hi float64
		n      int
		want   []float64
		step   float64
	}{
		{0, 1512858.22, 4, []float64{0, 500000, 1000000, 1500000, 2000000}, 500000},
		{0, 64226.59, 4, []float64{0, 20000, 40000, 60000, 80000}, 20000},
		{-3, 17, 5, []float64{-5, 0, 5, 10, 15, 20}, 5},
		{0, 0, 4, []float64{0, 0.5, 1}, 0.5},
		{0, 100, 5, []float64{0, 20, 40, 60, 80, 100}, 20},
		{2500, 2500, 2, []float64{0, 2000, 4000}, 2000},
	}
	for _, tt := range tests {
		got, step := Ticks(tt.lo, tt.hi, tt.n)
		if step != tt.step || !equalFloats(got, tt.want) {
			t.Errorf("Ticks(%v, %v, %d) = %v, %v; want %v, %v", tt.lo, tt.hi, tt.n, got, step, tt.want, tt.step)
		}
	}
}

func equalFloats(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

func TestCompact(t *testing.T) {
	tests := []struct {
		v, step float64
		want    string
	}{
		{0, 1, "0"},
		{1500000, 500000, "1.5M"},
		{2000000, 500000, "2.0M"},
		{250000, 50000, "250k"},
		{2500, 500, "2.5k"},
		{120, 20, "120"},
		{1234567, 1000, "1.235M"},
		{1e9, 5e8, "1.0bn"},
		{-50000, 25000, "-50k"},
		{1500000000000, 500000000000, "1,500bn"},
	}
	for _, tt := range tests {
		if got := Compact(tt.v, tt.step); got != tt.want {
			t.Errorf("Compact(%v, %v) = %q, want %q", tt.v, tt.step, got, tt.want)
		}
	}
}

// TestBars_Small checks a chart worked out by hand: top 10 over 4 rows of
// 2.5 each, labels on the rows whose top edge is 10 and 5; 3 is 9.6
// eighths of 32, rounded to 10: a full bottom row and 2/8 of the next.
func TestBars_Small(t *testing.T) {
	c := Bars{Values: []float64{0, 3, 5, 10}, Labels: []string{"a", "b", "c", "d"}, Width: 20, Rows: 4}
	want := "" +
		"10 ┤            ███\n" +
		"   │            ███\n" +
		" 5 ┤    ▂▂▂ ███ ███\n" +
		"   │    ███ ███ ███\n" +
		" 0 └────────────────\n" +
		"    a   b   c   d\n"
	if got := c.String(); got != want {
		t.Errorf("Bars.String() =\n%s\nwant\n%s", got, want)
	}
}

// TestBars_Marks is TestBars_Small with a level at 7.5 and the third bar
// marked, worked out by hand: 7.5 is nearest the top edge of the second row
// (7.5), so the dotted line runs there; the mark is the middle of the third
// bar's three characters, above its bar and on the baseline.
func TestBars_Marks(t *testing.T) {
	c := Bars{Values: []float64{0, 3, 5, 10}, Labels: []string{"a", "b", "c", "d"}, Width: 20, Rows: 4,
		Level: &Level{Label: "t", Value: 7.5}, Column: &Column{Label: "d", Index: 2}}
	want := "" +
		"10 ┤         ┆  ███\n" +
		"   │┄┄┄┄┄┄┄┄┄┆┄┄███┄\n" +
		" 5 ┤    ▂▂▂ ███ ███\n" +
		"   │    ███ ███ ███\n" +
		" 0 └─────────┴──────\n" +
		"    a   b   c   d\n" +
		"    ┄ t   ┆ d\n"
	if got := c.String(); got != want {
		t.Errorf("Bars.String() =\n%s\nwant\n%s", got, want)
	}
}

// TestBars_Readable checks, over many ranges and widths, that the Y axis
// labels at least three values, that a level above every bar is still
// drawn, that the marked column shows on the baseline, and that every line
// fits the width without escape codes.
func TestBars_Readable(t *testing.T) {
	for _, hi := range []float64{0, 0.4, 1, 8.1, 10, 99, 1234.5, 55000, 64226.59, 2.2e6, 7e9} {
		for _, n := range []int{1, 3, 12, 55, 200} {
			for _, width := range []int{40, 80} {
				c := Bars{Width: width, Rows: 8, Level: &Level{Label: "target", Value: hi * 1.3}, Column: &Column{Label: "deadline", Index: n / 2}}
				for i := 0; i < n; i++ {
					c.Values = append(c.Values, hi*float64(i+1)/float64(n))
					c.Labels = append(c.Labels, strconv.Itoa(2000+i))
				}
				s := c.String()
				lines := strings.Split(strings.TrimSuffix(s, "\n"), "\n")
				labels := 0
				for _, l := range lines {
					if strings.Contains(l, "┤") || strings.Contains(l, "└") {
						labels++
					}
					if w := utf8.RuneCountInString(l); w > width {
						t.Errorf("hi %v, %d values, width %d: line of %d characters: %q", hi, n, width, w, l)
					}
				}
				if labels < 3 {
					t.Errorf("hi %v, %d values: %d Y labels, want at least 3:\n%s", hi, n, labels, s)
				}
				if hi > 0 && !strings.Contains(s, "┄┄") {
					t.Errorf("hi %v, %d values: the level is not drawn:\n%s", hi, n, s)
				}
				if !strings.Contains(s, "┴") || !strings.Contains(s, "┆ deadline") {
					t.Errorf("hi %v, %d values: the column is not marked:\n%s", hi, n, s)
				}
				if strings.ContainsRune(s, 0x1b) {
					t.Errorf("escape code in the chart")
				}
			}
		}
	}
}

func TestBars_Fits(t *testing.T) {
	var vals []float64
	var labels []string
	var keys []int
	for i := 0; i < 200; i++ {
		vals = append(vals, float64(i*1000))
		labels = append(labels, strconv.Itoa(2000+i))
		keys = append(keys, 2000+i)
	}
	for _, width := range []int{40, 80} {
		c := Bars{Values: vals, Labels: labels, Keys: keys, Width: width, Runs: []int{2, 3, 4, 5, 10}}
		s := c.String()
		if strings.ContainsRune(s, 0x1b) {
			t.Errorf("width %d: the chart has an escape sequence", width)
		}
		lines := strings.Split(strings.TrimSuffix(s, "\n"), "\n")
		for _, l := range lines {
			if n := utf8.RuneCountInString(l); n > width {
				t.Errorf("width %d: line of %d characters: %q", width, n, l)
			}
		}
		k := c.PerBar()
		if k < 2 || k*(width-8) < len(vals) {
			t.Errorf("width %d: %d values a bar cannot fit 200 values", width, k)
		}
		// the last value, the highest, is drawn: the last bar reaches the top row
		top := []rune(lines[0])
		if top[len(top)-1] == ' ' || top[len(top)-1] == '│' {
			t.Errorf("width %d: the last value is not drawn to the top:\n%s", width, s)
		}
		if !strings.Contains(lines[len(lines)-1], "2199") && k == 1 {
			t.Errorf("width %d: no label for the last year", width)
		}
	}
}

// TestLine_SVG checks the SVG is well-formed, named and described, that
// every point falls inside the plot area, and that series differ by dash.
func TestLine_SVG(t *testing.T) {
	c := &Line{ID: "c1", Title: "A <title> & more", Desc: "what it shows", YUnit: "USD",
		Series: []Series{
			{Label: "nominal", X: []float64{2027, 2028, 2029}, Y: []float64{100, 2000, 1500}, Dash: Solid, Width: 2.75},
			{Label: "real", X: []float64{2027, 2028, 2029}, Y: []float64{100, 1900, 1300}, Dash: Dashed, Width: 1.5},
		},
		Band:   &Band{Label: "band", X: []float64{2027, 2028, 2029}, Lo: []float64{100, 1200, 900}, Hi: []float64{100, 2600, 2900}},
		HRules: []Rule{{Label: "target", At: 2500}},
		VRules: []Rule{{Label: "deadline", At: 2028.5}},
	}
	s := c.SVG()
	d := xml.NewDecoder(strings.NewReader(s))
	var names []string
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatalf("the SVG is not well-formed: %v\n%s", err, s)
		}
		if se, ok := tok.(xml.StartElement); ok {
			names = append(names, se.Name.Local)
		}
	}
	if len(names) < 3 || names[0] != "svg" || names[1] != "title" || names[2] != "desc" {
		t.Errorf("the SVG begins %v, want svg, title, desc", names[:min(3, len(names))])
	}
	if !strings.Contains(s, "A &lt;title&gt; &amp; more") {
		t.Errorf("the title is not escaped")
	}
	paths := regexp.MustCompile(`<path class="series" d="([^"]*)"[^>]*>`).FindAllStringSubmatch(s, -1)
	if len(paths) != 2 {
		t.Fatalf("%d series paths, want 2", len(paths))
	}
	if strings.Contains(paths[0][0], "dasharray") || !strings.Contains(paths[1][0], `stroke-dasharray="7 4"`) {
		t.Errorf("the solid and the dashed series are not told apart by their dash:\n%s\n%s", paths[0][0], paths[1][0])
	}
	band := regexp.MustCompile(`<path class="band" d="([^"]*)"`).FindStringSubmatch(s)
	if band == nil {
		t.Fatal("no band")
	}
	for _, p := range append([]string{band[1]}, paths[0][1], paths[1][1]) {
		for _, pt := range regexp.MustCompile(`[ML]([-0-9.]+),([-0-9.]+)`).FindAllStringSubmatch(p, -1) {
			x, _ := strconv.ParseFloat(pt[1], 64)
			y, _ := strconv.ParseFloat(pt[2], 64)
			if x < plotL-0.01 || x > plotR+0.01 || y < plotT-0.01 || y > plotB+0.01 {
				t.Errorf("point %v,%v is outside the plot area", x, y)
			}
		}
	}
	// the highest value (the band's 2,900) sets the top tick, 3,000 in steps of 1,000
	if !strings.Contains(s, ">3k</text>") {
		t.Errorf("no 3k tick on the Y axis")
	}
	for _, lab := range []string{">target</text>", ">deadline</text>", ">nominal</text>", ">real</text>", ">band</text>", ">2028</text>"} {
		if !strings.Contains(s, lab) {
			t.Errorf("the SVG lacks %s", lab)
		}
	}
	if bytes.ContainsAny([]byte(s), "\x1b") {
		t.Error("escape character in SVG")
	}
}
