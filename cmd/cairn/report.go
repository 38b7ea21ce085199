package main

import (
	"bytes"
	"fmt"
	"html/template"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/chart"
	"cairn/money"
	"cairn/plan"
)

// This file makes `cairn report`: one self-contained HTML file to print —
// the household status table, then per goal a chart of the balance, the
// yearly projection and the assumptions, each goal on a new page. Every
// figure comes from the plan package (StatusOf, Project and Ledger.Rows,
// Describe); this file formats them and the chart package scales them.
//
// The page is XHTML-compatible (every element closed, no named entities
// beyond XML's), so tests read it with encoding/xml; it needs no network,
// no fonts of its own and no JavaScript.

func reportCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "report",
		Usage:     "write a printable HTML report with charts: the household, then each goal on its own page",
		ArgsUsage: "[FILE]",
		Description: "Writes one self-contained HTML file (inline style and charts, no scripts, nothing fetched) to\n" +
			"open in a browser and print: A4 or Letter, each goal on a new page. It never overwrites a\n" +
			"file unless --force is given; --out - writes the HTML to standard output.\n\n" +
			"Example:\n   cairn report examples/household.yaml --out plan.html\n" +
			"   cairn report examples/household.yaml --goal Retirement --out retirement.html --force",
		Flags: []cli.Flag{
			goalFlag(false),
			&cli.StringFlag{Name: "out", Aliases: []string{"o"}, Value: "plan.html", Usage: "write the report to `FILE`; - for standard output"},
			&cli.BoolFlag{Name: "force", Usage: "overwrite an existing file"},
			&cli.StringFlag{Name: "as-of", Usage: "today's `MONTH` (YYYY-MM); the plan starts the month after unless the file says start:"},
		},
		Action: func(c *cli.Context) error {
			p, err := readPlan(c, e)
			if err != nil {
				return err
			}
			if name := c.String("goal"); name != "" {
				g := p.Goal(name)
				if g == nil {
					return usagef("the goals are: "+goalNames(p), "no goal named %q", name)
				}
				q := *p
				q.Goals = []*plan.Goal{g}
				p = &q
			}
			name := c.String("out")
			if name == "" {
				return usagef("for example --out plan.html, or --out - for standard output", "--out needs a file name")
			}
			data, drawdown, err := buildReport(p)
			if err != nil {
				return err
			}
			if name == "-" {
				if _, err := e.stdout.Write(data); err != nil {
					return fmt.Errorf("writing output: %v", err)
				}
				return nil
			}
			if err := writeFileAtomic(name, data, c.Bool("force")); err != nil {
				return err
			}
			fmt.Fprintf(e.stdout, "wrote %s\n\n", name)
			fmt.Fprint(e.stdout, wrap("Note: "+noteText, 80))
			if drawdown {
				fmt.Fprint(e.stdout, wrap("Caution: "+cautionText, 80))
			}
			return nil
		},
	}
}

// The simulation behind the band the report draws for a goal with a
// volatility: fixed, so that the same file gives the same report.
const (
	reportSeed  = plan.DefaultSeed // the seed cairn uses when none is given
	reportPaths = 2000             // fewer than simulate's default, to keep a report quick
)

// simCaution goes with every simulated band (issue 8's caution).
const simCaution = "Simulated returns are assumptions, not a forecast, and past volatility does not bound the future."

// A bandPoint is the simulation's 5th and 95th percentile of the balance at
// the end of a month: a December, the deadline or the last month shown.
type bandPoint struct {
	Month   plan.Month
	P5, P95 money.Amount
}

// A simBand is the 5–95 % band of a goal's simulated balance.
type simBand struct {
	Paths               int
	Seed                uint64
	Volatility          float64 // of returns, a year, as a fraction
	InflationVolatility float64
	Points              []bandPoint
}

