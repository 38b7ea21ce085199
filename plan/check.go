package plan

import (
	"fmt"

	"cairn/money"
)

// A problem is a rule across keys that a goal breaks: the goals file refuses
// it at the key it names, and a what-if (--set, --vary) refuses it with the
// same message.
type problem struct {
	goal     *Goal
	at       string   // the key it is positioned at, relative to the goal; "" for the goal itself
	key      string   // the key the message names, relative to the goal; "" for the goal itself
	involves []string // keys whose own refusal makes the problem moot
	msg      string
}

// settle fills in what one key implies for another: an amount in today's
// money rises with inflation unless grow says otherwise. It runs after
// parsing and after every what-if change.
func (p *Plan) settle() {
	for _, g := range p.Goals {
		for _, ss := range [][]*Stream{g.Deposits, g.Withdrawals, g.Income} {
			for _, s := range ss {
				if !s.growSet {
					s.Grow, s.GrowInflation = 0, s.Today
				}
			}
		}
	}
	if b := p.Budget; b != nil && !b.growSet {
		b.Grow, b.GrowInflation = 0, b.Today
	}
}

// problems runs the cross-field checks over every goal of the plan. They run
// after parsing and after every what-if change. (Unique goal names are the
// decoder's: they are about the list as written, and no what-if renames.)
func (p *Plan) problems() []problem {
	var out []problem
	for _, g := range p.Goals {
		if n := len(streams(g)); n > MaxStreams {
			out = append(out, problem{goal: g, msg: fmt.Sprintf("%d streams, over the limit of %d a goal", n, MaxStreams)})
		}
		for i, s := range g.Deposits {
			if s.UntilReached && !g.HasTarget {
				at := fmt.Sprintf("deposits[%d].until", i)
				out = append(out, problem{goal: g, at: at, key: at, involves: []string{at, "target"},
					msg: "reached needs the goal's target (add target:)"})
			}
		}
		for i, s := range g.Income {
			if s.Rule != (WithdrawalRule{}) {
				at := fmt.Sprintf("income[%d]", i)
				out = append(out, problem{goal: g, at: at, key: at, msg: "rule, floor and ceiling are for withdrawals, not income"})
			}
		}
		for i, s := range g.Withdrawals {
			r, at := s.Rule, fmt.Sprintf("withdrawals[%d]", i)
			switch {
			case r.Kind == Fixed && (r.Floor.Sign() != 0 || r.HasCeiling):
				out = append(out, problem{goal: g, at: at, key: at, msg: "floor and ceiling need a rule (add rule:)"})
			case r.HasCeiling && r.Floor.Cmp(r.Ceiling) > 0:
				out = append(out, problem{goal: g, at: at + ".floor", key: at + ".floor", involves: []string{at + ".floor", at + ".ceiling"},
					msg: "the floor is above the ceiling"})
			case r.Kind == Guarded && s.Amount.Sign() == 0:
				out = append(out, problem{goal: g, at: at, key: at, involves: []string{at + ".amount", at + ".rule"},
					msg: "a rule that cuts and raises starts from the amount (add amount:)"})
			}
		}
		if g.TargetToday && !g.HasBy {
			out = append(out, problem{goal: g, at: "target", key: "target", involves: []string{"target", "by"},
				msg: "a target in today's money needs a deadline (want by: YYYY-MM)"})
		}
		if g.CapExcess != "" {
			to := p.Goal(g.CapExcess)
			switch {
			case !g.HasCap:
				out = append(out, problem{goal: g, at: "cap_excess", key: "cap_excess", involves: []string{"cap_excess", "cap"},
					msg: "cap_excess needs a cap (want cap: the most a year)"})
			case to == nil || to == g:
				out = append(out, problem{goal: g, at: "cap_excess", key: "cap_excess", involves: []string{"cap_excess"},
					msg: fmt.Sprintf("cap_excess names no other goal %s (want the name of another goal of the file)", money.Quote(g.CapExcess))})
			case to.CapExcess != "" || p.receives(g):
				out = append(out, problem{goal: g, at: "cap_excess", key: "cap_excess", involves: []string{"cap_excess"},
					msg: "what passes a cap goes to a goal that passes nothing on, from a goal that receives nothing (want one step)"})
			}
		} else if from, in, over := p.OverCap(g); over {
			out = append(out, problem{goal: g, at: "cap", key: "cap", involves: []string{"cap", "deposits", "once", "balance", "rate"},
				msg: fmt.Sprintf("%s goes into the account in the year from %s, over the yearly cap of %s (want at most the cap)",
					in.Format(p.Currency, false), from, g.Cap.Format(p.Currency, false))})
		}
		if g.HasMatchUpTo && g.Salary.IsZero() && g.Match != 0 {
			out = append(out, problem{goal: g, at: "match_up_to", key: "match_up_to", involves: []string{"match_up_to", "salary", "match"},
				msg: "a match up to a share of the salary needs a salary above 0 (want salary: the pay a year; with no pay, match: 0%)"})
		}
		if g.Tax == Untaxed && (g.TaxRate != 0 || g.HasTaxLater) {
			out = append(out, problem{goal: g, at: "tax_rate", key: "tax_rate", involves: []string{"tax", "tax_rate", "tax_later"},
				msg: "a tax rate needs a tax treatment (want tax: as-it-grows, on-the-way-out or never)"})
		}

	}
	return out
}
