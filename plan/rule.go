package plan

import (
	"fmt"
	"regexp"
	"strings"
	"sync"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// A RuleKind is how a withdrawal's amount is decided.
type RuleKind uint8

const (
	Fixed     RuleKind = iota // the amount as written, grown as the stream grows
	OfBalance                 // a share of the balance at each anniversary
	Guarded                   // the amount, cut or raised at each anniversary by the withdrawal rate
)

// A WithdrawalRule decides a withdrawal stream's amount at each anniversary
// of its first month (its year 0 included) from the balance then; the
// amount so decided is paid in each of the stream's periods of that year.
//
// The amount, its floor and its ceiling are in the stream's own terms: they
// grow as its amount grows (in today's money for an amount in today's money
// or a stream that grows with inflation).
type WithdrawalRule struct {
	Kind RuleKind
	// Share (OfBalance) is the yearly amount as a fraction of the balance.
	Share float64
	// Guarded: when the yearly amount over the balance is above Upper the
	// amount is cut by Cut, below Lower raised by Raise (fractions).
	Lower, Upper, Cut, Raise float64
	Floor, Ceiling           money.Amount // per period; Ceiling applies when HasCeiling
	HasCeiling               bool
}

var (
	ruleNumber  = `\s*\+?(\d+(?:\.\d*)?|\.\d+)\s*%\s*`
	ruleShare   = sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(`^(?i)` + ruleNumber + `of\s+(?:the\s+)?balance\s*$`) })
	ruleGuarded = sync.OnceValue(func() *regexp.Regexp {
		return regexp.MustCompile(`^(?i)\s*cut` + ruleNumber + `above` + ruleNumber + `,?\s*raise` + ruleNumber + `below` + ruleNumber + `$`)
	})
)

// ruleWant says how a rule is written, in errors and help.
const ruleWant = `"4% of balance", or "cut 10% above 6%, raise 10% below 4%"`

// ParseRule parses a withdrawal rule as written after rule: (see
// [WithdrawalRule]); its floor and ceiling are separate keys.
func ParseRule(s string) (WithdrawalRule, error) {
	pct := func(t string) float64 {
		var x float64
		fmt.Sscan(t, &x)
		return x / 100
	}
	if m := ruleShare().FindStringSubmatch(s); m != nil {
		r := WithdrawalRule{Kind: OfBalance, Share: pct(m[1])}
		if r.Share <= 0 || r.Share > 1 {
			return r, fmt.Errorf("share of the balance %s is out of range (want more than 0%% and at most 100%%)", money.Quote(strings.TrimSpace(m[1])+"%"))
		}
		return r, nil
	}
	if m := ruleGuarded().FindStringSubmatch(s); m != nil {
		r := WithdrawalRule{Kind: Guarded, Cut: pct(m[1]), Upper: pct(m[2]), Raise: pct(m[3]), Lower: pct(m[4])}
		switch {
		case r.Cut <= 0 || r.Cut >= 1:
			return r, fmt.Errorf("cut %s is out of range (want more than 0%% and less than 100%%)", money.Quote(strings.TrimSpace(m[1])+"%"))
		case r.Raise <= 0 || r.Raise > 1:
			return r, fmt.Errorf("raise %s is out of range (want more than 0%% and at most 100%%)", money.Quote(strings.TrimSpace(m[3])+"%"))
		case !(r.Lower < r.Upper):
			return r, fmt.Errorf("rule %s raises at a rate not below the rate it cuts at (want the raise's rate lower)", money.Quote(s))
		}
		return r, nil
	}
	return WithdrawalRule{}, fmt.Errorf("invalid rule %s (want %s)", money.Quote(s), ruleWant)
}

// String returns the rule as written in a goals file, "" for a fixed amount.
func (r WithdrawalRule) String() string {
	p := func(x float64) string { return money.Percent(x, 4) }
	switch r.Kind {
	case OfBalance:
		return p(r.Share) + " of balance"
	case Guarded:
		return "cut " + p(r.Cut) + " above " + p(r.Upper) + ", raise " + p(r.Raise) + " below " + p(r.Lower)
	}
	return ""
}

// engineRule returns r as the walk reads it for a stream of perYear
// periods a year.
func (r WithdrawalRule) engineRule(perYear int) engine.Rule {
	e := engine.Rule{Kind: engine.RuleKind(r.Kind), PerYear: float64(perYear), Share: r.Share,
		Lower: r.Lower, Upper: r.Upper, Cut: r.Cut, Raise: r.Raise, Floor: r.Floor.Float(), Ceiling: -1}
	if r.HasCeiling {
		e.Ceiling = r.Ceiling.Float()
	}
	return e
}

// ruledStream returns a [SolveError] when withdrawal stream st of goal g has
// a rule: its amounts follow the balance, so there is no one amount to
// solve for.
func ruledStream(g *Goal, st *Stream) error {
	if st.Rule.Kind == Fixed {
		return nil
	}
	name := "the withdrawal"
	if st.Name != "" {
		name = money.Quote(st.Name)
	}
	return noSolution(g, "the amounts of %s follow its rule (%s): there is no one amount to solve for", name, st.Rule)
}