// goalBand returns the band of goal g from [plan.Simulate], or nil when
// neither the goal's returns nor the plan's inflation have a volatility.
func goalBand(p *plan.Plan, g *plan.Goal) (*simBand, error) {
	if !(g.HasVolatility && g.Volatility > 0) && !(p.HasInflationVolatility && p.InflationVolatility > 0) {
		return nil, nil
	}
	sim, err := plan.Simulate(p, g, plan.SimOptions{Paths: reportPaths, Seed: reportSeed})
	if err != nil {
		return nil, &inputError{err: fmt.Errorf("%s: simulation: %v", g.Name, err)}
	}
	b := &simBand{Paths: sim.Paths, Seed: sim.Seed, Volatility: sim.Volatility, InflationVolatility: sim.InflationVolatility}
	lo, hi := -1, -1
	for i, q := range plan.SimLevels {
		switch q {
		case 5:
			lo = i
		case 95:
			hi = i
		}
	}
	if lo < 0 || hi < 0 {
		return nil, fmt.Errorf("%s: the simulation has no 5th and 95th percentiles", g.Name)
	}
	for _, r := range sim.Rows {
		b.Points = append(b.Points, bandPoint{Month: r.Month, P5: r.P[lo], P95: r.P[hi]})
	}
	return b, nil
}

// reportData is what the page template reads.
type reportData struct {
	Title    string
	Footer   template.CSS // Title as a CSS string, for the running footer
	Version  string
	Meta     string
	Note     string
	Caution  string
	Drawdown bool
	Status   htmlTable
	Remarks  []string
	Goals    []goalPage
}

type goalPage struct {
	ID          string
	Kicker      string // "Goal 1 of 4: Emergency fund", the first text of its page
	Name        string
	Facts       []fact
	Chart       template.HTML
	ChartNote   string
	Projection  htmlTable
	Remarks     []string
	Assumptions []fact
	Drawdown    bool
	Band        *simBand
}

type fact struct{ Term, Detail string }

// An htmlTable is a table whose first column heads its rows.
type htmlTable struct {
	Class   string
	Caption string
	Head    []htmlCell
	Rows    [][]htmlCell
	Total   []htmlCell
}

type htmlCell struct {
	Text string
	Num  bool
}

// tableOf turns a grid of the text renderer into an HTML table, leaving out
// hidden columns.
func tableOf(g *grid, class, caption string) htmlTable {
	t := htmlTable{Class: class, Caption: caption}
	keep := func(row []string) []htmlCell {
		var out []htmlCell
		for i, s := range row {
			if i < len(g.cols) && !g.cols[i].hidden {
				out = append(out, htmlCell{Text: s, Num: g.cols[i].numeric})
			}
		}
		return out
	}
	var head []string
	for _, c := range g.cols {
		head = append(head, c.head)
	}
	t.Head = keep(head)
	for _, r := range g.rows {
		t.Rows = append(t.Rows, keep(r))
	}
	if g.total != nil {
		t.Total = keep(g.total)
	}
	return t
}

// buildReport renders the report of every goal of p, and says whether any
// goal draws money down.
func buildReport(p *plan.Plan) ([]byte, bool, error) {
	st := plan.StatusOf(p)
	sd := statusDoc(p, st)
	rd := reportData{
		Title:   "Household plan: " + p.File,
		Footer:  cssString("Household plan: " + p.File + " · a planning estimate, not advice"),
		Version: Version,
		Meta: fmt.Sprintf("From %s: %d %s from %s, amounts in %s, inflation %s a year; “today’s money” is money of %s.",
			p.File, len(p.Goals), plural(len(p.Goals), "goal", "goals"), p.Start, p.Currency.Code, pct(p.Inflation.Effective()), p.Start),
		Note:    noteText,
		Caution: cautionText,
		Status:  tableOf(sd.grids[0], "status", "Every goal: its target, the balance projected at its deadline, and the deposit that makes the deadline."),
		Remarks: sd.after,
	}
	for i, gs := range st.Goals {
		gp, err := goalReport(p, gs, i, len(st.Goals))
		if err != nil {
			return nil, false, err
		}
		rd.Drawdown = rd.Drawdown || gp.Drawdown
		rd.Goals = append(rd.Goals, gp)
	}
	var b bytes.Buffer
	if err := reportPage.Execute(&b, rd); err != nil {
		return nil, false, fmt.Errorf("writing the report: %v", err)
	}
	return b.Bytes(), rd.Drawdown, nil
}

