package plan

import (
	"math"
	"slices"

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
	// Factors, multiplied together and by Amount, give Value; empty when no
	// standard factor describes the flow (rate changes, fees, growing
	// amounts, or money between interest dates under a simple or none rule).
	Factors []money.Factor
	Value   money.Amount // at the end of month At, signed
}

// An Equation of value states the balance at the end of month At as the sum
// of every flow's value then. Sum equals Balance, the ledger's, within the
// rounding of its postings: half a cent at most a posting, each grown by
// interest to At like any other money; where a withdrawal could not be paid
// in full the terms overstate what went out, and where a month's income
// exceeds its withdrawals they count the surplus, which is not deposited.
type Equation struct {
	At      Month
	Terms   []Term
	Sum     money.Amount
	Balance money.Amount
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
	var sumV float64 // the terms' values, unrounded
	ruled := -1      // the first source whose amounts its rule decides
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
		// income is valued where it pays the withdrawals, which no
		// factor of its own dates describes
		if src.kind != Income && constRate && uniform[i] && (g.Between == Compound || onCredits(i)) && (i == 0 || last[i] <= lastCredit) {
			j := rate.PerPeriod(s.comp)
			switch {
			case i == 0 || src.stream == nil:
				from := int64(0)
				if i > 0 {
					from = first[i]
				}
				if n := float64(lastCredit-from) / float64(s.period); n > 0 {
					t.Factors = []money.Factor{{Kind: money.FP, I: j, N: n}}
				}
			default:
				P := TicksPerYear / int64(src.stream.Every.PerYear())
				ip := rate.PerPeriod(src.stream.Every)
				t.Factors = []money.Factor{{Kind: money.FA, I: ip, N: float64(counts[i])}}
				if k := float64(lastCredit-last[i]) / float64(P); k > 0 {
					t.Factors = append(t.Factors, money.Factor{Kind: money.FP, I: ip, N: k})
				}
			}
		}
		eq.Terms = append(eq.Terms, t)
		eq.Sum = eq.Sum.Add(t.Value)
	}
	// A rule decides its amounts from the whole balance, so no flow valued
	// alone shows them: the withdrawals under rules are valued together, as
	// what the walk of every source leaves beyond the other terms.
	if ruled >= 0 {
		d := money.FromFloat(all-sumV).Round(s.places, s.rounding)
		eq.Terms = slices.Insert(eq.Terms, ruled, Term{Label: "withdrawals decided by their rule", Kind: Withdrawal, Value: d})
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
