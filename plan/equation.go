package plan

import (
	"fmt"
	"math"
	"slices"
	"strconv"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// A Term is one flow's part of the equation of value: its value at the
// deadline and, where one chain of factors describes it, the factors.
type Term struct {
	Label  string
	Kind   EntryKind
	Amount money.Amount // the flow's amount: per period for a stream (its first)
	Count  int          // how many amounts the term holds
	// Factors, multiplied together and by Amount, give Value: the flow
	// carried at the effective rate per period to the end of month At.
	// Empty when no standard factor describes the flow; Why then says why.
	Factors []money.Factor
	Why     string
	Value   money.Amount // at the end of month At, signed
	// Uncredited is the part of Value not in the balance at the end of
	// month At: interest the flow earned after the last interest date,
	// paid only at the next one.
	Uncredited money.Amount
}

// An Equation of value states the balance at the end of month At as the sum
// of every flow's value then. Sum equals Balance, the ledger's, within the
// rounding of its postings: half a cent at most a posting, each grown by
// interest to At like any other money; where a withdrawal could not be paid
// in full the terms overstate what went out, and where a month's income
// exceeds its withdrawals they count the surplus, which is not deposited.
//
// Where the deadline falls between interest dates, the terms with factors
// carry their flows to it; the interest they earned since the last interest
// date is not yet credited, and one term of kind Interest takes it back out
// (Uncredited, the sum of the terms' own).
type Equation struct {
	At         Month
	Terms      []Term
	Sum        money.Amount
	Balance    money.Amount
	Uncredited money.Amount
	// TaxOnGrowth is the rate each year's interest is taxed at, paid from
	// the account (see [AsItGrows]), 0 for none; AfterTax is then the
	// effective annual rate the balance grows at after that tax,
	// r(1 − TaxOnGrowth) for the first rate's effective annual rate r.
	TaxOnGrowth, AfterTax float64
}

// EquationOf returns the equation of value of goal g at the end of month at.
func EquationOf(p *Plan, g *Goal, at Month) *Equation { return equation(p, g, at, nil) }

func equation(p *Plan, g *Goal, at Month, pr *params) *Equation {
	s := compile(p, g, at)
	if pr == nil || len(pr.amounts) != len(s.sources) {
		pr = s.defaultParams()
	}
	return s.equation(pr, s.ledger(pr))
}

// equation states schedule s's balance at its end, under pr, as the sum of
// every flow's value then; l is the ledger of s under pr.
func (s *schedule) equation(pr *params, l *Ledger) *Equation {
	g, at := s.goal, s.end
	eq := &Equation{At: at, Balance: l.Closing, TaxOnGrowth: g.RateOnGrowth()}
	counts := make([]int, len(s.sources))
	first := make([]int64, len(s.sources))
	last := make([]int64, len(s.sources))
	uniform := make([]bool, len(s.sources))
	units := make([]float64, len(s.sources))
	for i := range uniform {
		uniform[i] = true
		first[i] = -1
	}
	for i := range s.events {
		e := &s.events[i]
		if !flowOf(e, e.Src) {
			continue
		}
		if first[e.Src] < 0 {
			first[e.Src] = e.Tick
			units[e.Src] = e.Unit
		}
		last[e.Src] = e.Tick
		if e.Unit != units[e.Src] {
			uniform[e.Src] = false
		}
		counts[e.Src]++
	}
	counts[0] = 1
	// One rate over the whole horizon and no fee: factors describe the flows.
	constRate := g.Fee == 0 && eq.TaxOnGrowth == 0
	for _, st := range g.Rates[1:] {
		if st.From <= at {
			constRate = false
		}
	}
	rate := g.Rates[0].Rate
	if pr.rate != nil {
		rate = *pr.rate
	}
	eq.AfterTax = rate.Effective() * (1 - eq.TaxOnGrowth)
	lastCredit := (s.endTick / s.period) * s.period
	onCredits := func(i int) bool { // every flow of source i lies on an interest date
		for k := range s.events {
			if e := &s.events[k]; flowOf(e, int32(i)) && e.Tick%s.period != 0 {
				return false
			}
		}
		return true
	}
	// Every source valued alone, and all together, in one smooth walk.
	in := s.inputs(pr)
	alone := make([]float64, len(s.sources))
	all := engine.Walk(s.eng, &in, &engine.Options{Mode: engine.Smooth, Each: alone}).Closing
	var sumV float64       // the terms' values, unrounded
	var uncredited float64 // what the terms with factors earned after the last interest date
	ruled := -1            // the first source whose amounts its rule decides
	for i, src := range s.sources {
		if i > 0 && counts[i] == 0 || i == 0 && pr.amounts[0].IsZero() {
			continue // no flow, no term
		}
		if s.rules != nil && s.rules[i].Kind != engine.RuleFixed {
			if ruled < 0 {
				ruled = len(eq.Terms)
			}
			continue
		}
		amt := pr.amounts[i]
		if src.out {
			amt = amt.Abs().Neg()
		}
		v := alone[i]
		if src.stream != nil && units[i] != 1 {
			amt = amt.MulFloat(units[i]).Round(s.places, s.rounding)
			if a := pr.amountsF[i]; uniform[i] && a != 0 && (pr.set == nil || pr.setSrc != int32(i)) {
				// The ledger posts the indexed amount rounded to the cent:
				// value that amount, so that Amount × Factors is Value (a
				// source's value is linear in its amount).
				v *= amt.Abs().Float() / units[i] / math.Abs(a)
			}
		}
		sumV += v
		t := Term{Label: src.name, Kind: src.kind, Amount: amt, Count: counts[i], Value: money.FromFloat(v).Round(s.places, s.rounding)}
		if t.Label == "" {
			t.Label = src.kind.String() + "s"
		}
		t.Why = s.noFactor(i, uniform[i], constRate, onCredits)
		if t.Why == "" {
			// The trade's form: each amount carried at the effective rate
			// per period (per deposit period for a stream) to the deadline.
			j := rate.PerPeriod(s.comp)
			to := lastCredit // under simple or none a part period earns at its end
			if g.Between == Compound {
				to = s.endTick
			}
			switch {
			case i == 0 || src.stream == nil:
				from := int64(0)
				if i > 0 {
					from = first[i]
				}
				if n := float64(to-from) / float64(s.period); n > 0 {
					t.Factors = []money.Factor{{Kind: money.FP, I: j, N: n}}
				}
			default:
				P := TicksPerYear / int64(src.stream.Every.PerYear())
				ip := rate.PerPeriod(src.stream.Every)
				t.Factors = []money.Factor{{Kind: money.FA, I: ip, N: float64(counts[i])}}
				if k := float64(to-last[i]) / float64(P); k > 0 {
					t.Factors = append(t.Factors, money.Factor{Kind: money.FP, I: ip, N: k})
				}
			}
			if pv := t.Product(); !math.IsNaN(pv) {
				t.Value = money.FromFloat(pv).Round(s.places, s.rounding)
				t.Uncredited = money.FromFloat(pv-v).Round(s.places, s.rounding)
				uncredited += pv - v
			}
		}
		eq.Terms = append(eq.Terms, t)
		eq.Sum = eq.Sum.Add(t.Value)
	}
	if d := money.FromFloat(uncredited).Round(s.places, s.rounding); !d.IsZero() {
		eq.Uncredited = d
		eq.Terms = append(eq.Terms, Term{Label: "earned, not yet credited", Kind: Interest, Value: d.Neg(),
			Why: "interest since the last interest date, credited after " + at.String()})
		eq.Sum = eq.Sum.Add(d.Neg())
	}
	// A rule decides its amounts from the whole balance, so no flow valued
	// alone shows them: the withdrawals under rules are valued together, as
	// what the walk of every source leaves beyond the other terms.
	if ruled >= 0 {
		d := money.FromFloat(all-sumV).Round(s.places, s.rounding)
		eq.Terms = slices.Insert(eq.Terms, ruled, Term{Label: "withdrawals decided by their rule", Kind: Withdrawal, Value: d,
			Why: "each amount is decided by its rule from the whole balance"})
		eq.Sum = eq.Sum.Add(d)
		return eq
	}
	// Under between none the walk is not linear in the amounts: flows that
	// offset within an interest period earn what no flow valued alone
	// shows. That difference is a term of its own.
	// An employer's contributions are no source's: no flow valued alone
	// has them, and they too are a term of their own.
	if g.Between == None || g.Match > 0 || g.HasCap && g.CapExcess != "" {
		label, kind := "flows offsetting within interest periods (between none)", Interest
		switch {
		case g.HasCap && g.CapExcess != "":
			label, kind = "less what passed the yearly cap, and any employer contributions or offsetting (between none)", OverCap
		case g.Match > 0 && g.Between == None:
			label, kind = "employer contributions, and flows offsetting within interest periods (between none)", Employer
		case g.Match > 0:
			label, kind = "employer contributions", Employer
		}
		if d := money.FromFloat(all-sumV).Round(s.places, s.rounding); !d.IsZero() {
			eq.Terms = append(eq.Terms, Term{Label: label, Kind: kind, Value: d})
			eq.Sum = eq.Sum.Add(d)
		}
	}
	return eq
}

// Product returns the amount times its factors, the check of a term by
// hand; NaN when the term has no factors.
func (t Term) Product() float64 {
	if len(t.Factors) == 0 {
		return math.NaN()
	}
	v := t.Amount.Float()
	for _, f := range t.Factors {
		v *= f.Value()
	}
	return v
}

// noFactor says why no chain of standard factors describes source i of s,
// or "" when one does: uniform says its amounts are all equal, constRate
// that one rate holds throughout with no fee, onCredits whether every flow
// of a source lies on an interest date.
func (s *schedule) noFactor(i int, uniform, constRate bool, onCredits func(int) bool) string {
	g, src := s.goal, s.sources[i]
	switch {
	case src.kind == Income:
		return "valued where it pays the month's withdrawals"
	case g.Fee != 0:
		return fmt.Sprintf("a fee of %s a year is taken from the balance each month", pct(g.Fee))
	case g.RateOnGrowth() > 0:
		return fmt.Sprintf("each year's interest is taxed at %s, paid from the account", pct(g.RateOnGrowth()))
	case !constRate:
		for _, st := range g.Rates[1:] {
			if st.From <= s.end {
				return "the rate changes in " + st.From.String()
			}
		}
	case !uniform:
		if src.stream != nil && src.stream.Grow != 0 || src.stream != nil && src.stream.GrowInflation {
			return fmt.Sprintf("raised %s a year, paid %d times a year: no single factor", pct(src.stream.growth(s.plan.Inflation)), src.stream.Every.PerYear())
		}
		return "its amounts are not all equal"
	case g.Between != Compound && !onCredits(i):
		return "between " + g.Between.String() + ": part periods earn no compound interest"
	}
	return ""
}

// pct is fraction x as a percentage, with no more digits than it needs.
func pct(x float64) string { return strconv.FormatFloat(x*100, 'f', -1, 64) + "%" }