func goalReport(p *plan.Plan, gs plan.GoalStatus, i, n int) (goalPage, error) {
	g := gs.Goal
	gp := goalPage{
		ID:       "goal-" + strconv.Itoa(i+1),
		Kicker:   fmt.Sprintf("Goal %d of %d: %s", i+1, n, g.Name),
		Name:     g.Name,
		Drawdown: hasDrawdown(g),
	}
	end := plan.Horizon(p, g)
	l, err := plan.Project(p, g, end)
	if err != nil {
		return gp, err
	}
	band, err := goalBand(p, g)
	if err != nil {
		return gp, err
	}
	gp.Band = band
	gp.Facts = goalFacts(p, gs)
	rows := l.Rows(plan.ByYear, true)
	gp.Chart, gp.ChartNote = goalChart(p, g, l, rows[:len(rows)-1], band, gp.ID)
	gp.Projection = projectionTable(p, l, rows)
	gp.Remarks = projectDoc(p, g, l, plan.ByYear).after
	gp.Assumptions = assumptions(p, g)
	return gp, nil
}

// goalFacts is the goal at a glance, from its status.
func goalFacts(p *plan.Plan, gs plan.GoalStatus) []fact {
	g := gs.Goal
	var fs []fact
	add := func(t, d string) { fs = append(fs, fact{t, d}) }
	if g.HasTarget {
		t := amt(p, g.Target)
		if g.TargetToday {
			t += " in today’s money"
			if g.HasBy {
				t += fmt.Sprintf(" (%s in money of %s)", amt(p, gs.TargetAt), g.By)
			}
		}
		add("Target", t)
	}
	if g.HasBy {
		add("Deadline", "the end of "+g.By.String())
	}
	if g.HasTarget && g.HasBy {
		s := amt(p, gs.Projected) + ": on track"
		if !gs.OnTrack {
			s = amt(p, gs.Projected) + ": short by " + amt(p, gs.Short)
		}
		add("Projected at the deadline", s)
		if gs.NeededErr == nil {
			a := gs.Needed
			add("Needed to make the deadline", fmt.Sprintf("%s %s (%s)", amountPhrase(p, a.Stream, a.Amount, a.FirstAmount), every(a.Stream), streamLabel(a.Stream)))
		} else {
			add("Needed to make the deadline", "no deposit makes it: "+reasonOf(gs.NeededErr))
		}
	}
	if g.HasTarget {
		if gs.Reach == nil {
			add("Target reached", gs.Reached.String())
		} else {
			add("Target reached", "not reached: "+reasonOf(gs.Reach))
		}
	}
	if len(g.Deposits) > 0 {
		add("Set aside now", amt(p, gs.MonthlyNow)+" a month")
	}
	if gs.Lasts != nil {
		if gs.Lasts.Lasts {
			add("The money", fmt.Sprintf("lasts through %s, leaving %s", gs.Lasts.Month, amt(p, gs.Lasts.Left)))
		} else if gs.Lasts.Paid {
			add("The money", "does not last: "+gs.Lasts.Note)
		} else {
			add("The money", "runs out in "+gs.Lasts.Month.String())
		}
	} else if gs.LastsErr != nil {
		add("The money", reasonOf(gs.LastsErr))
	}
	return fs
}

// yearEnd is the time-axis position of the end of month m.
func yearEnd(m plan.Month) float64 { return float64(m.Year()) + float64(m.Calendar())/12 }

