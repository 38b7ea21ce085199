package main

import (
	"fmt"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

// This file holds the words for an account's tax treatment (see
// [plan.Treatment]): what the file states, said back, and the after-tax
// figures the plan package computes. It formats; it does no arithmetic.

// taxed reports whether goal g states a tax treatment.
func taxed(g *plan.Goal) bool { return g.Tax != plan.Untaxed }

// taxWords says goal g's treatment with its rates: "taxed on the way out:
// deposits from pay before tax at 30%, withdrawals taxed at 20%".
func taxWords(g *plan.Goal) string {
	switch g.Tax {
	case plan.AsItGrows:
		return fmt.Sprintf("taxed as it grows: each year's interest is taxed at %s at the year's end, paid from the account", pct(g.RateOnGrowth()))
	case plan.OnTheWayOut:
		return fmt.Sprintf("taxed on the way out: deposits come from pay before tax (%s), withdrawals are taxed at %s", pct(g.RateIn()), pct(g.RateOut()))
	case plan.Never:
		return "never taxed again: deposits come from pay after tax; growth and withdrawals are not taxed"
	}
	return "no tax modelled"
}

// taxJSON is goal g's treatment and rates, for JSON.
func taxJSON(p *plan.Plan, g *plan.Goal) map[string]any {
	j := map[string]any{"treatment": g.Tax.String(), "rate": jsonRate(g.TaxRate)}
	if g.Tax == plan.OnTheWayOut {
		j["later"] = jsonRate(g.RateOut())
	}
	return j
}

// statusTaxLine is the status remark on taxed goal gs: its treatment and
// what its figures mean after tax.
func statusTaxLine(p *plan.Plan, gs plan.GoalStatus) string {
	g := gs.Goal
	s := fmt.Sprintf("%s: %s.", g.Name, taxWords(g))
	if g.Tax == plan.OnTheWayOut && g.HasTarget && g.HasBy {
		s += fmt.Sprintf(" The projected %s would leave %s to spend after tax.", amt(p, gs.Projected), amt(p, gs.ProjectedAfterTax))
	}
	if g.Tax == plan.AsItGrows && g.HasTarget && g.HasBy {
		s += " The projected balance is after that tax."
	}
	if gs.MonthlyNowFromPay.Cmp(gs.MonthlyNow) != 0 {
		s += fmt.Sprintf(" Its deposits of %s a month now cost %s a month of take-home pay", amt(p, gs.MonthlyNow), amt(p, gs.MonthlyNowFromPay))
		if gs.NeededErr == nil && gs.Needed != nil {
			s += fmt.Sprintf("; the needed %s %s would cost %s", amt(p, gs.Needed.Amount), every(gs.Needed.Stream), amt(p, gs.Needed.FromPay))
		}
		s += "."
	}
	return s
}

// solveTax adds to solve's document d and details det what answer a means
// after tax, for a goal with a tax treatment.
func solveTax(p *plan.Plan, a *plan.Answer, d *render.Doc, det *render.Facts) {
	g := a.Goal
	d.Lead = append(d.Lead, fmt.Sprintf("The account is %s.", taxWords(g)))
	d.Data["tax"] = taxJSON(p, g)
	switch {
	case a.For == plan.ForDeposit && a.FromPay.Cmp(a.Amount) != 0:
		d.Lead = append(d.Lead, fmt.Sprintf("Each deposit of %s lands in the account and costs %s of take-home pay.", amt(p, a.Amount), amt(p, a.FromPay)))
		det.Add("from take-home pay", cash(p, a.FromPay))
		d.Data["from_pay"] = jamt(p, a.FromPay)
	case a.For == plan.ForWithdrawal && a.Net.Cmp(a.Amount) != 0:
		d.Lead = append(d.Lead, fmt.Sprintf("The account pays %s each time, which leaves %s to spend after the tax on withdrawals.", amt(p, a.Amount), amt(p, a.Net)))
		det.Add("to spend after tax", cash(p, a.Net))
		d.Data["net"] = jamt(p, a.Net)
	}
	if a.BalanceAfterTax.Cmp(a.Balance) != 0 {
		det.Add("balance after the tax on withdrawals", cash(p, a.BalanceAfterTax))
		d.Data["balance_after_tax"] = jamt(p, a.BalanceAfterTax)
	}
}

// projectTaxLine is the projection's remark on taxed goal g with ledger l:
// its treatment, and what the closing balance leaves after the tax on
// withdrawals.
func projectTaxLine(p *plan.Plan, g *plan.Goal, l *plan.Ledger) string {
	s := fmt.Sprintf("The account is %s.", taxWords(g))
	if g.RateOut() > 0 {
		s += fmt.Sprintf(" The closing %s would leave %s to spend after tax; each withdrawal is shown as the account pays it.", amt(p, l.Closing), amt(p, p.AfterTax(g, l.Closing)))
	}
	for _, w := range g.Withdrawals {
		if w.Net && g.RateOut() > 0 {
			s += fmt.Sprintf(" %s is stated after tax: %s %s leaves the account as %s.", streamLabel(w), amt(p, w.Amount), every(w), amt(p, p.Gross(g, w.Amount)))
		}
	}
	return s
}

// employerLine is the status remark on goal gs's employer contributions,
// apart from the household's own money.
func employerLine(p *plan.Plan, gs plan.GoalStatus) string {
	g := gs.Goal
	s := fmt.Sprintf("%s: the employer adds %s of the household's deposits", g.Name, pct(g.Match))
	if g.HasMatchUpTo {
		s += fmt.Sprintf(" on up to %s of a salary of %s a year", pct(g.MatchUpTo), amt(p, g.Salary))
		switch {
		case g.SalaryInflation:
			s += " rising with inflation"
		case g.SalaryGrow != 0:
			s += fmt.Sprintf(" rising %s a year", pct(g.SalaryGrow))
		}
	}
	return s + fmt.Sprintf(": %s a month in the first year, beside the household's own %s.", amt(p, gs.EmployerMonthly), amt(p, gs.MonthlyNow))
}
