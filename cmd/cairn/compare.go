package main

import (
	"fmt"
	"slices"
	"strconv"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

func compareCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "compare",
		Usage:     "what-if grid: solve one goal under every combination of changed values",
		ArgsUsage: "[FILE]",
		Description: "With --scenarios (or --scenario given more than once) the plan as written and each of the\n" +
			"file's scenarios are solved side by side, one row each; --set applies after each scenario.\n\n" +
			"Each --vary KEY=V1,V2,… is one axis; every combination is solved side by side with the\n" +
			"base plan first. Separate values with , or with ; — with ; a comma is a thousands separator\n" +
			"(deposit=1,000;1,500); a comma list that could hold one is refused (deposit=1,000,1,500).\n" +
			"A key may be changed once (by --set or one --vary), and not the quantity solved for.\n\n" +
			"With one --scenario, the grid is built on that scenario.\n\n" +
			"Example:\n   cairn compare examples/household.yaml --goal Retirement --for deposit --vary rate=5%,6%,7% --vary by=2049-12,2051-12\n" +
			"   cairn compare examples/household.yaml --goal \"Emergency fund\" --for time --scenarios",
		Flags: append(fileFlags(true), goalFlag(true), scenariosFlag,
			&cli.StringSliceFlag{Name: "vary", Usage: "an axis `KEY=V1,V2,…` or KEY=V1;V2;… (repeatable, one per key)"},
			&cli.StringFlag{Name: "for", Value: "time", Usage: "the `QUANTITY` to solve for: " + plan.Quantities},
			&cli.StringFlag{Name: "stream", Usage: "the stream to change and solve for, by `NAME`"},
		),
		Action: func(c *cli.Context) error {
			if c.Bool("scenarios") || len(c.StringSlice("scenario")) > 1 {
				return compareCases(c, e)
			}
			p, g, q, err := planGoalQuantity(c, e)
			if err != nil {
				return err
			}
			var axes []plan.Vary
			for _, s := range c.StringSlice("vary") {
				v, err := plan.ParseVary(s)
				if err != nil {
					return usagef("", "--vary: %v", err)
				}
				axes = append(axes, v)
			}
			if len(axes) == 0 {
				return usagef("for example --vary rate=5%,6%,7%, or --scenarios to compare the file's scenarios", "--vary is required")
			}
			if err := checkChanges(c, axes, q, "--vary"); err != nil {
				return err
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			gr, err := plan.Compare(p, g.Name, c.String("stream"), axes, plan.Question{For: q, Stream: c.String("stream")})
			if err != nil {
				return &inputError{err: fmt.Errorf("--vary %v", err)}
			}
			return out(c, e, compareDoc(p, g, gr))
		},
	}
}

// compareCases solves the goal under the plan as written and each scenario
// named, side by side.
func compareCases(c *cli.Context, e *env) error {
	if len(c.StringSlice("vary")) > 0 {
		return usagef("vary a key with one --scenario, or compare scenarios without --vary", "--vary: give one --scenario to build the grid on, not several")
	}
	cases, err := readCases(c, e)
	if err != nil {
		return err
	}
	p := cases[0].Plan
	g, err := goalOf(c, p)
	if err != nil {
		return err
	}
	q, err := plan.ParseQuantity(c.String("for"))
	if err != nil {
		return usagef("", "--for: %v", err)
	}
	if err := checkChanges(c, nil, q, "--set"); err != nil {
		return err
	}
	if _, err := parseFormat(c); err != nil {
		return err
	}
	gr, err := plan.CompareCases(cases, g.Name, plan.Question{For: q, Stream: c.String("stream")})
	if err != nil {
		return &inputError{err: err}
	}
	d := compareDoc(p, g, gr)
	d.Lead[0] = fmt.Sprintf("%s: the file's scenarios side by side, solving for %s; the base plan is the first row.", g.Name, gr.For)
	for _, cs := range cases[1:] {
		d.Lead = append(d.Lead, fmt.Sprintf("%s: %s.", cs.Name, scenarioText(p.Scenario(cs.Name))))
	}
	return out(c, e, d)
}