// goalChart draws the balance by year end: in money of each date and in
// today's money, the target and the deadline, and the simulation's band. It
// returns the chart and its caption.
func goalChart(p *plan.Plan, g *plan.Goal, l *plan.Ledger, rows []plan.Row, band *simBand, id string) (template.HTML, string) {
	start := float64(p.Start.Year()) + float64(p.Start.Calendar()-1)/12
	nominal := chart.Series{Label: "balance", Dash: chart.Solid, Width: 2.75, X: []float64{start}, Y: []float64{l.Opening.Float()}}
	today := chart.Series{Label: "balance in today’s money", Dash: chart.Dashed, Width: 1.5, X: []float64{start}, Y: []float64{l.Opening.Float()}}
	hi, hiAt := l.Opening, "the start"
	for _, r := range rows {
		x := yearEnd(r.To)
		nominal.X, nominal.Y = append(nominal.X, x), append(nominal.Y, r.Closing.Float())
		today.X, today.Y = append(today.X, x), append(today.Y, r.ClosingToday.Float())
		if r.Closing.Cmp(hi) > 0 {
			hi, hiAt = r.Closing, "the end of "+r.Label
		}
	}
	last := rows[len(rows)-1]
	c := &chart.Line{
		ID:     id + "-chart",
		Title:  fmt.Sprintf("%s: the balance at each year end, %s to %s", g.Name, rows[0].Label, last.Label),
		YUnit:  p.Currency.Code,
		Series: []chart.Series{nominal, today},
	}
	desc := []string{fmt.Sprintf("Line chart. Solid line: the balance at the end of each year from %s to %s, in %s, from %s at the start of %s to %s at the end of %s; highest %s at %s.",
		rows[0].Label, last.Label, p.Currency.Code, amt(p, l.Opening), p.Start, amt(p, last.Closing), last.To, amt(p, hi), hiAt),
		fmt.Sprintf("Dashed line: the same balances in today’s money (money of %s), %s at the end.", p.Start, amt(p, last.ClosingToday))}
	caption := fmt.Sprintf("The balance at the end of each year, in money of that date (solid line) and in today’s money, money of %s (dashed line)", p.Start)
	var marks []string
	if g.HasTarget {
		at := p.TargetAt(g)
		label := "target " + amt(p, at)
		if g.HasBy {
			label += " at the deadline"
		}
		c.HRules = append(c.HRules, chart.Rule{Label: label, At: at.Float()})
		s := "the target, " + amt(p, at)
		if g.TargetToday && g.HasBy {
			s += fmt.Sprintf(" (%s in today’s money grown by inflation to %s)", amt(p, g.Target), g.By)
		}
		desc = append(desc, "Dotted line: "+s+".")
		marks = append(marks, "the dotted line is "+s)
	}
	if g.HasBy {
		c.VRules = append(c.VRules, chart.Rule{Label: "deadline " + g.By.String(), At: yearEnd(g.By)})
		desc = append(desc, fmt.Sprintf("Vertical line: the deadline, the end of %s.", g.By))
		marks = append(marks, fmt.Sprintf("the vertical line the deadline, the end of %s", g.By))
	}
	if len(marks) > 0 {
		caption += "; " + strings.Join(marks, ", and ")
	}
	caption += "."
	if band != nil && len(band.Points) > 0 {
		b := &chart.Band{Label: "5–95 % of simulated paths", X: []float64{start}, Lo: []float64{l.Opening.Float()}, Hi: []float64{l.Opening.Float()}}
		for _, pt := range band.Points {
			b.X, b.Lo, b.Hi = append(b.X, yearEnd(pt.Month)), append(b.Lo, pt.P5.Float()), append(b.Hi, pt.P95.Float())
		}
		c.Band = b
		vol := fmt.Sprintf("a volatility of returns of %s a year", pct(band.Volatility))
		if band.InflationVolatility > 0 {
			vol += fmt.Sprintf(" and of inflation of %s a year", pct(band.InflationVolatility))
		}
		s := fmt.Sprintf("Grey band: the 5th to 95th percentile of the balance over %s simulated paths (seed %d), with %s.",
			groupInt(band.Paths), band.Seed, vol)
		desc = append(desc, s)
		caption += " " + s + " " + simCaution
	}
	c.Desc = strings.Join(desc, " ")
	return template.HTML(c.SVG()), caption
}

