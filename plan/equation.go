package plan

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

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
	// Per, when not 0, multiplies Amount before Factors: under between
	// simple or none, what the amounts of one interest period come to at
	// its end with the interest the rule gives them, in units of Amount;
	// for amounts paid after the last interest date before the deadline,
	// their sum at face value.
	Per float64
	// Note says how the factors describe the flow, where Factors alone do
	// not: a between rule's Per, a yearly rise.
	Note  string
	Value money.Amount // at the end of month At, signed
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
	// IncomeUnused is the income its months' withdrawals did not need: the
	// ledger does not deposit it, and the terms, each valued alone, count
	// it in full, so that they differ from Balance by more than rounding.
	IncomeUnused money.Amount
}

// incomeUnused returns the income of ledger l that its months'
// withdrawals did not need (see [Equation.IncomeUnused]), from its postings
// in minor units.
func incomeUnused(l *Ledger) money.Amount {
	var unused int64
	for _, r := range l.log.Posts {
		if r.Kind == engine.PostIncome {
			unused += r.Amount
		}
	}
	for _, pt := range l.log.Parts {
		unused -= pt.Covered
	}
	return money.Minor(unused, l.places)
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
	eq := &Equation{At: at, Balance: l.Closing, TaxOnGrowth: g.RateOnGrowth(), IncomeUnused: incomeUnused(l)}
	counts := make([]int, len(s.sources))
	units := make([]float64, len(s.sources)) // each source's first unit
	years := make([]int32, len(s.sources))   // and the yearly rises before it
	for i := range s.events() {
		if e := &s.events()[i]; flowOf(e, e.Src) {
			if counts[e.Src] == 0 {
				units[e.Src], years[e.Src] = s.eng.Unit(e), int32(e.Year)
			}
			counts[e.Src]++
		}
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
	// Every source valued alone, and all together, in one smooth walk.
	in := s.inputs(pr)
	alone := make([]float64, len(s.sources))
	all := engine.Walk(s.eng, &in, &engine.Options{Mode: engine.Smooth, Each: alone}).Closing
	var sumV float64       // the sources' values alone, unrounded
	var uncredited float64 // what the terms with factors earned after the last interest date
	ruled := -1            // the first source whose amounts its rule decides
	to := lastCredit       // under simple or none a part period earns at its end
	if g.Between == Compound {
		to = s.endTick
	}
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
		a := pr.amountsF[i] // the amount, before each flow's unit
		amt := pr.amounts[i]
		if src.out {
			amt, a = amt.Abs().Neg(), -math.Abs(a)
		}
		v := alone[i]
		sumV += v
		// A level stream's terms value its first amount as the ledger
		// posts every one, rounded to the cent. A rising one's amounts are
		// each rounded from the unrounded first, so its first amount's
		// unit is shown as factors of the amount as written where it is
		// their product (an index to today's money, the rises before a
		// later part of a stream).
		var lead []money.Factor
		if src.stream != nil && units[i] != 1 {
			if src.stream.growth(s.plan.Inflation) != 0 {
				lead = s.firstUnit(i, units[i], years[i])
			}
			if lead == nil {
				a *= units[i]
				amt = amt.MulFloat(units[i]).Round(s.places, s.rounding)
			}
		}
		t := Term{Label: src.name, Kind: src.kind, Amount: amt, Count: counts[i], Value: money.FromFloat(v).Round(s.places, s.rounding)}
		if t.Label == "" {
			t.Label = src.kind.String() + "s"
		}
		t.Why = s.noFactor(i, constRate)
		if t.Why == "" && pr.set != nil && pr.setSrc == int32(i) {
			var total float64
			for _, x := range pr.set {
				total += x
			}
			t.Why = fmt.Sprintf("its amounts are set date by date (%s in all), each grown at the plan's rates from its date",
				money.FromFloat(total).Round(s.places, s.rounding).Format(s.plan.Currency, false))
		}
		var parts []Term
		if t.Why == "" {
			parts, t.Why = s.form(i, rate, to)
		}
		if len(parts) == 0 {
			eq.Terms = append(eq.Terms, t)
			eq.Sum = eq.Sum.Add(t.Value)
			continue
		}
		// The terms value the amount as the ledger posts it, rounded to
		// the cent; the engine values it unrounded (a source's value is
		// linear in its amount).
		if a != 0 {
			v *= amt.Float() / a
		}
		var pv float64
		for k := range parts {
			pt := &parts[k]
			pt.Kind, pt.Amount = src.kind, amt
			if lead != nil {
				pt.Factors = append(slices.Clip(lead), pt.Factors...)
			}
			if pt.Label == "" {
				pt.Label = t.Label
			} else {
				pt.Label = t.Label + ", " + pt.Label
			}
			x := pt.Product()
			pv += x
			pt.Value = money.FromFloat(x).Round(s.places, s.rounding)
			eq.Sum = eq.Sum.Add(pt.Value)
		}
		// interest the factors carry past the last interest date: on the
		// source's last term
		parts[len(parts)-1].Uncredited = money.FromFloat(pv-v).Round(s.places, s.rounding)
		uncredited += pv - v
		eq.Terms = append(eq.Terms, parts...)
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
		const rest = ": no flow valued alone has it, so it is what the walk of every flow leaves beyond the other terms"
		label, kind, why := "offsetting flows", Interest, "flows offsetting within interest periods (between none)"
		switch {
		case g.HasCap && g.CapExcess != "":
			label, kind, why = "less what passed the cap", OverCap, "less what passed the yearly cap, with any employer contributions or flows offsetting within interest periods (between none)"
			if g.Match > 0 {
				label = "employer, less what passed the cap"
			}
		case g.Match > 0 && g.Between == None:
			label, kind, why = "employer contributions", Employer, "employer contributions, with flows offsetting within interest periods (between none)"
		case g.Match > 0:
			label, kind, why = "employer contributions", Employer, "the employer's contributions"
		}
		if d := money.FromFloat(all-sumV).Round(s.places, s.rounding); !d.IsZero() {
			eq.Terms = append(eq.Terms, Term{Label: label, Kind: kind, Value: d, Why: why + rest})
			eq.Sum = eq.Sum.Add(d)
		}
	}
	return eq
}

