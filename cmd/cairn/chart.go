package main

import (
	"bytes"
	"fmt"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/chart"
	"cairn/plan"
)

// This file draws `cairn project --chart`: the closing balance of each row
// of the projection as a bar chart in Unicode block characters, under the
// table. The balances are the ledger's rows; the chart only scales them.

// projectChart returns the terminal chart of rows (a projection's rows
// without the totals row), by year or by month, at most 80 columns wide.
func projectChart(p *plan.Plan, g *plan.Goal, rows []plan.Row, by plan.Period) string {
	if len(rows) == 0 {
		return ""
	}
	c := chart.Bars{Width: 80, Rows: 8}
	for _, r := range rows {
		c.Values = append(c.Values, r.Closing.Float())
		c.Labels = append(c.Labels, r.Label)
		if by == plan.ByYear {
			c.Keys = append(c.Keys, r.From.Year())
		} else {
			c.Keys = append(c.Keys, int(r.From))
		}
	}
	period, periods := "year", "years"
	if by == plan.ByMonth {
		period, periods = "month", "months"
		c.Steps = []int{1, 2, 3, 6, 12, 24, 60, 120, 240, 600}
		c.Runs = []int{2, 3, 4, 6, 12, 24, 36, 60, 120, 240, 600}
	} else {
		c.Steps = []int{1, 2, 5, 10, 20, 25, 50}
		c.Runs = []int{2, 3, 4, 5, 10}
	}
	head := fmt.Sprintf("%s: closing balance by %s, %s to %s, in %s.", g.Name, period, rows[0].Label, rows[len(rows)-1].Label, p.Currency.Code)
	if k := c.PerBar(); k > 1 {
		head += fmt.Sprintf(" Each bar is the balance at the end of a run of %d %s.", k, periods)
	}
	return wrap(head, 80) + c.String()
}

// outProject writes the projection doc d; in table format with chart set,
// the chart of ledger l goes under the table, before the closing lines and
// the note. Other formats are written as without --chart.
func outProject(c *cli.Context, e *env, d *doc, l *plan.Ledger, by plan.Period, withChart bool) error {
	f, err := parseFormat(c)
	if err != nil {
		return err
	}
	if !withChart || f != formatTable {
		return out(c, e, d)
	}
	text, err := withChartText(d, projectChart(l.Plan, l.Goal, l.Rows(by, false), by))
	if err != nil {
		return fmt.Errorf("writing output: %v", err)
	}
	_, err = e.stdout.Write(text)
	if err != nil {
		return fmt.Errorf("writing output: %v", err)
	}
	return nil
}

// withChartText renders d as a table with chart inserted after its tables.
// The doc renderer has no slot for preformatted text, so this renders d
// twice, with and without its closing lines, and splices the chart in where
// the two part: the tables end there.
func withChartText(d *doc, chartText string) ([]byte, error) {
	var full, bare bytes.Buffer
	if err := d.write(&full, nil, formatTable); err != nil {
		return nil, err
	}
	nd := *d
	nd.after = nil
	if err := nd.write(&bare, nil, formatTable); err != nil {
		return nil, err
	}
	footer := "\n" + wrap("Note: "+noteText, 80)
	if d.drawdown {
		footer += wrap("Caution: "+cautionText, 80)
	}
	tables, ok := strings.CutSuffix(bare.String(), footer)
	if !ok || !strings.HasPrefix(full.String(), tables) {
		return nil, fmt.Errorf("cannot place the chart: the table layout changed")
	}
	var b bytes.Buffer
	b.WriteString(tables)
	b.WriteString("\n")
	b.WriteString(chartText)
	b.WriteString(full.String()[len(tables):])
	return b.Bytes(), nil
}
