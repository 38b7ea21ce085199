package main

import (
	"fmt"
	"strings"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/money"
	"cairn/plan"
)

func convertCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "convert",
		Usage:     "convert a rate between its forms: effective, nominal, continuous, per period",
		ArgsUsage: "RATE",
		Description: "RATE is any form: 4.1%, 4.1% apy, 3.9% compounded monthly, 5% compounded continuously,\n" +
			"0.35% per month. Without --to, every form is shown.\n\n" +
			"Example:\n   cairn convert \"3.9% compounded monthly\"\n" +
			"   cairn convert 6% --to \"per 2 weeks\"\n   cairn convert 6% --inflation 2.5%",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "to", Usage: "the `FORM`: effective, continuous, \"compounded FREQ\" or \"per FREQ\""},
			&cli.StringFlag{Name: "inflation", Usage: "also show the real rate under inflation `RATE`"},
			&cli.StringFlag{Name: "format", Aliases: []string{"f"}, Value: "table", Usage: "output `FORMAT`: table, csv, json or markdown"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() != 1 {
				return usagef("for example: cairn convert \"3.9% compounded monthly\"", "convert takes one RATE (quote it if it has spaces)")
			}
			r, err := plan.ParseRateIn(c.Args().First(), plan.MinRatePercent, plan.MaxRatePercent)
			if err != nil {
				return &inputError{err: err}
			}
			var pi *money.Rate
			if s := c.String("inflation"); s != "" {
				x, err := plan.ParseRateIn(s, -plan.MaxInflationPct, plan.MaxInflationPct)
				if err != nil {
					return &inputError{err: fmt.Errorf("--inflation: %v", err)}
				}
				pi = &x
			}
			forms := r.Forms()
			if s := c.String("to"); s != "" {
				f, err := r.In(s)
				if err != nil {
					return usagef("", "--to: %v", err)
				}
				forms = []money.Rate{f}
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			return out(c, e, convertDoc(r, plan.ShownForms(forms, plan.MinRatePercent, plan.MaxRatePercent), pi))
		},
	}
}

// convertDoc is rate r in each of forms, and with inflation pi its real rate.
func convertDoc(r money.Rate, forms []money.Rate, pi *money.Rate) *render.Doc {
	d := newDoc(nil, false)
	d.Lead = []string{fmt.Sprintf("%s is equivalent to:", r)}
	t := &render.Table{Cols: []render.Column{{Head: "form", Key: "form"}, {Head: "rate", Key: "rate", Numeric: true}}}
	var js []map[string]any
	for _, f := range forms {
		form := strings.TrimPrefix(f.String(), money.Percent(f.Stated(), 6)+" ")
		if f.Form() == money.Effective {
			form = "effective annual (APY)"
		}
		rate := render.ExactRate(f.Stated())
		t.Add(render.Text(form), rate)
		js = append(js, map[string]any{"form": form, "rate": rate.Plain()})
	}
	d.Blocks = []render.Block{t}
	d.Data["rate"] = r.String()
	d.Data["effective"] = jsonRate(r.Effective())
	d.Data["forms"] = js
	if pi != nil {
		real := money.Real(r, *pi)
		// a row of the table too, so that CSV, which writes the table
		// alone, has it
		t.Add(render.Text("real after inflation, effective"), render.ExactRate(real.Effective()))
		d.After = append(d.After, fmt.Sprintf("Real rate under %s inflation: %s a year effective, by the Fisher relation (1 + r)/(1 + inflation) - 1.", pi, pct(real.Effective())))
		d.Data["inflation"] = jsonRate(pi.Effective())
		d.Data["real"] = jsonRate(real.Effective())
	}
	return d
}
