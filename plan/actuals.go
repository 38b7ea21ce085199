package plan

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"slices"
	"strings"

	"cairn/money"
)

// actualProblem returns why goal g refuses actual a, or "" when it takes it:
// a statement comes from the plan's start to today, one a month.
func (p *Plan) actualProblem(g *Goal, a Actual) string {
	switch {
	case a.Month < p.Start:
		return fmt.Sprintf("month %s is before the plan's start %s", a.Month, p.Start)
	case p.asOf != 0 && a.Month > p.asOf:
		return fmt.Sprintf("month %s is after today %s (a balance is known only once its month has passed; see --as-of)", a.Month, p.asOf)
	case a.Month > horizonEnd(p):
		return fmt.Sprintf("month %s is beyond the %d-year horizon", a.Month, HorizonYears)
	}
	for _, b := range g.Actuals {
		if b.Month == a.Month {
			return fmt.Sprintf("a second balance for %s in goal %s (%s has one)", a.Month, money.Quote(g.Name), b.Pos)
		}
	}
	return ""
}

func sortActuals(g *Goal) {
	slices.SortStableFunc(g.Actuals, func(a, b Actual) int { return int(a.Month - b.Month) })
}

// ActualsFilePos returns where the goals file names its actuals file.
func (p *Plan) ActualsFilePos() Position { return p.actualsPos }

// ReadActuals adds the actual balances of a CSV file to the plan's goals.
// Each line is month, goal, balance (such as 2028-06,Emergency fund,7412.30);
// a first line month,goal,balance is a header, and blank lines are skipped.
// name is used in positions. Every problem is reported at once, as an
// [ErrorList] positioned FILE:LINE:COL, and then no actual is added.
func (p *Plan) ReadActuals(name string, data []byte) error {
	var errs ErrorList
	at := func(line, col int, format string, args ...any) {
		errs = append(errs, &Error{Pos: Position{name, line, col}, Msg: fmt.Sprintf(format, args...)})
	}
	if len(data) > MaxFileSize {
		at(0, 0, "file is %d bytes, over the %d-byte limit for an actuals file", len(data), MaxFileSize)
		return errs
	}
	if utf16Text(data) {
		at(1, 1, "the file is in UTF-16 (want a CSV in UTF-8: save it as UTF-8)")
		return errs
	}
	r := csv.NewReader(bytes.NewReader(bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))))
	r.FieldsPerRecord = -1
	r.TrimLeadingSpace = true
	added := map[*Goal][]Actual{}
	for first := true; ; first = false {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				at(pe.Line, pe.Column, "%s (want month,goal,balance)", pe.Err)
			} else {
				at(0, 0, "%v", err)
			}
			break
		}
		pos := func(i int) (int, int) { return r.FieldPos(i) }
		field := func(i int) string { return strings.TrimSpace(rec[i]) }
		if first && len(rec) == 3 && strings.EqualFold(field(0), "month") && strings.EqualFold(field(1), "goal") {
			continue
		}
		line, col := pos(0)
		if len(rec) != 3 {
			at(line, col, "%d fields (want 3: month,goal,balance)", len(rec))
			continue
		}
		m, err := ParseMonth(field(0))
		if err != nil {
			at(line, col, "%v", err)
			continue
		}
		g := p.Goal(field(1))
		if g == nil {
			l, c := pos(1)
			var ns []string
			for _, h := range p.Goals {
				ns = append(ns, money.Quote(h.Name))
			}
			at(l, c, "no goal named %s (the goals are: %s)", money.Quote(field(1)), strings.Join(ns, ", "))
			continue
		}
		b, err := money.ParseAmount(field(2))
		bl, bc := pos(2)
		switch {
		case err != nil:
			at(bl, bc, "%v", err)
			continue
		case b.Sign() < 0:
			at(bl, bc, "negative balance %s (want 0 or more)", money.Quote(field(2)))
			continue
		case b.Cmp(money.Units(MaxAmountUnits)) > 0:
			at(bl, bc, "balance %s is beyond the limit of %s", money.Quote(field(2)), amountLimit)
			continue
		case finerThan(b, p.Currency) != "":
			at(bl, bc, "balance %s %s", money.Quote(field(2)), finerThan(b, p.Currency))
			continue
		}
		a := Actual{Month: m, Balance: b, Pos: Position{name, line, col}}
		h := &Goal{Name: g.Name, Actuals: append(slices.Clone(g.Actuals), added[g]...)}
		if msg := p.actualProblem(h, a); msg != "" {
			at(line, col, "%s", msg)
			continue
		}
		added[g] = append(added[g], a)
	}
	for _, g := range p.Goals {
		if n := len(g.Actuals) + len(added[g]); n > MaxActuals {
			at(0, 0, "%d actual balances for goal %s, over the limit of %d a goal", n, money.Quote(g.Name), MaxActuals)
		}
	}
	if len(errs) > 0 {
		errs.Sort()
		return errs
	}
	for _, g := range p.Goals {
		g.Actuals = append(g.Actuals, added[g]...)
		sortActuals(g)
	}
	if errs := p.replanBounds(); len(errs) > 0 {
		return errs
	}
	return nil
}

// replanBounds checks that each goal re-planned from its latest actual
// (see [Replan]) stays within the limits a goal in the file keeps (the
// largest balance, the work budget): an actual balance too large to plan
// from is refused where it is written, as a balance in the file is.
func (p *Plan) replanBounds() ErrorList {
	var errs ErrorList
	for _, g := range p.Goals {
		a, ok := g.Latest()
		if !ok {
			continue
		}
		q, h := Replan(p, g)
		if err := q.checkBounds(h); err != nil {
			errs = append(errs, &Error{Pos: a.Pos, Msg: fmt.Sprintf("actual balance %s at %s: re-planned from it, %s",
				a.Balance.Format(p.Currency, false), a.Month, boundsReason(g, err))})
		}
	}
	return errs
}