// cssString quotes s as a CSS string, escaping every character that could
// end the string or the style element.
func cssString(s string) template.CSS {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch {
		case r == '"' || r == '\\' || r == '<' || r == '>' || r == '&' || r < 0x20 || r == 0x7f:
			fmt.Fprintf(&b, "\\%x ", r)
		default:
			b.WriteRune(r)
		}
	}
	b.WriteByte('"')
	return template.CSS(b.String())
}

func groupInt(n int) string { return money.Units(int64(n)).Format(money.Currency{Places: 0}, false) }

// projectionTable is the yearly projection with cents, leaving out the fee
// and withdrawal columns of a goal that has none.
func projectionTable(p *plan.Plan, l *plan.Ledger, rows []plan.Row) htmlTable {
	var hasFees, hasOut bool
	for _, r := range rows {
		hasFees = hasFees || !r.Fees.IsZero()
		hasOut = hasOut || !r.Withdrawals.IsZero()
	}
	t := htmlTable{Class: "projection",
		Caption: fmt.Sprintf("%s by year, %s to %s, in %s; the last column is the closing balance in money of %s.", l.Goal.Name, l.Start, l.End, p.Currency.Code, p.Start)}
	cells := func(r plan.Row) []htmlCell {
		cs := []htmlCell{{Text: r.Label}, {amt(p, r.Opening), true}, {amt(p, r.Deposits), true}, {amt(p, r.Interest), true}}
		if hasFees {
			cs = append(cs, htmlCell{amt(p, r.Fees), true})
		}
		if hasOut {
			cs = append(cs, htmlCell{amt(p, r.Withdrawals), true})
		}
		return append(cs, htmlCell{amt(p, r.Closing), true}, htmlCell{amt(p, r.ClosingToday), true})
	}
	t.Head = []htmlCell{{Text: "year"}, {"opening", true}, {"deposits", true}, {"interest", true}}
	if hasFees {
		t.Head = append(t.Head, htmlCell{"fees", true})
	}
	if hasOut {
		t.Head = append(t.Head, htmlCell{"withdrawals", true})
	}
	t.Head = append(t.Head, htmlCell{"closing", true}, htmlCell{"in today’s money", true})
	for _, r := range rows[:len(rows)-1] {
		t.Rows = append(t.Rows, cells(r))
	}
	t.Total = cells(rows[len(rows)-1])
	return t
}

// assumptions says, in words, what the projection of g assumes.
func assumptions(p *plan.Plan, g *plan.Goal) []fact {
	v := plan.Describe(p, g)
	var fs []fact
	add := func(t, d string) { fs = append(fs, fact{t, d}) }
	var rates, credits []string
	for i, st := range g.Rates {
		s := st.Rate.String()
		if st.Rate.Form() != money.Effective {
			s += fmt.Sprintf(" (%s a year effective)", pct(v.Effective[i]))
		}
		from := "from the start"
		if i > 0 {
			from = "from " + st.From.String()
		}
		rates = append(rates, s+", "+from)
		credits = append(credits, pct(v.PerCredit[i])+" a credit "+from)
	}
	add("Rate", strings.Join(rates, "; "))
	add("Interest credited", v.Compounding.Adjective()+": "+strings.Join(credits, "; "))
	add("Between interest dates", fmt.Sprintf("%s: %s", g.Between, g.Between.Words()))
	if g.Fee > 0 {
		add("Fee", pct(g.Fee)+" a year of the balance, a twelfth taken at each month end")
	} else {
		add("Fee", "none")
	}
	add("Inflation", fmt.Sprintf("%s a year; today’s money is money of %s", pct(p.Inflation.Effective()), p.Start))
	for _, sv := range v.Streams {
		term := "Deposits"
		if sv.Stream.Out {
			term = "Withdrawals"
		}
		add(term, streamWords(p, sv))
	}
	for _, o := range g.Once {
		name := o.Name
		if name == "" {
			name = "one-time amount"
		}
		add("One-time", fmt.Sprintf("%s: %s at the end of %s", name, amt(p, o.Amount), o.On))
	}
	if len(g.Withdrawals) > 0 {
		leave := amt(p, g.Leave)
		if g.LeaveToday {
			leave += " today"
		}
		add("To leave", leave+" after the last withdrawal")
	}
	add("Rounding", fmt.Sprintf("each posting to %d decimal places, %s", p.Currency.Places, p.Rounding))
	add("Shown through", v.Horizon.String())
	return fs
}

