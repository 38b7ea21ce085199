package chart

import (
	"math"
	"strings"
	"unicode/utf8"
)

// Bars is a bar chart drawn in Unicode block characters, one column per
// value, for a terminal. It uses no colour and no escape sequences.
type Bars struct {
	Values []float64 // one bar each; negative values are drawn as 0
	Labels []string  // the X label of each value, e.g. the year
	// Keys align the X labels: a label is written under a bar whose key is
	// a multiple of the label step, so that years read 2030, 2040, … When
	// Keys is nil, labels are written every step bars from the first.
	Keys  []int
	Steps []int // label steps to choose from, smallest first (default 1, 2, 5, 10, 20, 50)
	Width int   // the whole chart's width in characters, labels included (default 80)
	Rows  int   // about this many rows of bars (default 8)
	// Runs are the numbers of values a bar may stand for when there are
	// more values than columns, smallest first (e.g. 3, 6, 12 for months);
	// when none is large enough, or Runs is empty, the smallest run that fits.
	Runs []int
	// Level marks a value across the chart with a dotted line, such as the
	// target; the scale reaches it. Column marks one value's bar with a
	// dotted line above it and a tick on the baseline, such as the
	// deadline. Each is named in a key line under the X labels.
	Level  *Level
	Column *Column
}

// A Level is a value marked across a bar chart.
type Level struct {
	Label string // the key's words, e.g. "target 55,000.00"
	Value float64
}

// A Column marks the bar of one value.
type Column struct {
	Label string // the key's words, e.g. "deadline 2040-08"
	Index int    // into Values
}

// eighths are the blocks one to seven eighths high.
var eighths = []rune{'▁', '▂', '▃', '▄', '▅', '▆', '▇'}

// PerBar returns how many values each bar stands for: 1 when every value
// fits the width, otherwise k, with each bar the last value of a run of k
// (so the final value is always drawn).
func (c Bars) PerBar() int { return c.layout().k }

type barLayout struct {
	ticks             []float64
	step, top         float64
	rows, per         int
	labelW, colW, bar int
	k                 int
	mark              int // the bar marked by Column, or -1
	values            []float64
	labels            []string
	keys              []int
}

func (c Bars) layout() barLayout {
	var lo barLayout
	width := c.Width
	if width <= 0 {
		width = 80
	}
	rows := c.Rows
	if rows <= 0 {
		rows = 8
	}
	hi := 0.0
	for _, v := range c.Values {
		hi = math.Max(hi, v)
	}
	if c.Level != nil {
		hi = math.Max(hi, c.Level.Value)
	}
	lo.ticks, lo.step = Ticks(0, hi, 4)
	// Each row is a whole fraction 1/per of the tick step, and there are
	// just enough rows for the highest value: labels fall on row edges.
	intervals := len(lo.ticks) - 1
	lo.per = max(1, int(math.Round(float64(rows)/float64(intervals))))
	rowH := lo.step / float64(lo.per)
	// at least two tick steps, so that the Y axis labels three values
	lo.rows = max(2*lo.per, int(math.Ceil(hi/rowH-1e-9)))
	lo.top = rowH * float64(lo.rows)
	lo.ticks = lo.ticks[:min(len(lo.ticks), lo.rows/lo.per+1)]
	for _, t := range lo.ticks {
		lo.labelW = max(lo.labelW, utf8.RuneCountInString(Compact(t, lo.step)))
	}
	cols := max(1, width-lo.labelW-2)
	n := len(c.Values)
	lo.k = (n + cols - 1) / cols
	if lo.k > 1 && len(c.Runs) > 0 && c.Runs[len(c.Runs)-1] >= lo.k {
		lo.k = IntStep(float64(lo.k), c.Runs)
	}
	lo.values, lo.labels, lo.keys = c.Values, c.Labels, c.Keys
	lo.mark = -1
	if c.Column != nil && c.Column.Index >= 0 && c.Column.Index < n {
		// the bar whose run holds the value: runs end at (n-1)%k + j·k
		lo.mark = max(0, (c.Column.Index-(n-1)%lo.k+lo.k-1)/lo.k)
	}
	if lo.k > 1 {
		lo.values, lo.labels, lo.keys = nil, nil, nil
		for i := (n - 1) % lo.k; i < n; i += lo.k {
			lo.values = append(lo.values, c.Values[i])
			if i < len(c.Labels) {
				lo.labels = append(lo.labels, c.Labels[i])
			}
		}
		n = len(lo.values)
	}
	lo.colW = max(1, min(6, cols/n))
	lo.bar = lo.colW
	if lo.colW >= 3 {
		lo.bar = lo.colW - 1 // a gap between bars
	}
	return lo
}

