package chart

import (
	"strings"
	"testing"
	"unicode/utf8"
)

// A plot puts each point at its column and row: 0 on the baseline row, the
// top tick on the top row, months spread over the width; later series draw
// over earlier ones. Check values: the layout worked by hand (common
// practice, no source).
func TestPlot_Points(t *testing.T) {
	c := Plot{Width: 30, Rows: 5,
		Year: func(x int) (int, bool) { return 2027 + x/12, x%12 == 0 },
		Series: []PlotSeries{
			{Label: "planned", Rune: '.', X: []int{0, 12, 24}, Y: []float64{0, 20, 40}},
			{Label: "actual", Rune: 'o', X: []int{12}, Y: []float64{20}},
		}}
	lines := strings.Split(strings.TrimRight(c.String(), "\n"), "\n")
	if len(lines) != 8 {
		t.Fatalf("%d lines, want 5 rows, the baseline, the years and the key:\n%s", len(lines), c.String())
	}
	for i, l := range lines {
		if n := utf8.RuneCountInString(l); n > 30 {
			t.Errorf("line %d is %d wide, over 30: %q", i, n, l)
		}
	}
	col := func(l string, r rune) int { return strings.IndexRune(string([]rune(l)), r) }
	top, mid, bottom := lines[0], lines[2], lines[4]
	if !strings.HasPrefix(top, "40 ┤") || !strings.HasSuffix(top, ".") {
		t.Errorf("top row %q: want the tick 40 and the point of 40 at the right edge", top)
	}
	if !strings.HasPrefix(mid, "20 ┤") || strings.Count(mid, "o") != 1 || strings.Contains(mid, ".") {
		t.Errorf("middle row %q: want the tick 20 and only the actual's ring", mid)
	}
	if !strings.HasPrefix(bottom, " 0 ┤.") {
		t.Errorf("bottom row %q: want the tick 0 and the point of 0 in the first column", bottom)
	}
	if a, b := col(mid, 'o'), col(top, '.'); a <= 4 || b <= a {
		t.Errorf("the ring at column %d, the last point at %d: want the ring between the edges", a, b)
	}
	if !strings.Contains(lines[6], "2027") || !strings.Contains(lines[6], "2028") || strings.Contains(lines[6], "2029") {
		t.Errorf("years %q: want 2027 and 2028, and not 2029, which would run past the width", lines[6])
	}
	if lines[7] != "    . planned   o actual" {
		t.Errorf("key %q", lines[7])
	}
}

// Marks are drawn as rings, one a point, and keyed in the legend.
func TestLine_Marks(t *testing.T) {
	c := &Line{ID: "m", Title: "t", Desc: "d", Series: []Series{
		{Label: "planned", X: []float64{2027, 2028}, Y: []float64{0, 10}},
		{Label: "actual", Marks: true, X: []float64{2027.5, 2027.75}, Y: []float64{4, 6}},
	}}
	svg := c.SVG()
	if n := strings.Count(svg, "<circle"); n != 3 {
		t.Errorf("%d circles, want the 2 marks and 1 in the legend", n)
	}
	if n := strings.Count(svg, `class="series"`); n != 1 {
		t.Errorf("%d series paths, want 1 (marks are not joined)", n)
	}
}
