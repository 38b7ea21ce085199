package main

import (
	"fmt"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

func statusCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "status",
		Usage:     "the household at a glance: every goal, its deadline, and whether it is on track",
		ArgsUsage: "[FILE]",
		Description: "For every goal: the target as written and at its deadline, the balance projected at the\n" +
			"deadline, the month the target is reached, on track or short by how much, and the deposit\n" +
			"per period needed to make the deadline; then the total set aside a month now and needed.\n\n" +
			"--set changes every goal, or only the one named by --goal; a change to a stream (deposit,\n" +
			"withdrawal, grow, every) needs --goal when the file has several goals.\n\n" +
			"Example:\n   cairn status examples/household.yaml\n   cairn status examples/household.yaml --set inflation=3% --format json\n" +
			"   cairn status examples/household.yaml --goal Education --set deposit=200",
		Flags: append(fileFlags(true),
			&cli.StringFlag{Name: "goal", Aliases: []string{"g"}, Usage: "the goal that --set changes, by `NAME` (every goal is still shown)"},
			&cli.StringFlag{Name: "stream", Usage: "the stream that --set changes, by `NAME` (the goal's first when not given)"},
		),
		Action: func(c *cli.Context) error {
			p, err := readPlan(c, e)
			if err != nil {
				return err
			}
			if c.IsSet("goal") {
				if _, err := goalOf(c, p); err != nil {
					return err
				}
			}
			if _, err := parseFormat(c); err != nil {
				return err
			}
			return out(c, e, statusDoc(p, plan.StatusOf(p)))
		},
	}
}

// statusDoc is every goal of p at a glance; its table and remarks are also
// the first page of the report.
func statusDoc(p *plan.Plan, st *plan.Status) *render.Doc {
	d := newDoc(p, false)
	t := &render.Table{Cols: []render.Column{
		{Head: "goal", Key: "goal"}, {Head: "target", Key: "target", Numeric: true}, {Head: "at deadline", Key: "target_at_deadline", Numeric: true},
		{Head: "deadline", Key: "deadline"}, {Head: "projected", Key: "projected", Numeric: true}, {Head: "reached", Key: "reached"},
		{Head: "status", Key: "status"}, {Head: "short by", Key: "short_by", Numeric: true, Hidden: true},
		{Head: "needed", Key: "needed"}, {Head: "every", Key: "needed_every", Hidden: true},
		{Head: "grows", Key: "needed_grows", Hidden: true}, {Head: "in today's money", Key: "target_in_todays_money", Hidden: true},
	}}
	var goals []map[string]any
	drawdown := false
	for _, gs := range st.Goals {
		goal := gs.Goal
		target, atDeadline, deadline, projected, reached := render.None(), render.None(), render.None(), render.None(), render.None()
		status, shortBy, needed, neededEvery, neededGrows := render.None(), render.Text(""), render.None(), render.Text(""), render.Text("")
		today := render.Text("")
		jg := map[string]any{"goal": goal.Name}
		if goal.HasTarget {
			target = cash(p, goal.Target)
			if goal.TargetToday {
				target = target.Then(" today")
			}
			jg["target"] = jamt(p, goal.Target)
			jg["target_in_todays_money"] = goal.TargetToday
			today = render.Bool(goal.TargetToday)
		}
		if goal.HasBy {
			deadline = render.Month(goal.By)
			jg["deadline"] = goal.By.String()
		}
		if goal.HasTarget && goal.HasBy {
			atDeadline, projected = cash(p, gs.TargetAt), cash(p, gs.Projected)
			jg["target_at_deadline"], jg["projected"] = jamt(p, gs.TargetAt), jamt(p, gs.Projected)
			jg["on_track"] = gs.OnTrack
			if gs.OnTrack {
				status = render.Text("on track")
			} else {
				status = render.Label("short by "+amt(p, gs.Short), "short")
				shortBy = cash(p, gs.Short)
				jg["short_by"] = jamt(p, gs.Short)
			}
			if gs.NeededErr == nil {
				a := gs.Needed
				needed = cash(p, a.Amount).Then(" " + every(a.Stream))
				neededEvery = render.Text(a.Stream.Every.String())
				jn := map[string]any{"amount": jamt(p, a.Amount), "every": a.Stream.Every.String(), "stream": streamLabel(a.Stream), "in_todays_money": a.Stream.Today}
				if fy := firstYear(p, a.Stream, a.Amount); fy != "" {
					needed = needed.Then(" *")
					neededGrows = render.Label(growthText(a.Stream), growthPlain(a.Stream))
					jn["grow"], jn["amount_is"] = growthJSON(a.Stream), "first year"
					d.After = append(d.After, fmt.Sprintf("%s: * %s.", goal.Name, fy))
				}
				jg["needed"] = jn
			} else {
				jg["needed_reason"] = reasonOf(gs.NeededErr)
				d.After = append(d.After, fmt.Sprintf("%s: no deposit makes the deadline: %s.", goal.Name, reasonOf(gs.NeededErr)))
			}
		}
		if goal.HasTarget {
			if gs.Reach == nil {
				reached = render.Month(gs.Reached)
				jg["reached"] = gs.Reached.String()
			} else {
				reached = render.Label("not reached", "")
				jg["reached"] = nil
				jg["not_reached_reason"] = reasonOf(gs.Reach)
				d.After = append(d.After, fmt.Sprintf("%s: the target is not reached: %s.", goal.Name, reasonOf(gs.Reach)))
			}
		}
		if gs.Lasts != nil {
			drawdown = true
			if gs.Lasts.Lasts {
				d.After = append(d.After, fmt.Sprintf("%s: the money lasts through %s, leaving %s.", goal.Name, gs.Lasts.Month, amt(p, gs.Lasts.Left)))
				jg["money_lasts"] = true
				jg["lasts_through"] = gs.Lasts.Month.String()
			} else {
				d.After = append(d.After, fmt.Sprintf("%s: the money runs out in %s.", goal.Name, gs.Lasts.Month))
				jg["money_lasts"] = false
				jg["runs_out"] = gs.Lasts.Month.String()
			}
		}
		jg["monthly_now"], jg["monthly_needed"] = jamt(p, gs.MonthlyNow), jamt(p, gs.MonthlyNeeded)
		t.Add(render.Text(goal.Name), target, atDeadline, deadline, projected, reached, status, shortBy, needed, neededEvery, neededGrows, today)
		goals = append(goals, jg)
	}
	d.Notices = notices(drawdown)
	d.Blocks = []render.Block{t}
	d.After = append(d.After, fmt.Sprintf("Set aside now: %s a month; needed to make every deadline: %s a month.",
		amt(p, st.MonthlyNow), amt(p, st.MonthlyNeeded)))
	d.Data["goals"] = goals
	d.Data["monthly_now"] = jamt(p, st.MonthlyNow)
	d.Data["monthly_needed"] = jamt(p, st.MonthlyNeeded)
	return d
}
