package plan

import (
	"fmt"
	"sync"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// An EntryKind is the kind of a ledger movement.
type EntryKind int

const (
	Opening    EntryKind = iota // the balance already saved at the start
	Deposit                     // one amount of a deposit stream
	Withdrawal                  // one amount of a withdrawal stream
	OneTime                     // a one-time amount, in or out
	Interest                    // interest credited at an interest date
	Fee                         // the monthly fee
	Income                      // income received outside the account (it moves no balance)
	Tax                         // the tax on a year's interest, paid from the account (see [AsItGrows])
	Employer                    // an employer's contribution matching a deposit (see Goal.Match)
	OverCap                     // the part of an amount over the yearly cap, gone to another goal (it moves no balance)
)

var entryNames = []string{"opening", "deposit", "withdrawal", "one-time", "interest", "fee", "income", "tax", "employer", "over the cap"}

func (k EntryKind) String() string { return entryNames[k] }

// An Entry is one movement on a goal's account.
type Entry struct {
	Tick    int64 // on the grid of [TicksPerYear] a year, from the plan's start
	Month   Month
	Kind    EntryKind
	Source  string       // the stream or one-time amount's name
	Amount  money.Amount // signed: positive in, negative out
	Balance money.Amount // after the movement
	// Short is the part of a withdrawal that could not be paid because the
	// balance ran out; zero otherwise.
	Short money.Amount
	// FromIncome is the part of a withdrawal its month's income paid; the
	// Amount is the rest, paid from the account.
	FromIncome money.Amount
}

// A Ledger is every movement on one goal's account, in decimal, from the
// plan's start through the end of month End. Its balances and postings are
// exact whole numbers of the currency's minor unit.
type Ledger struct {
	Plan    *Plan
	Goal    *Goal
	Start   Month
	End     Month
	Opening money.Amount
	Closing money.Amount

	places  int
	log     engine.Log // every movement and month end, in minor units
	sources []source   // what each flow's source is
	short   Month      // first month with a shortfall, 0 if none
	once    sync.Once
	entries []Entry
}

// Entries returns every movement, in order: the opening balance (if any),
// then each deposit, withdrawal, one-time amount, interest credit and fee.
func (l *Ledger) Entries() []Entry {
	l.once.Do(func() {
		l.entries = make([]Entry, 0, len(l.log.Posts)+1)
		if !l.Opening.IsZero() {
			l.entries = append(l.entries, Entry{Month: l.Start, Kind: Opening, Source: "opening balance", Amount: l.Opening, Balance: l.Opening})
		}
		bal, parts := l.log.Opening, l.log.Parts // the balance after each post, and the withdrawals' parts
		for i, r := range l.log.Posts {
			if r.Kind.Moves() {
				bal += r.Amount
			}
			e := Entry{Tick: int64(r.Tick), Month: l.Start + Month(r.Month()), Kind: Interest,
				Amount: money.Minor(r.Amount, l.places), Balance: money.Minor(bal, l.places)}
			switch r.Kind {
			case engine.PostFee:
				e.Kind = Fee
			case engine.PostTax:
				e.Kind = Tax
			case engine.PostOver:
				e.Kind, e.Source = OverCap, "to "+l.Goal.CapExcess
			case engine.PostMatch:
				e.Kind, e.Source = Employer, "employer, on "+l.sources[r.Src].name
			case engine.PostFlow, engine.PostIncome:
				e.Kind, e.Source = l.sources[r.Src].kind, l.sources[r.Src].name
			}
			if len(parts) > 0 && parts[0].Post == int32(i) {
				if parts[0].Short != 0 {
					e.Short = money.Minor(parts[0].Short, l.places)
				}
				if parts[0].Covered != 0 {
					e.FromIncome = money.Minor(parts[0].Covered, l.places)
				}
				parts = parts[1:]
			}
			l.entries = append(l.entries, e)
		}
	})
	return l.entries
}

// BalanceAt returns the closing balance at the end of month m, which must lie
// between the ledger's start and end.
func (l *Ledger) BalanceAt(m Month) money.Amount {
	if m < l.Start {
		return l.Opening
	}
	if m > l.End {
		m = l.End
	}
	return money.Minor(l.log.MonthEnd[m-l.Start], l.places)
}

// FirstShort returns the first month in which a withdrawal could not be paid
// in full, and whether there was one.
func (l *Ledger) FirstShort() (Month, bool) { return l.short, l.short != 0 }

// Project returns the ledger of goal g through the end of month end. A
// goal that draws on the plan's budget has its shares of it as allocated
// (see [Allocate]) as a deposit stream, "budget share".
func Project(p *Plan, g *Goal, end Month) (*Ledger, error) {
	if end < p.Start {
		return nil, fmt.Errorf("project %s: end %s is before the start %s", g.Name, end, p.Start)
	}
	if end > p.Start.Add(HorizonYears*12-1) {
		end = p.Start.Add(HorizonYears*12 - 1)
	}
	if i, ok := budgetIndex(p, g); ok { // with its share of the budget as allocated
		a, err := allocateThrough(p, end)
		if err != nil {
			return nil, err
		}
		return a.Ledger(i, end), nil
	}
	s := compile(p, g, end)
	return s.ledger(s.defaultParams()), nil
}

// ledger walks the schedule, recording every movement.
func (s *schedule) ledger(pr *params) *Ledger {
	p, g := s.plan, s.goal
	l := &Ledger{Plan: p, Goal: g, Start: p.Start, End: s.end, places: s.places, sources: s.sources}
	l.Opening = pr.amounts[0].Round(s.places, s.rounding)
	l.log.MonthEnd = make([]int64, s.end-p.Start+1)
	n := s.eng.MaxPosts()
	if g.Match > 0 {
		n += s.eng.MaxMatchPosts()
	}
	if g.HasCap && g.CapExcess != "" {
		n += s.eng.MaxOverPosts()
	}
	l.log.Posts = make([]engine.Post, 0, n)
	r := s.exact(pr, engine.Options{Log: &l.log})
	if r.Short {
		l.short = p.Start + Month(r.ShortMonth)
	}
	l.Closing = money.Minor(l.log.MonthEnd[len(l.log.MonthEnd)-1], s.places)
	return l
}

// A Period groups ledger entries into the rows of a projection.
type Period int

const (
	ByYear  Period = iota // one row per calendar year
	ByMonth               // one row per month
)

// A Row sums a projection period.
type Row struct {
	Label       string // "2027" or "2027-03"
	From, To    Month
	Opening     money.Amount
	Deposits    money.Amount // stream deposits and one-time amounts in
	Withdrawals money.Amount // stream withdrawals and one-time amounts out, as a positive sum
	Interest    money.Amount
	Fees        money.Amount // as a positive sum
	// Income is the goal's income that paid withdrawals (not in Deposits,
	// and not in Withdrawals, which are what the account paid).
	Income   money.Amount
	Tax      money.Amount // tax on interest paid from the account, as a positive sum
	Employer money.Amount // an employer's contributions, not in Deposits
	// Budget is the goal's shares of the household budget, not in Deposits
	// (see [Allocation]).
	Budget       money.Amount
	Closing      money.Amount
	ClosingToday money.Amount // the closing balance in today's money
	Short        money.Amount // withdrawals that could not be paid
}

// Rows sums the ledger by year or by month. The last row is the totals when
// totals is true (its Opening is the ledger's opening and Closing its
// closing). It sums the walk's postings in minor units, without making an
// [Entry] of each.
func (l *Ledger) Rows(by Period, totals bool) []Row {
	var rows []Row
	rowOf := make([]int32, l.End-l.Start+1) // each month's row
	for m := l.Start; m <= l.End; m++ {
		if len(rows) == 0 || by == ByMonth || m.Year() != rows[len(rows)-1].From.Year() {
			label := m.String()
			if by == ByYear {
				label = fmt.Sprint(m.Year())
			}
			opening := l.Opening
			if m > l.Start {
				opening = l.BalanceAt(m - 1)
			}
			rows = append(rows, Row{Label: label, From: m, Opening: opening})
		}
		rowOf[m-l.Start] = int32(len(rows) - 1)
		rows[len(rows)-1].To = m
		rows[len(rows)-1].Closing = l.BalanceAt(m)
	}
	// each row's sums, in minor units: deposits, withdrawals, interest,
	// fees, income, tax, employer, short, budget
	const nSums = 9
	sums := make([]minorSum, nSums*len(rows))
	for i := range sums {
		sums[i].places = l.places
	}
	for i := range l.log.Posts {
		r := &l.log.Posts[i]
		m := r.Month()
		if m < 0 || int(m) >= len(rowOf) {
			continue
		}
		row := sums[nSums*int(rowOf[m]):][:nSums]
		switch {
		case (r.Kind == engine.PostFlow || r.Kind == engine.PostIncome) && l.sources[r.Src].kind == Income:
			// received outside the account: counted where it pays
		case r.Kind == engine.PostFee:
			row[3].add(-r.Amount)
		case r.Kind == engine.PostTax:
			row[5].add(-r.Amount)
		case r.Kind == engine.PostMatch:
			row[6].add(r.Amount)
		case r.Kind == engine.PostOver:
			continue // gone to another goal: no movement here
		case r.Kind != engine.PostFlow && r.Kind != engine.PostIncome:
			row[2].add(r.Amount)
		case r.Amount >= 0 && l.sources[r.Src].stream != nil && l.sources[r.Src].stream.share:
			row[8].add(r.Amount)
		case r.Amount >= 0:
			row[0].add(r.Amount)
		default:
			row[1].add(-r.Amount)
		}
	}
	for _, pt := range l.log.Parts { // what income paid and what was short
		r := &l.log.Posts[pt.Post]
		m := r.Month()
		if m < 0 || int(m) >= len(rowOf) {
			continue
		}
		row := sums[nSums*int(rowOf[m]):][:nSums]
		row[4].add(pt.Covered)
		row[7].add(pt.Short)
	}
	var tot Row
	for i := range rows {
		r := &rows[i]
		row := sums[nSums*i:][:nSums]
		r.Deposits, r.Withdrawals, r.Interest, r.Fees = row[0].amount(), row[1].amount(), row[2].amount(), row[3].amount()
		r.Income, r.Tax, r.Employer, r.Short = row[4].amount(), row[5].amount(), row[6].amount(), row[7].amount()
		r.Budget = row[8].amount()
		r.ClosingToday = l.Plan.Today(r.Closing, r.To)
		tot.Deposits = tot.Deposits.Add(r.Deposits)
		tot.Withdrawals = tot.Withdrawals.Add(r.Withdrawals)
		tot.Interest = tot.Interest.Add(r.Interest)
		tot.Fees = tot.Fees.Add(r.Fees)
		tot.Income = tot.Income.Add(r.Income)
		tot.Tax = tot.Tax.Add(r.Tax)
		tot.Employer = tot.Employer.Add(r.Employer)
		tot.Budget = tot.Budget.Add(r.Budget)
		tot.Short = tot.Short.Add(r.Short)
	}
	if totals && len(rows) > 0 {
		tot.Label, tot.From, tot.To = "total", l.Start, l.End
		tot.Opening, tot.Closing = l.Opening, l.Closing
		tot.ClosingToday = l.Plan.Today(l.Closing, l.End)
		rows = append(rows, tot)
	}
	return rows
}

// A minorSum adds whole minor units exactly: in an int64 while it holds
// them (every posting is below 2⁵³), carried into a decimal past 2⁶².
type minorSum struct {
	n      int64
	places int
	carry  money.Amount
}

func (s *minorSum) add(x int64) {
	if s.n > 1<<62 || s.n < -1<<62 {
		s.carry = s.carry.Add(money.Minor(s.n, s.places))
		s.n = 0
	}
	s.n += x
}

// amount returns the sum in currency units.
func (s *minorSum) amount() money.Amount { return money.Minor(s.n, s.places).Add(s.carry) }