// String draws the chart: rows of bars under a Y axis labelled in
// thousands or millions, a baseline, and a line of X labels. Each bar is
// as tall as its value to an eighth of a row. Values that do not fit the
// width one to a column are thinned as [Bars.PerBar] says.
func (c Bars) String() string {
	if len(c.Values) == 0 {
		return ""
	}
	width := c.Width
	if width <= 0 {
		width = 80
	}
	steps := c.Steps
	if len(steps) == 0 {
		steps = []int{1, 2, 5, 10, 20, 50}
	}
	lo := c.layout()
	rows, per, top, step, labelW, colW, bar := lo.rows, lo.per, lo.top, lo.step, lo.labelW, lo.colW, lo.bar
	ticks := lo.ticks
	n := len(lo.values)
	levelRow := -1 // the row holding the level, 0 at the top
	if c.Level != nil && c.Level.Value > 0 && top > 0 {
		// the row whose top edge is nearest the level
		levelRow = min(rows-1, max(0, rows-max(1, int(math.Round(c.Level.Value/top*float64(rows))))))
	}
	lines := make([]strings.Builder, rows)
	for r := 0; r < rows; r++ {
		l := &lines[r]
		// row r (0 at the top) spans values from top·(rows−r−1)/rows to top·(rows−r)/rows
		if (rows-r)%per == 0 {
			l.WriteString(pad(Compact(ticks[(rows-r)/per], step), labelW))
			l.WriteString(" ┤")
		} else {
			l.WriteString(strings.Repeat(" ", labelW))
			l.WriteString(" │")
		}
		for i, v := range lo.values {
			h := 0
			if v > 0 && top > 0 {
				h = int(math.Round(v / top * float64(rows*8)))
			}
			fill := h - (rows-r-1)*8 // eighths of this row's cell that are filled
			ch := ' '
			switch {
			case fill >= 8:
				ch = '█'
			case fill > 0:
				ch = eighths[fill-1]
			}
			for j := 0; j < colW; j++ {
				switch {
				case j < bar && ch != ' ':
					l.WriteRune(ch)
				case i == lo.mark && j == bar/2:
					l.WriteRune('┆')
				case r == levelRow:
					l.WriteRune('┄')
				default:
					l.WriteByte(' ')
				}
			}
		}
	}
	var b strings.Builder
	for r := range lines {
		b.WriteString(strings.TrimRight(lines[r].String(), " "))
		b.WriteString("\n")
	}
	b.WriteString(pad("0", labelW))
	b.WriteString(" └")
	base := []rune(strings.Repeat("─", n*colW))
	if lo.mark >= 0 {
		base[lo.mark*colW+bar/2] = '┴'
	}
	b.WriteString(string(base))
	b.WriteString("\n")

	// X labels, left-aligned under their bar, never overlapping.
	maxLabel := 0
	for _, s := range lo.labels {
		maxLabel = max(maxLabel, utf8.RuneCountInString(s))
	}
	ls := IntStep(float64(maxLabel+1)/float64(colW), steps)
	axis := []rune(strings.Repeat(" ", labelW+2+n*colW+maxLabel))
	next := 0
	for i := 0; i < n && i < len(lo.labels); i++ {
		if lo.keys != nil && i < len(lo.keys) {
			if lo.keys[i]%ls != 0 {
				continue
			}
		} else if i%ls != 0 {
			continue
		}
		at := labelW + 2 + i*colW
		lab := []rune(lo.labels[i])
		if at < next || at+len(lab) > width {
			continue
		}
		copy(axis[at:], lab)
		next = at + len(lab) + 1
	}
	b.WriteString(strings.TrimRight(string(axis), " "))
	b.WriteString("\n")

	// The key names the marks, each on the line when both do not fit.
	var key []string
	if levelRow >= 0 {
		key = append(key, "┄ "+c.Level.Label)
	}
	if lo.mark >= 0 {
		key = append(key, "┆ "+c.Column.Label)
	}
	indent := strings.Repeat(" ", labelW+2)
	if line := indent + strings.Join(key, "   "); len(key) > 0 && utf8.RuneCountInString(line) <= width {
		b.WriteString(line + "\n")
	} else {
		for _, k := range key {
			b.WriteString(indent + k + "\n")
		}
	}
	return b.String()
}

func pad(s string, w int) string {
	if n := utf8.RuneCountInString(s); n < w {
		return strings.Repeat(" ", w-n) + s
	}
	return s
}
