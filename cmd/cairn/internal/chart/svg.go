package chart

import (
	"encoding/xml"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// A Dash is the stroke pattern of a line. Series are told apart by pattern
// and weight, not by colour, so that a chart printed in greyscale reads the
// same.
type Dash int

const (
	Solid  Dash = iota // an unbroken line
	Dashed             // long dashes
	Dotted             // round dots
)

func (d Dash) array() string {
	switch d {
	case Dashed:
		return "7 4"
	case Dotted:
		return "0.5 4"
	}
	return ""
}

// A Series is one line of a chart: points (X[i], Y[i]) joined in order.
type Series struct {
	Label string
	X, Y  []float64
	Dash  Dash
	Width float64 // stroke width, in units of the 720-wide view box
	// Marks draws each point as a ring, unjoined, instead of a line: values
	// known at their dates only, such as balances read off statements.
	Marks bool
}

// A Band is a shaded range between a lower and an upper line over the same X.
type Band struct {
	Label     string
	X, Lo, Hi []float64
}

// A Rule is a reference line at a value: horizontal at Y = At, or vertical
// at X = At.
type Rule struct {
	Label string // drawn beside the line and in the legend
	At    float64
}

// A Line is a line chart over a time axis in years: X = 2027 is the start of
// 2027, X = 2027.5 its middle. Ticks on the X axis fall on whole years.
type Line struct {
	ID    string // prefix of the ids of its title and desc; unique in the page
	Title string // the chart's accessible name
	Desc  string // the chart in words, for readers who cannot see it
	YUnit string // written above the Y axis, e.g. "USD"

	Band   *Band
	Series []Series
	HRules []Rule // e.g. the target
	VRules []Rule // e.g. the deadline
}

// The view box and the plot area inside it.
const (
	viewW                   = 720.0
	plotL, plotR            = 70.0, 700.0
	plotT, plotB            = 34.0, 262.0
	fontSize                = 12.0
	charW                   = 0.56 * fontSize // a sans-serif character's width, about
	legendTop, legendHeight = 306.0, 20.0
)

// SVG returns the chart as an <svg> element, XML-well-formed, for inline use
// in HTML. It draws nothing but what it is given.
func (c *Line) SVG() string {
	xlo, xhi, ylo, yhi := math.Inf(1), math.Inf(-1), 0.0, 0.0
	seeX := func(xs []float64) {
		for _, x := range xs {
			xlo, xhi = math.Min(xlo, x), math.Max(xhi, x)
		}
	}
	seeY := func(ys []float64) {
		for _, y := range ys {
			ylo, yhi = math.Min(ylo, y), math.Max(yhi, y)
		}
	}
	for _, s := range c.Series {
		seeX(s.X)
		seeY(s.Y)
	}
	if c.Band != nil {
		seeX(c.Band.X)
		seeY(c.Band.Lo)
		seeY(c.Band.Hi)
	}
	for _, r := range c.HRules {
		seeY([]float64{r.At})
	}
	for _, r := range c.VRules {
		seeX([]float64{r.At})
	}
	if math.IsInf(xlo, 0) {
		xlo, xhi = 0, 1
	}
	if xhi-xlo < 1 {
		xhi = xlo + 1
	}
	yt, ystep := Ticks(ylo, yhi, 5)
	ylo, yhi = yt[0], yt[len(yt)-1]
	sx := func(x float64) float64 { return plotL + (x-xlo)/(xhi-xlo)*(plotR-plotL) }
	sy := func(y float64) float64 { return plotB - (y-ylo)/(yhi-ylo)*(plotB-plotT) }

	var b strings.Builder

	// grid and Y axis
	b.WriteString(`<g class="y-axis" stroke="#bbbbbb" stroke-width="0.75">` + "\n")
	for _, t := range yt {
		y := sy(t)
		fmt.Fprintf(&b, `<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(plotL), num(y), num(plotR), num(y))
	}
	b.WriteString("</g>\n")
	b.WriteString(`<g class="y-labels" text-anchor="end" fill="#000000">` + "\n")
	for _, t := range yt {
		fmt.Fprintf(&b, `<text x="%s" y="%s">%s</text>`+"\n", num(plotL-6), num(sy(t)+4), esc(Compact(t, ystep)))
	}
	if c.YUnit != "" {
		fmt.Fprintf(&b, `<text x="%s" y="%s">%s</text>`+"\n", num(plotL-6), num(plotT-10), esc(c.YUnit))
	}
	b.WriteString("</g>\n")

	// X axis: whole years
	step := IntStep((xhi-xlo)/8, []int{1, 2, 5, 10, 20, 25, 50, 100})
	b.WriteString(`<g class="x-axis" stroke="#000000" stroke-width="1">` + "\n")
	fmt.Fprintf(&b, `<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(plotL), num(plotB), num(plotR), num(plotB))
	var xt []int
	for y := int(math.Ceil(xlo - 1e-9)); float64(y) <= xhi+1e-9; y++ {
		if y%step == 0 {
			xt = append(xt, y)
			x := sx(float64(y))
			fmt.Fprintf(&b, `<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(x), num(plotB), num(x), num(plotB+5))
		}
	}
	b.WriteString("</g>\n")
	b.WriteString(`<g class="x-labels" text-anchor="middle" fill="#000000">` + "\n")
	for _, y := range xt {
		fmt.Fprintf(&b, `<text x="%s" y="%s">%d</text>`+"\n", num(sx(float64(y))), num(plotB+19), y)
	}
	b.WriteString("</g>\n")

	var legend, later []legendItem // the series first, then the band and the rules
	if c.Band != nil && len(c.Band.X) > 0 {
		bd := c.Band
		var d strings.Builder
		for i := range bd.X {
			cmd := "L"
			if i == 0 {
				cmd = "M"
			}
			fmt.Fprintf(&d, "%s%s,%s ", cmd, num(sx(bd.X[i])), num(sy(bd.Hi[i])))
		}
		for i := len(bd.X) - 1; i >= 0; i-- {
			fmt.Fprintf(&d, "L%s,%s ", num(sx(bd.X[i])), num(sy(bd.Lo[i])))
		}
		d.WriteString("Z")
		fmt.Fprintf(&b, `<path class="band" d="%s" fill="#d4d4d4" stroke="#8c8c8c" stroke-width="0.75"/>`+"\n", d.String())
		later = append(later, legendItem{label: bd.Label, band: true})
	}
	for _, r := range c.VRules {
		x := sx(r.At)
		fmt.Fprintf(&b, `<line class="v-rule" x1="%s" y1="%s" x2="%s" y2="%s" stroke="#555555" stroke-width="1"/>`+"\n", num(x), num(plotT-4), num(x), num(plotB))
		// the label goes above the plot, clear of the lines
		anchor := "middle"
		switch {
		case x-float64(len([]rune(r.Label)))*charW/2 < plotL:
			anchor = "start"
		case x+float64(len([]rune(r.Label)))*charW/2 > plotR:
			anchor = "end"
		}
		fmt.Fprintf(&b, `<text class="v-rule-label" x="%s" y="%s" text-anchor="%s">%s</text>`+"\n", num(x), num(plotT-10), anchor, esc(r.Label))
	}
	for _, r := range c.HRules {
		y := sy(r.At)
		fmt.Fprintf(&b, `<line class="h-rule" x1="%s" y1="%s" x2="%s" y2="%s" stroke="#000000" stroke-width="2" stroke-dasharray="%s" stroke-linecap="round"/>`+"\n",
			num(plotL), num(y), num(plotR), num(y), Dotted.array())
		fmt.Fprintf(&b, `<text class="h-rule-label" x="%s" y="%s" text-anchor="start"%s>%s</text>`+"\n", num(plotL+6), num(y-6), halo, esc(r.Label))
		later = append(later, legendItem{label: r.Label, dash: Dotted, width: 2})
	}
	for _, s := range c.Series {
		if s.Marks {
			b.WriteString(`<g class="marks" fill="#ffffff" stroke="#000000" stroke-width="1.5">` + "\n")
			for i := range s.X {
				fmt.Fprintf(&b, `<circle cx="%s" cy="%s" r="3.5"/>`+"\n", num(sx(s.X[i])), num(sy(s.Y[i])))
			}
			b.WriteString("</g>\n")
			legend = append(legend, legendItem{label: s.Label, mark: true})
			continue
		}
		var d strings.Builder
		for i := range s.X {
			cmd := "L"
			if i == 0 {
				cmd = "M"
			}
			fmt.Fprintf(&d, "%s%s,%s ", cmd, num(sx(s.X[i])), num(sy(s.Y[i])))
		}
		w := s.Width
		if w == 0 {
			w = 2
		}
		dash := ""
		if a := s.Dash.array(); a != "" {
			dash = fmt.Sprintf(` stroke-dasharray="%s" stroke-linecap="round"`, a)
		}
		fmt.Fprintf(&b, `<path class="series" d="%s" fill="none" stroke="#000000" stroke-width="%s" stroke-linejoin="round"%s/>`+"\n",
			strings.TrimSpace(d.String()), num(w), dash)
		legend = append(legend, legendItem{label: s.Label, dash: s.Dash, width: w})
	}
	bottom := writeLegend(&b, append(legend, later...))
	b.WriteString("</svg>")

	var h strings.Builder
	titleID, descID := c.ID+"-title", c.ID+"-desc"
	fmt.Fprintf(&h, `<svg xmlns="http://www.w3.org/2000/svg" class="chart" viewBox="0 0 %s %s" role="img" aria-labelledby="%s %s" font-family="sans-serif" font-size="%s">`,
		num(viewW), num(bottom+8), esc(titleID), esc(descID), num(fontSize))
	h.WriteString("\n")
	fmt.Fprintf(&h, `<title id="%s">%s</title>`+"\n", esc(titleID), esc(c.Title))
	fmt.Fprintf(&h, `<desc id="%s">%s</desc>`+"\n", esc(descID), esc(c.Desc))
	return h.String() + b.String()
}

// halo draws a white outline under text so that it stays legible over lines.
const halo = ` paint-order="stroke" stroke="#ffffff" stroke-width="3" stroke-linejoin="round"`

type legendItem struct {
	label string
	dash  Dash
	width float64
	band  bool
	mark  bool
}

// writeLegend lays the items out left to right below the plot, starting a
// new row when one would run past the right edge. It returns the bottom of
// what it drew (of the X labels when there is no legend).
func writeLegend(b *strings.Builder, items []legendItem) float64 {
	if len(items) == 0 {
		return plotB + 24
	}
	b.WriteString(`<g class="legend" fill="#000000">` + "\n")
	x, y := plotL, legendTop
	for _, it := range items {
		w := 30 + 6 + float64(len([]rune(it.label)))*charW + 18
		if x > plotL && x+w > plotR {
			x, y = plotL, y+legendHeight
		}
		if it.mark {
			fmt.Fprintf(b, `<circle cx="%s" cy="%s" r="3.5" fill="#ffffff" stroke="#000000" stroke-width="1.5"/>`+"\n", num(x+15), num(y-4))
		} else if it.band {
			fmt.Fprintf(b, `<rect x="%s" y="%s" width="30" height="10" fill="#d4d4d4" stroke="#8c8c8c" stroke-width="0.75"/>`+"\n", num(x), num(y-9))
		} else {
			dash := ""
			if a := it.dash.array(); a != "" {
				dash = fmt.Sprintf(` stroke-dasharray="%s" stroke-linecap="round"`, a)
			}
			fmt.Fprintf(b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="#000000" stroke-width="%s"%s/>`+"\n", num(x), num(y-4), num(x+30), num(y-4), num(it.width), dash)
		}
		fmt.Fprintf(b, `<text x="%s" y="%s">%s</text>`+"\n", num(x+36), num(y), esc(it.label))
		x += w
	}
	b.WriteString("</g>\n")
	return y + 4
}

// num formats a coordinate with at most two decimals.
func num(x float64) string {
	s := strconv.FormatFloat(x, 'f', 2, 64)
	s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	if s == "-0" {
		return "0"
	}
	return s
}

// esc escapes text for XML character data and attribute values.
func esc(s string) string {
	var b strings.Builder
	xml.EscapeText(&b, []byte(s))
	return b.String()
}