// firstUnit returns factors whose product is u, the unit of source i's
// first amount, which comes after year yearly rises: its index to today's
// money over the months from the plan's start to the stream's first,
// (F/P, inflation, years), and the rises, (F/P, g, years); nil when they
// are none or their product is not u.
func (s *schedule) firstUnit(i int, u float64, year int32) []money.Factor {
	st, p := s.sources[i].stream, s.plan
	var fs []money.Factor
	if st.Today && st.From > p.Start {
		fs = append(fs, money.Factor{Kind: money.FP, I: p.Inflation.Effective(), N: float64(st.From-p.Start) / 12})
	}
	if year > 0 {
		fs = append(fs, money.Factor{Kind: money.FP, I: st.growth(p.Inflation), N: float64(year)})
	}
	prod := 1.0
	for _, f := range fs {
		prod *= f.Value()
	}
	if len(fs) == 0 || math.Abs(prod-u) > 1e-12*math.Abs(u) {
		return nil
	}
	return fs
}

// Product returns the amount times its factors, the check of a term by
// hand; NaN when the term has no factors (nor Per).
func (t Term) Product() float64 {
	if len(t.Factors) == 0 && t.Per == 0 {
		return math.NaN()
	}
	v := t.Amount.Float()
	if t.Per != 0 {
		v *= t.Per
	}
	for _, f := range t.Factors {
		v *= f.Value()
	}
	return v
}

// noFactor says why no chain of standard factors describes source i of s
// whatever its flows, or "" when its flows decide (see [schedule.form]):
// constRate says that one rate holds throughout with no fee.
func (s *schedule) noFactor(i int, constRate bool) string {
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
	}
	return ""
}

// A point is what a source's flows come to on one date of its form: a
// flow itself, or under between simple or none the flows one interest
// date credits, each with its interest for the part period.
type point struct {
	tick int64
	w    float64 // in units of the source's amount
	year int32   // whole years of growth
	n    int     // how many flows
}

