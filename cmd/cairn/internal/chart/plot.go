package chart

import (
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// A Plot is a terminal chart of values over months, one character a point:
// each series drawn with its own rune, later series over earlier ones where
// they meet. X is a month count (any origin); the X labels are whole years.
type Plot struct {
	Series []PlotSeries
	// Year returns the calendar year of month x and whether x is its
	// January, for the X labels.
	Year  func(x int) (int, bool)
	Width int // the whole chart's width in characters, labels included (default 80)
	Rows  int // rows of the plot area (default 10)
}

// A PlotSeries is one series of a Plot: Y[i] at month X[i].
type PlotSeries struct {
	Label string
	Rune  rune
	X     []int
	Y     []float64
}

// String draws the plot: a Y axis from 0 labelled in thousands or
// millions, the points, a baseline, the years under it, and a key of the
// series' runes. It never emits escape codes.
func (c Plot) String() string {
	width, rows := c.Width, c.Rows
	if width <= 0 {
		width = 80
	}
	if rows <= 0 {
		rows = 10
	}
	xlo, xhi, yhi := math.MaxInt, math.MinInt, 0.0
	for _, s := range c.Series {
		for i, x := range s.X {
			xlo, xhi, yhi = min(xlo, x), max(xhi, x), math.Max(yhi, s.Y[i])
		}
	}
	if xlo > xhi {
		return ""
	}
	ticks, step := Ticks(0, yhi, rows/2)
	top := ticks[len(ticks)-1]
	labelW := 0
	for _, t := range ticks {
		labelW = max(labelW, utf8.RuneCountInString(Compact(t, step)))
	}
	cols := width - labelW - 2
	span := max(xhi-xlo, 1)
	col := func(x int) int { return (x - xlo) * (cols - 1) / span }
	row := func(y float64) int { // 0 at the top
		if top <= 0 {
			return rows - 1
		}
		return min(rows-1, max(0, rows-1-int(math.Round(math.Max(y, 0)/top*float64(rows-1)))))
	}
	grid := make([][]rune, rows)
	for r := range grid {
		grid[r] = []rune(strings.Repeat(" ", cols))
	}
	for _, s := range c.Series {
		for i, x := range s.X {
			grid[row(s.Y[i])][col(x)] = s.Rune
		}
	}
	// a Y label on the rows nearest each tick
	labels := map[int]string{}
	for _, t := range ticks {
		labels[row(t)] = Compact(t, step)
	}
	var b strings.Builder
	for r := range grid {
		if l, ok := labels[r]; ok {
			b.WriteString(pad(l, labelW) + " ┤")
		} else {
			b.WriteString(strings.Repeat(" ", labelW) + " │")
		}
		b.WriteString(strings.TrimRight(string(grid[r]), " ") + "\n")
	}
	b.WriteString(strings.Repeat(" ", labelW) + " └" + strings.Repeat("─", cols) + "\n")
	// the years, at their Januaries, never overlapping
	axis := []rune(strings.Repeat(" ", width+4))
	next := 0
	if c.Year != nil {
		for x := xlo; x <= xhi; x++ {
			y, jan := c.Year(x)
			if !jan && x != xlo {
				continue
			}
			at := labelW + 2 + col(x)
			lab := []rune(strconv.Itoa(y))
			if at < next || at+len(lab) > width {
				continue
			}
			copy(axis[at:], lab)
			next = at + len(lab) + 2
		}
	}
	b.WriteString(strings.TrimRight(string(axis), " ") + "\n")
	var key []string
	for _, s := range c.Series {
		key = append(key, string(s.Rune)+" "+s.Label)
	}
	indent := strings.Repeat(" ", labelW+2)
	if line := indent + strings.Join(key, "   "); utf8.RuneCountInString(line) <= width {
		b.WriteString(line + "\n")
	} else {
		for _, k := range key {
			b.WriteString(indent + k + "\n")
		}
	}
	return b.String()
}