func streamWords(p *plan.Plan, sv plan.StreamView) string {
	s := sv.Stream
	w := streamLabel(s) + ": " + amt(p, s.Amount)
	if s.Today {
		w += " in today’s money"
	}
	w += " " + every(s) + ", at the " + s.Timing.String() + " of each period"
	switch {
	case s.GrowInflation:
		w += ", rising with inflation each year"
	case s.Grow != 0:
		w += ", rising " + pct(s.Grow) + " a year"
	case s.Today:
		w += ", rising with inflation each year"
	}
	if sv.Count > 0 {
		w += fmt.Sprintf("; %d %s from %s to %s", sv.Count, plural(sv.Count, "amount", "amounts"), sv.First, sv.Last)
	} else {
		w += "; none within the horizon"
	}
	return w
}

// reportPage is the page. Its CSS prints on A4 and on Letter alike: size
// auto takes the printer's paper, and the margins (15 mm, 16 mm at the
// foot) leave a text block of 180 × 266 mm on A4 (210 × 297 mm) and
// 186 × 248 mm on Letter (216 × 279 mm); the layout is fluid, so it fits
// either. The @page margin boxes hold our own footer, which also keeps
// Chromium from printing its date and file address there. Series are told
// apart by dash and weight, the band by a grey fill, so that greyscale
// printing loses nothing.
var reportPage = template.Must(template.Must(template.New("report").Parse(`<!DOCTYPE html>
<html xmlns="http://www.w3.org/1999/xhtml" lang="en">
<head>
<meta charset="utf-8"/>
<meta name="viewport" content="width=device-width, initial-scale=1"/>
<meta name="generator" content="cairn {{.Version}}"/>
<title>{{.Title}}</title>
<style>
@page {
  size: auto;
  margin: 15mm 15mm 16mm 15mm;
  @top-left { content: ""; }
  @bottom-left { content: {{.Footer}}; font: 7.5pt "DejaVu Sans", Arial, sans-serif; }
  @bottom-right { content: "page " counter(page) " of " counter(pages); font: 7.5pt "DejaVu Sans", Arial, sans-serif; }
}
html { color: #000; background: #fff; }
body { font-family: "DejaVu Serif", Georgia, "Times New Roman", serif; font-size: 10.5pt; line-height: 1.4; max-width: 50rem; margin: 1.5rem auto; padding: 0 1rem; }
h1, h2, h3, caption, th, .kicker, dt { font-family: "DejaVu Sans", "Helvetica Neue", Arial, sans-serif; }
h1 { font-size: 20pt; margin: 0 0 0.2rem; }
h2 { font-size: 16pt; margin: 0.1rem 0 0.6rem; }
h3 { font-size: 11.5pt; margin: 1.2rem 0 0.4rem; }
.kicker { font-size: 9pt; letter-spacing: 0.02em; margin: 0; }
.meta { margin: 0 0 1rem; }
.note { border-top: 0.75pt solid #000; border-bottom: 0.75pt solid #000; padding: 0.35rem 0; font-size: 9.5pt; }
.note p { margin: 0.15rem 0; }
table { border-collapse: collapse; width: 100%; font-size: 9pt; font-variant-numeric: tabular-nums; margin: 0.3rem 0 0.6rem; }
caption { caption-side: top; text-align: left; font-size: 9pt; padding: 0 0 0.3rem; }
th, td { padding: 0.12rem 0.4rem; border-bottom: 0.5pt solid #9a9a9a; vertical-align: top; text-align: left; }
.num { text-align: right; white-space: nowrap; }
thead th { border-bottom: 1.25pt solid #000; font-weight: bold; }
tbody th { font-weight: normal; }
tfoot th, tfoot td { border-top: 1.25pt solid #000; border-bottom: none; font-weight: bold; }
table.status td, table.status th { font-size: 8.5pt; }
figure { margin: 0.6rem 0; }
svg.chart { display: block; width: 100%; height: auto; }
figcaption { font-size: 9pt; }
figcaption p { margin: 0.1rem 0; }
dl { display: grid; grid-template-columns: max-content auto; gap: 0.1rem 1rem; margin: 0.4rem 0; font-size: 9.5pt; }
dt { font-weight: bold; font-size: 9pt; }
dd { margin: 0; }
ul.remarks { padding-left: 1.2rem; }
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 10pt; }
  section.goal { break-before: page; page-break-before: always; }
  thead { display: table-header-group; }
  tfoot { display: table-row-group; }
  tr, figure, dl.facts, .note { break-inside: avoid; page-break-inside: avoid; }
  dt { break-after: avoid; page-break-after: avoid; }
  h2, h3, caption, .kicker { break-after: avoid; page-break-after: avoid; }
  a { color: inherit; text-decoration: none; }
}
</style>
</head>
<body>
<header>
<h1>Household plan</h1>
<p class="meta">{{.Meta}}</p>
</header>
<main>
<section id="status" class="summary" aria-labelledby="status-h">
<h2 id="status-h">The household at a glance</h2>
{{template "table" .Status}}
{{- if .Remarks}}
<ul class="remarks">
{{- range .Remarks}}
<li>{{.}}</li>
{{- end}}
</ul>
{{- end}}
<nav aria-label="goals">
<p>Each goal follows on its own page:</p>
<ol>
{{- range .Goals}}
<li><a href="#{{.ID}}">{{.Name}}</a></li>
{{- end}}
</ol>
</nav>
{{template "note" .}}
</section>
{{- range .Goals}}
<section id="{{.ID}}" class="goal" aria-labelledby="{{.ID}}-h">
<p class="kicker">{{.Kicker}}</p>
<h2 id="{{.ID}}-h">{{.Name}}</h2>
<dl class="facts">
{{- range .Facts}}
<dt>{{.Term}}</dt><dd>{{.Detail}}</dd>
{{- end}}
</dl>
<figure class="balance">
{{.Chart}}
<figcaption>{{.ChartNote}}</figcaption>
</figure>
<h3>Yearly projection</h3>
{{template "table" .Projection}}
{{- range .Remarks}}
<p class="remark">{{.}}</p>
{{- end}}
<h3>Assumptions</h3>
<dl class="assumptions">
{{- range .Assumptions}}
<dt>{{.Term}}</dt><dd>{{.Detail}}</dd>
{{- end}}
</dl>
<div class="note">
<p><strong>Note:</strong> {{$.Note}}</p>
{{- if .Drawdown}}
<p class="caution"><strong>Caution:</strong> {{$.Caution}}</p>
{{- end}}
</div>
</section>
{{- end}}
</main>
</body>
</html>
`)).Parse(`
{{define "table" -}}
<table class="{{.Class}}">
<caption>{{.Caption}}</caption>
<thead>
<tr>
{{- range .Head}}<th scope="col"{{if .Num}} class="num"{{end}}>{{.Text}}</th>{{end -}}
</tr>
</thead>
<tbody>
{{- range .Rows}}
<tr>
{{- range $i, $c := .}}{{if eq $i 0}}<th scope="row">{{$c.Text}}</th>{{else}}<td{{if $c.Num}} class="num"{{end}}>{{$c.Text}}</td>{{end}}{{end -}}
</tr>
{{- end}}
</tbody>
{{- if .Total}}
<tfoot>
<tr>
{{- range $i, $c := .Total}}{{if eq $i 0}}<th scope="row">{{$c.Text}}</th>{{else}}<td{{if $c.Num}} class="num"{{end}}>{{$c.Text}}</td>{{end}}{{end -}}
</tr>
</tfoot>
{{- end}}
</table>
{{- end}}
{{define "note" -}}
<div class="note">
<p><strong>Note:</strong> {{.Note}}</p>
{{- if .Drawdown}}
<p class="caution"><strong>Caution:</strong> {{.Caution}}</p>
{{- end}}
</div>
{{- end}}
`))