// compareDoc is the what-if grid gr of goal g, the base plan first.
func compareDoc(p *plan.Plan, g *plan.Goal, gr *plan.Grid) *render.Doc {
	d := newDoc(p, hasDrawdown(g))
	d.Lead = []string{fmt.Sprintf("%s: what-if, solving for %s; the base plan is the first row.", g.Name, gr.For)}
	if gr.For == plan.ForRate && g.Fee != 0 {
		d.Lead = append(d.Lead, fmt.Sprintf("Each rate is before the goal's fee of %s a year, which is taken as well.", pct(g.Fee)))
		d.Data["before_fee"] = jsonRate(g.Fee)
	}
	if a := gr.Base.Answer; a != nil && a.Stream != nil && (gr.For == plan.ForDeposit || gr.For == plan.ForWithdrawal) {
		switch {
		case slices.Contains(gr.Keys, "grow"):
			d.Lead = append(d.Lead, fmt.Sprintf("Each %s is the first year's amount of %s, which grows as its row says.", gr.For, streamLabel(a.Stream)))
			d.Data["amount_is"] = "first year"
		case firstYear(p, a.Stream, a.Amount) != "":
			d.Lead = append(d.Lead, fmt.Sprintf("Each %s is the first year's amount of %s, which grows %s.", gr.For, streamLabel(a.Stream), growthText(a.Stream)))
			d.Data["amount_is"], d.Data["grow"] = "first year", growthJSON(a.Stream)
		}
	}
	cols := []render.Column{{Head: "case", Key: "case"}}
	for _, k := range gr.Keys {
		cols = append(cols, render.Column{Head: k, Key: k})
	}
	anyErr := gr.Base.Err != nil
	// a withdrawal taxed on the way out: what each leaves to spend, beside
	// what the account pays
	taxedOut := func(c plan.Cell) bool { return c.Answer != nil && c.Answer.Net.Cmp(c.Answer.Amount) != 0 }
	net := gr.For == plan.ForWithdrawal && taxedOut(gr.Base)
	for _, c := range gr.Cells {
		anyErr = anyErr || c.Err != nil
		net = net || gr.For == plan.ForWithdrawal && taxedOut(c)
	}
	cols = append(cols, render.Column{Head: gr.For.String(), Key: "answer", Numeric: true})
	if net {
		d.Lead = append(d.Lead, "Each withdrawal is what the account pays; to spend is what it leaves after the tax on withdrawals.")
		cols = append(cols, render.Column{Head: "to spend", Key: "net", Numeric: true})
	}
	cols = append(cols, render.Column{Head: "why not", Key: "reason", Hidden: !anyErr})
	t := &render.Table{Cols: cols}
	// row adds one case to the table and returns its JSON form.
	row := func(name string, values []string, c plan.Cell) map[string]any {
		jc := map[string]any{"case": name}
		vals := map[string]any{}
		cells := []render.Cell{render.Text(name)}
		for i, k := range gr.Keys {
			vals[k] = values[i]
			cells = append(cells, render.Text(values[i]))
		}
		jc["values"] = vals
		if c.Err != nil {
			why := reasonOf(c.Err)
			cells = append(cells, render.Label("none", ""))
			if net {
				cells = append(cells, render.Label("-", ""))
				jc["net"] = nil
			}
			cells = append(cells, render.Text(why))
			jc["answer"], jc["reason"] = nil, why
		} else {
			ans := answerValue(p, c.Answer)
			cells = append(cells, ans)
			if net {
				cells = append(cells, cash(p, c.Answer.Net))
				jc["net"] = jamt(p, c.Answer.Net)
			}
			cells = append(cells, render.Text(""))
			jc["answer"] = ans.Plain()
		}
		t.Add(cells...)
		return jc
	}
	base := make([]string, len(gr.Keys))
	for i := range base {
		base[i] = "as planned"
	}
	jb := row("base", base, gr.Base)
	var cells []map[string]any
	for i, c := range gr.Cells {
		cells = append(cells, row(strconv.Itoa(i+1), c.Values, c))
	}
	d.Blocks = []render.Block{t}
	d.Data["goal"], d.Data["for"], d.Data["base"], d.Data["cells"] = g.Name, gr.For.String(), jb, cells
	return d
}

// checkChanges checks the --set changes and the --vary axes together, as
// the grid applies them: no key changed twice, and not the quantity q
// solved for. A refusal names flag.
func checkChanges(c *cli.Context, axes []plan.Vary, q plan.Quantity, flag string) error {
	sets, err := overrides(c)
	if err != nil {
		return err
	}
	var all []plan.Vary
	for _, o := range sets {
		all = append(all, plan.Vary{Key: o.Key, Values: []string{o.Value}})
	}
	if err := plan.CheckAxes(append(all, axes...), q); err != nil {
		return usagef("", "%s: %v", flag, err)
	}
	return nil
}