// form returns source i's flows in the trade's form, carried at rate to
// tick to: one term, or two for a stream raised once a year whose last
// year is not whole (its whole years, then the last). Each term holds
// Count, Per, Factors and Note; the caller sets the rest. Where no form
// applies it returns why.
//
// A flow on an interest date, or any flow under between compound, is
// carried at the effective rate per its own period: (F/P, j, n) for a
// single amount, (F/A, i, n) for a level stream of n amounts at i per
// deposit period. Under between simple or none a flow between interest
// dates is first taken to the next one with what it earns there (engine
// rule: j·τ, or nothing; a withdrawal under none loses the whole period);
// a stream whose interest periods each hold the same amounts is then a
// series of equal amounts at the interest dates, Per times its amount.
// A stream raised by g once a year is a series of yearly blocks: each
// year's m amounts carried to its last, (F/A, i, m), and the blocks a
// geometric series one year apart at the effective annual rate,
// (F/A, g, i, years); a last part year is its own term, its amount grown
// by (F/P, g, years).
//
// A flow on an interest date belongs to the period it begins, or to the
// one it ends: whichever gives a series (start or end of period timing).
func (s *schedule) form(i int, rate money.Rate, to int64) ([]Term, string) {
	terms, why := s.formOn(i, rate, to, false)
	if why != "" && s.goal.Between != Compound {
		return s.formOn(i, rate, to, true)
	}
	return terms, why
}

// formOn is form, with a flow on an interest date taken as paid at the end
// of the period it ends when own is set.
func (s *schedule) formOn(i int, rate money.Rate, to int64, own bool) (terms []Term, why string) {
	g, src := s.goal, s.sources[i]
	// amounts after the last interest date before the deadline (between
	// simple or none): held at face value then, their interest not yet
	// credited; a term of their own after the rest
	var tail Term
	defer func() {
		if why == "" && tail.Count > 0 {
			tail.Label = "after the last interest date"
			tail.Note = fmt.Sprintf("between %s: paid after the last interest date before the deadline, %s at face value then, the interest on %s credited later",
				g.Between, plural(tail.Count, "it is", "they are"), plural(tail.Count, "it", "them"))
			terms = append(terms, tail)
		}
	}()
	var flows []*engine.Event
	for k := range s.events() {
		if e := &s.events()[k]; flowOf(e, int32(i)) {
			flows = append(flows, e)
		}
	}
	if i == 0 { // the opening balance, at the plan's start
		flows = []*engine.Event{{Tick: 0}} // source 0, of unit 1: a whole period before its credit (between is false for it)
	}
	between := g.Between != Compound && !s.onCredits(int32(i)) && i != 0
	j := rate.PerPeriod(s.comp)
	// the points, D ticks apart, at rate r per D
	var pts []point
	D, r := s.period, j
	if src.stream != nil && !between {
		D, r = TicksPerYear/int64(src.stream.Every.PerYear()), rate.PerPeriod(src.stream.Every)
	}
	bw := "between " + g.Between.String() + ": "
	gr := 0.0 // the yearly rise
	if st := src.stream; st != nil {
		gr = st.growth(s.plan.Inflation)
	}
	for _, e := range flows {
		p := point{tick: e.Tick, w: s.eng.Unit(e) / s.eng.Unit(flows[0]), year: int32(e.Year), n: 1}
		if between && !(own && e.Tick%s.period == 0) {
			p.tick = e.Tick + int64(math.Round(s.eng.Tau(e)*float64(s.period)))
			if p.tick > to {
				tail.Count++
				tail.Per += p.w
				continue
			}
			p.w *= 1 + engine.Accrual(engine.Between(g.Between), j, math.Log1p(j), s.eng.Tau(e), src.out)
		}
		if between {
			if n := len(pts); n > 0 && pts[n-1].tick == p.tick {
				if pts[n-1].year != p.year && gr != 0 {
					return nil, bw + "a yearly rise falls inside an interest period, so no series of equal or evenly rising amounts at the interest dates applies"
				}
				pts[n-1].w += p.w
				pts[n-1].n++
				continue
			}
		}
		pts = append(pts, p)
	}
	if len(pts) == 0 {
		return nil, ""
	}
	last := pts[len(pts)-1]
	if last.tick > to { // not between interest dates: not after the deadline
		return nil, "some amounts fall after the deadline"
	}
	carry := func(from int64) []money.Factor { // from a point to the deadline
		if n := float64(to-from) / float64(D); n > 0 {
			return []money.Factor{{Kind: money.FP, I: r, N: n}}
		}
		return nil
	}
	if len(pts) == 1 {
		t := Term{Count: pts[0].n, Factors: carry(pts[0].tick)}
		if src.stream == nil {
			t.Factors = nil
			if n := float64(to-pts[0].tick) / float64(s.period); n > 0 {
				t.Factors = []money.Factor{{Kind: money.FP, I: j, N: n}}
			}
		}
		if between {
			t.Per = pts[0].w
			t.Note = s.perNote(src, 1, t.Per)
		}
		if len(t.Factors) == 0 && t.Per == 0 {
			t.Why = "paid at the deadline: its value is its amount"
			return nil, t.Why
		}
		return []Term{t}, ""
	}
	for k := 1; k < len(pts); k++ {
		if pts[k].tick-pts[k-1].tick != D {
			if between {
				return nil, bw + "some interest periods hold none of its amounts, so they are no series of amounts at the interest dates"
			}
			return nil, "its amounts are not evenly spaced"
		}
	}
	// the amounts: level, or raised by gr once a year
	per := pts[0].w
	for _, p := range pts {
		if want := per * math.Pow(1+gr, float64(p.year)); math.Abs(p.w-want) > 1e-9*math.Abs(want) {
			if between {
				return nil, bw + "its amounts fall at different points of each interest period, so what each period's amounts come to at its end differs and no series of equal amounts applies"
			}
			return nil, "its amounts are not all equal, nor rise by one rate once a year"
		}
	}
	n := len(pts)
	count := func(pts []point) int {
		c := 0
		for _, p := range pts {
			c += p.n
		}
		return c
	}
	t := Term{Count: count(pts)}
	if between {
		t.Per = per
	}
	m := int(TicksPerYear / D) // points a year
	if gr == 0 || pts[n-1].year == 0 {
		t.Factors = append([]money.Factor{{Kind: money.FA, I: r, N: float64(n)}}, carry(pts[n-1].tick)...)
		if between {
			t.Note = s.perNote(src, pts[0].n, per)
		}
		return []Term{t}, ""
	}
	if TicksPerYear%D != 0 {
		return nil, "its yearly rise does not fall on one of its periods"
	}
	for k, p := range pts {
		if int(p.year) != k/m {
			return nil, "its yearly rise does not fall every " + strconv.Itoa(m) + " of its amounts"
		}
	}
	years, rest := n/m, n%m
	iy := rate.Effective()
	if years > 0 {
		full := pts[years*m-1]
		t.Count = count(pts[:years*m])
		if m == 1 {
			t.Factors = []money.Factor{{Kind: money.FGeo, I: iy, G: gr, N: float64(years)}}
		} else {
			t.Factors = []money.Factor{{Kind: money.FA, I: r, N: float64(m)}, {Kind: money.FGeo, I: iy, G: gr, N: float64(years)}}
		}
		t.Factors = append(t.Factors, carry(full.tick)...)
		t.Note = fmt.Sprintf("raised %s a year: each year's %d %s to its last, the years a geometric series at %s a year",
			pct(gr), m, plural(m, "amount", "amounts"), pct(iy))
		if rest > 0 {
			t.Label = fmt.Sprintf("years 1–%d", years)
		}
		terms = append(terms, t)
	}
	if rest > 0 {
		u := Term{Count: count(pts[years*m:]), Per: t.Per, Label: fmt.Sprintf("year %d", years+1)}
		u.Factors = []money.Factor{{Kind: money.FP, I: gr, N: float64(years)}, {Kind: money.FA, I: r, N: float64(rest)}}
		u.Factors = append(u.Factors, carry(pts[n-1].tick)...)
		u.Note = fmt.Sprintf("the amount raised %s a year for %d %s, then its %d %s", pct(gr), years, plural(years, "year", "years"), rest, plural(rest, "amount", "amounts"))
		terms = append(terms, u)
	}
	if between {
		note := s.perNote(src, pts[0].n, per)
		for k := range terms {
			terms[k].Note = note + "; " + terms[k].Note
		}
	}
	return terms, ""
}

// perNote says what Per is for source src under the goal's between rule:
// what its k amounts in each interest period come to at the period's end.
func (s *schedule) perNote(src source, k int, per float64) string {
	g := s.goal
	earn := "with simple interest to its end"
	if g.Between == None {
		earn = "earning nothing until its end"
		if src.out {
			earn = "each losing the period's interest"
		}
	}
	what := fmt.Sprintf("each interest period's %d amounts, %s, come to", k, earn)
	if k == 1 {
		what = fmt.Sprintf("the amount, %s, comes to", strings.Replace(earn, "each ", "", 1))
	}
	return fmt.Sprintf("between %s: %s %s times the amount then", g.Between, what,
		strings.TrimSuffix(strings.TrimRight(strconv.FormatFloat(per, 'f', 6, 64), "0"), "."))
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// pct is fraction x as a percentage, with no more digits than it needs.
// pct is rate x as text writes rates (money.RateText): 7%, not the float's
// 7.000000000000001%.
func pct(x float64) string { return money.RateText(x) }
