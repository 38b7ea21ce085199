package plan

import (
	"regexp"
	"slices"
	"strings"
	"sync"

	"cairn/money"
)

// A Scope is where in a goals file a key may appear.
type Scope int

const (
	InPlan         Scope = iota // the top level
	InGoal                      // each goal
	InStream                    // each deposit or withdrawal stream
	InWithdrawal                // withdrawal streams only
	InOnce                      // each one-time amount
	InRateStep                  // each step of a rate schedule
	InScenario                  // each named scenario
	InChange                    // each change of a scenario: a goal, a stream and what-if keys
	InActual                    // each actual balance of a goal
	InPerson                    // each of the household's people
	InBudget                    // the budget: a stream's keys and its rule
	InBudgetChange              // each change of the budget's amount from a month on
)

// where says where in the file a key of each scope is written, in errors
// about a key given in the wrong place.
var where = map[Scope]string{
	InPlan:         "the top level of the file",
	InGoal:         "each goal (under goals:)",
	InStream:       "each stream (under deposits: or withdrawals:)",
	InWithdrawal:   "each withdrawal or income stream (under withdrawals: or income:)",
	InOnce:         "each one-time amount (under once:)",
	InRateStep:     "each step of a rate schedule (under rate:)",
	InScenario:     "each scenario (under scenarios:)",
	InChange:       "each change of a scenario (under changes:)",
	InActual:       "each actual balance (under actuals:)",
	InPerson:       "each person (under people:)",
	InBudget:       "the budget (under budget:)",
	InBudgetChange: "each change of the budget (under budget: changes:)",
}

// scopesOf says where the key name belongs, for every scope that has it
// ("each goal (under goals:)"), or "" when no scope has it. A scenario's
// change is left out: its keys are what-if names, and a key written in the
// wrong place of the plan belongs in the plan.
func scopesOf(name string) string {
	var out []string
	for _, k := range Keys {
		if w := where[k.Scope]; k.Name == name && k.Scope != InChange && !slices.Contains(out, w) {
			out = append(out, w)
		}
	}
	return strings.Join(out, ", or in ")
}

// A Form is how a key's value is written.
type Form int

const (
	FormVersion      Form = iota // the format version, 1
	FormMonth                    // YYYY-MM
	FormCurrency                 // an ISO 4217 code
	FormRounding                 // half-even or half-up
	FormRate                     // a rate in one of the trade's forms, between Min and Max % a year effective
	FormRates                    // a FormRate, or a list of rate steps (InRateStep)
	FormVolatility               // a percentage a year, 0% to MaxVolatilityPercent
	FormName                     // text of at most MaxNameLength characters
	FormAmount                   // an amount, 0 or more
	FormAmountToday              // an amount, 0 or more, or "… today" in today's money
	FormSignedAmount             // an amount: positive in, negative out
	FormChoice                   // one of Choices
	FormFrequency                // a payment frequency (not continuous)
	FormLength                   // a number of years or months
	FormGrowth                   // a yearly rate between Min and Max %, or "inflation"
	FormList                     // a list of mappings, each in the scope Items
	FormMapping                  // one mapping in the scope Items
	FormCount                    // a whole number from Min to Max
	FormUntil                    // a FormMonth, or reached
	FormTaxRate                  // a percentage, 0% or more and below 100%
	FormShare                    // a percentage from 0% to 100%
	FormRule                     // a withdrawal rule (ParseRule)
)

// want says what a value of the form looks like, in error messages.
var want = map[Form]string{
	FormVersion:    "the format version 1",
	FormMonth:      "a month such as 2027-01",
	FormCurrency:   "an ISO 4217 code such as USD",
	FormRounding:   "half-even or half-up (half_even, halfeven, half_up and halfup mean the same)",
	FormRate:       "a rate such as 4.1%",
	FormVolatility: "a volatility a year such as 12%",
	FormFrequency:  "a frequency such as month",
	FormLength:     "a length such as 30 years",
	FormGrowth:     "a yearly rate such as 3% or inflation",
	FormCount:      "a whole number such as 1",
	FormUntil:      "a month such as 2031-12, or reached",
	FormTaxRate:    "a tax rate such as 25%",
	FormShare:      "a share such as 50%",
	FormRule:       "a rule such as " + ruleWant,
}

// A Choice is one word a FormChoice key accepts and the value it stands for.
type Choice struct {
	Word  string
	Value int
}

// A Key is one key of the goals file: where it may appear, how its value is
// written and checked, where it goes in the model, its help text, and
// whether a what-if (--set KEY=VALUE, --vary KEY=V1,V2) may change it. The
// file decoder, [Plan.With] and the help text all read [Keys].
type Key struct {
	Name  string
	Scope Scope
	Form  Form
	Items Scope // FormList: the scope of each item

	Min, Max float64  // FormRate, FormRates, FormGrowth: the range, % a year effective
	Choices  []Choice // FormChoice: the words accepted
	Noun     string   // FormChoice: what a value is called in errors ("rule")
	Want     string   // FormChoice: the words to suggest ("compound, simple or none")

	MaxItems int // FormList, FormRates: the most items a list may hold

	Required bool
	Unless   string // Required unless this key of scope UnlessIn is given beside it
	UnlessIn Scope
	Missing  string // the reason given when a required key is missing, or ""
	OrAsOf   bool   // Required unless the caller gives today's month (Parse's asOf)

	Default string // help: the value when the key is absent
	Help    string // help: what the key means, one or more lines

	// Set is the name under which --set and --vary change the key, or ""
	// when they cannot; SetOut the name that changes the key of a
	// withdrawal stream. A key of a stream changes the deposit (or, under
	// SetOut, withdrawal) stream named by --stream, the first when none is
	// named, so it needs the goal named when a file has several goals.
	// SetBudget is the name that changes the key of the budget's stream,
	// which needs no goal named.
	Set, SetOut, SetBudget string

	put func(t *target, v value) // stores a parsed value in the model
}

// Waived reports whether k, when required, is not required in a mapping of
// keys ks: its Unless key of scope UnlessIn is among them and given
// reports it given.
func (k *Key) Waived(ks []*Key, given func(name string) bool) bool {
	return k.Unless != "" && slices.ContainsFunc(ks, func(u *Key) bool { return u.Name == k.Unless && u.Scope == k.UnlessIn }) && given(k.Unless)
}

// NeedsGoal reports whether a what-if of the key changes one stream, so that
// the goal must be named when the file has several.
func (k *Key) NeedsGoal() bool { return k.Scope == InStream || k.Scope == InWithdrawal }

// A target is where a key's value goes: the plan and, inside it, the goal,
// stream, one-time amount or rate step being decoded or changed.
type target struct {
	p   *Plan
	g   *Goal
	s   *Stream
	o   *Once
	st  *RateStep
	sc  *Scenario
	who *Person
	a   *Actual
	b   *Budget
	c   *BudgetChange
}

// A value is a parsed value of any form.
type value struct {
	amount    money.Amount
	today     bool
	rate      money.Rate
	month     Month
	text      string
	x         float64
	freq      money.Frequency
	n         int // a choice's value, a length in months
	inflation bool
	rates     []RateStep
	reached   bool // FormUntil: reached, not a month
	rule      WithdrawalRule
}

// Keys is every key of the goals file, in the order the help lists them.
// The what-if keys of a scenario's change (InChange) are made from the keys
// that --set changes, so that the two cannot drift apart.
var Keys = withChangeKeys([]*Key{
	// the top level
	{Name: "cairn", Scope: InPlan, Form: FormVersion, Required: true,
		Missing: `want "cairn: 1", the format version, at the top`,
		Default: "required", Help: "the format version: 1"},
	{Name: "start", Scope: InPlan, Form: FormMonth, Required: true, OrAsOf: true,
		Missing: "want the plan's first month, such as start: 2027-01",
		Default: "the month after --as-of (today)",
		Help: "first month of the plan; t = 0 is its start, balances\n" +
			"are as of then, and \"today's money\" means money then",
		put: func(t *target, v value) { t.p.Start = v.month }},
	{Name: "currency", Scope: InPlan, Form: FormCurrency,
		Default: "USD",
		Help: "ISO 4217 code (USD, EUR, GBP, JPY, ...), for display\n" +
			"and for the places postings round to (JPY: 0)",
		put: func(t *target, v value) { t.p.Currency, _ = money.LookupCurrency(v.text) }},
	{Name: "inflation", Scope: InPlan, Form: FormRate, Min: -MaxInflationPct, Max: MaxInflationPct,
		Default: "0%", Help: "a year; grows \"today\" amounts, gives today's-money figures",
		Set: "inflation",
		put: func(t *target, v value) { t.p.Inflation = v.rate }},
	{Name: "inflation_volatility", Scope: InPlan, Form: FormVolatility,
		Default: "0%",
		Help: "for cairn simulate: the volatility of inflation a year,\n" +
			"such as 1% (see SIMULATION)",
		put: func(t *target, v value) { t.p.InflationVolatility, t.p.HasInflationVolatility = v.x, true }},
	{Name: "rounding", Scope: InPlan, Form: FormRounding,
		Default: "half-even",
		Help: "how each interest, fee and growing amount rounds to the\n" +
			"cent: half-even or half-up (also written half_even,\n" +
			"halfeven, half_up, halfup)",
		put: func(t *target, v value) { t.p.Rounding, _ = money.ParseRounding(v.text) }},
	{Name: "goals", Scope: InPlan, Form: FormList, Items: InGoal, Required: true, MaxItems: MaxGoals,
		Missing: "want a list of goals",
		Default: "required", Help: "a list of goals"},
	{Name: "actuals_file", Scope: InPlan, Form: FormName,
		Default: "none",
		Help: "a CSV of actual balances, one a line: month, goal,\n" +
			"balance (such as 2028-06,Emergency fund,7412.30; a first\n" +
			"line month,goal,balance is a header), relative to the\n" +
			"goals file; added to each goal's actuals",
		put: func(t *target, v value) { t.p.ActualsFile = v.text }},
	{Name: "people", Scope: InPlan, Form: FormList, Items: InPerson, MaxItems: MaxPeople,
		Default: "none",
		Help: "the household's people, each a name and a birth month:\n" +
			"  - name: earner\n" +
			"    born: 1962-05\n" +
			"Any month may then be written as an age: \"earner at 67\"\n" +
			"is the earner's 67th birthday month; output shows ages"},
	{Name: "scenarios", Scope: InPlan, Form: FormList, Items: InScenario, MaxItems: MaxScenarios,
		Default: "none",
		Help: "named alternatives, each a list of what-if changes\n" +
			"(see EACH SCENARIO); --scenario NAME applies one"},
	{Name: "budget", Scope: InPlan, Form: FormMapping, Items: InBudget,
		Default: "none",
		Help: "what the household can set aside, shared by the goals\n" +
			"with a priority: a stream's keys and a rule (see THE\n" +
			"BUDGET)"},

	// each goal
	{Name: "name", Scope: InGoal, Form: FormName, Required: true,
		Missing: "every goal needs a name",
		Default: "required", Help: "unique within the file",
		put: func(t *target, v value) { t.g.Name = v.text }},
	{Name: "balance", Scope: InGoal, Form: FormAmount,
		Default: "0", Help: "already saved at the start",
		Set: "balance",
		put: func(t *target, v value) { t.g.Balance = v.amount }},
	{Name: "rate", Scope: InGoal, Form: FormRates, Min: MinRatePercent, Max: MaxRatePercent, MaxItems: MaxRateSteps,
		Default: "0%",
		Help: "a rate, or a schedule of rates:\n" +
			"  rate: 4.1%                       (effective a year)\n" +
			"  rate: 4.1% apy                   (the same)\n" +
			"  rate: 3.9% compounded monthly    (nominal)\n" +
			"  rate: 5% compounded continuously\n" +
			"  rate: 0.35% per month            (periodic)\n" +
			"  rate:\n" +
			"    - 6.5%\n" +
			"    - from: 2045-01\n" +
			"      rate: 4.5%\n" +
			"A bare rate is the effective annual rate. Interest is\n" +
			"credited at the first rate's compounding dates: every\n" +
			"1/m year for \"compounded m\", each period for \"per\",\n" +
			"monthly for effective and continuous rates.",
		Set: "rate",
		put: func(t *target, v value) { t.g.Rates = v.rates }},
	{Name: "between", Scope: InGoal, Form: FormChoice,
		Choices: []Choice{{"compound", int(Compound)}, {"simple", int(Simple)}, {"none", int(None)}},
		Noun:    "rule", Want: "compound, simple or none",
		Default: "compound",
		Help: "what money arriving or leaving between two interest\n" +
			"dates earns until the next one:\n" +
			"  compound  fractional-period compounding (the\n" +
			"            effective rate per deposit period)\n" +
			"  simple    simple interest for the fraction\n" +
			"  none      interest on the lowest balance held\n" +
			"            through the period: deposits earn nothing\n" +
			"            until it ends, withdrawals nothing for it",
		Set: "between",
		put: func(t *target, v value) { t.g.Between = Between(v.n) }},
	{Name: "fee", Scope: InGoal, Form: FormRate, Min: 0, Max: MaxFeePercent,
		Default: "0%", Help: "a year, taken monthly (a twelfth) from the balance",
		Set: "fee",
		put: func(t *target, v value) {
			t.g.Fee = v.rate.Stated()
			if v.rate.Form() != money.Effective {
				t.g.Fee = v.rate.Effective()
			}
		}},
	{Name: "volatility", Scope: InGoal, Form: FormVolatility,
		Default: "none",
		Help: "for cairn simulate: the volatility of returns a year,\n" +
			"such as 12%, from 0% to 100% (see SIMULATION); none\n" +
			"means returns are fixed",
		put: func(t *target, v value) { t.g.Volatility, t.g.HasVolatility = v.x, true }},
	{Name: "target", Scope: InGoal, Form: FormAmountToday,
		Default: "none",
		Help: "an amount, or \"400k today\" in today's money (grown by\n" +
			"inflation to the deadline; needs by)",
		Set: "target",
		put: func(t *target, v value) { t.g.Target, t.g.TargetToday, t.g.HasTarget = v.amount, v.today, true }},
	{Name: "by", Scope: InGoal, Form: FormMonth,
		Default: "none", Help: "the deadline: the end of that month",
		Set: "by",
		put: func(t *target, v value) { t.g.By, t.g.HasBy = v.month, true }},
	{Name: "deposits", Scope: InGoal, Form: FormList, Items: InStream, MaxItems: MaxStreams,
		Default: "none", Help: "a list of streams (below)"},
	{Name: "withdrawals", Scope: InGoal, Form: FormList, Items: InWithdrawal, MaxItems: MaxStreams,
		Default: "none", Help: "a list of streams, plus for:"},
	{Name: "income", Scope: InGoal, Form: FormList, Items: InWithdrawal, MaxItems: MaxStreams,
		Default: "none",
		Help: "streams paid from outside the account (a pension, a\n" +
			"benefit, part-time work), written as withdrawals are.\n" +
			"Each amount pays the withdrawals of the month it is\n" +
			"paid in and the account pays the rest; what a month's\n" +
			"withdrawals do not need is not deposited. Never counted\n" +
			"as money set aside."},
	{Name: "once", Scope: InGoal, Form: FormList, Items: InOnce, MaxItems: MaxOnce,
		Default: "none",
		Help: "one-time amounts: positive in, negative out\n" +
			"  - name: gift       (optional)\n" +
			"    amount: 1,000\n" +
			"    on: 2027-12      (at the end of that month)"},
	{Name: "tax", Scope: InGoal, Form: FormChoice,
		Choices: []Choice{{"none", int(Untaxed)}, {"as-it-grows", int(AsItGrows)}, {"on-the-way-out", int(OnTheWayOut)}, {"never", int(Never)}},
		Noun:    "tax treatment", Want: "none, as-it-grows, on-the-way-out or never",
		Default: "none",
		Help: "how the account is taxed, at the flat rates given (no\n" +
			"brackets, credits or any country's rules):\n" +
			"  as-it-grows     each year's interest is taxed at\n" +
			"                  tax_rate at the year's end (a year\n" +
			"                  from the start), paid from the account\n" +
			"  on-the-way-out  deposits come from pay before tax\n" +
			"                  (each costs the deposit less tax_rate);\n" +
			"                  withdrawals are taxed at tax_later\n" +
			"  never           deposits from pay after tax; growth\n" +
			"                  and withdrawals are not taxed again\n" +
			"  none            tax is not modelled",
		Set: "tax",
		put: func(t *target, v value) { t.g.Tax = Treatment(v.n) }},
	{Name: "tax_rate", Scope: InGoal, Form: FormTaxRate,
		Default: "0%",
		Help: "the tax rate now: on each year's interest (as-it-grows),\n" +
			"or on the pay a deposit comes from (on-the-way-out)",
		Set: "tax_rate",
		put: func(t *target, v value) { t.g.TaxRate = v.x }},
	{Name: "tax_later", Scope: InGoal, Form: FormTaxRate,
		Default: "tax_rate",
		Help: "on-the-way-out: the tax rate on withdrawals (read only\n" +
			"when tax is on-the-way-out, so a scenario may switch)",
		Set: "tax_later",
		put: func(t *target, v value) { t.g.TaxLater, t.g.HasTaxLater = v.x, true }},
	{Name: "match", Scope: InGoal, Form: FormShare,
		Default: "none",
		Help: "an employer adds this share of each of the household's\n" +
			"own deposits, shown apart from the household's money",
		Set: "match",
		put: func(t *target, v value) { t.g.Match = v.x }},
	{Name: "match_up_to", Scope: InGoal, Form: FormShare,
		Default: "no limit",
		Help: "the employer matches the household's deposits of each\n" +
			"year from the start up to this share of the salary",
		Set: "match_up_to",
		put: func(t *target, v value) { t.g.MatchUpTo, t.g.HasMatchUpTo = v.x, true }},
	{Name: "salary", Scope: InGoal, Form: FormAmount,
		Default: "none", Help: "the salary a year in the plan's first year, for match_up_to",
		Set: "salary",
		put: func(t *target, v value) { t.g.Salary = v.amount }},
	{Name: "salary_grow", Scope: InGoal, Form: FormGrowth, Min: -MaxGrowthPercent, Max: MaxGrowthPercent,
		Default: "0%", Help: "the salary's yearly rise, or \"inflation\"",
		put: func(t *target, v value) { t.g.SalaryInflation, t.g.SalaryGrow = v.inflation, v.x }},
	{Name: "cap", Scope: InGoal, Form: FormAmount,
		Default: "none",
		Help: "the most the account may receive in a year from the\n" +
			"start (deposits and one-time amounts in), as stated for\n" +
			"the account; a plan that passes it by a cent is refused",
		Set: "cap",
		put: func(t *target, v value) { t.g.Cap, t.g.HasCap = v.amount, true }},
	{Name: "cap_excess", Scope: InGoal, Form: FormName,
		Default: "none",
		Help: "the goal, by name, that receives what would pass cap, at\n" +
			"the end of the month it would have gone in; without it\n" +
			"a plan over the cap is refused",
		put: func(t *target, v value) { t.g.CapExcess = v.text }},
	{Name: "actuals", Scope: InGoal, Form: FormList, Items: InActual, MaxItems: MaxActuals,
		Default: "none",
		Help: "balances statements showed, at the end of a month, from\n" +
			"the plan's start to today (--as-of); status compares\n" +
			"the latest with the plan and re-plans from it\n" +
			"  - month: 2028-06\n" +
			"    balance: 7,412.30"},
	{Name: "leave", Scope: InGoal, Form: FormAmountToday,
		Default: "0",
		Help: "balance that must remain after the last withdrawal;\n" +
			"\"50k today\" is in today's money, grown by inflation\n" +
			"to the last withdrawal. The money lasts only when\n" +
			"every withdrawal is paid in full and this is left",
		Set: "leave",
		put: func(t *target, v value) { t.g.Leave, t.g.LeaveToday = v.amount, v.today }},
	{Name: "priority", Scope: InGoal, Form: FormCount, Min: 1, Max: MaxGoals,
		Default: "none",
		Help: "the goal draws on the budget, 1 first; each goal its\n" +
			"own; its deposits are its own, not the budget",
		put: func(t *target, v value) { t.g.Priority = v.n }},

	// each stream
	{Name: "name", Scope: InStream, Form: FormName,
		Default: "none", Help: "a label, used by --stream",
		put: func(t *target, v value) { t.s.Name = v.text }},
	{Name: "amount", Scope: InStream, Form: FormAmountToday, Required: true, Unless: "rule", UnlessIn: InWithdrawal,
		Default: "required (a withdrawal with a share-of-balance rule: none)",
		Help: "per period, 0 or more; \"250 today\" is in today's money\n" +
			"and rises with inflation unless grow says otherwise",
		Set: "deposit", SetOut: "withdrawal", SetBudget: "budget",
		put: func(t *target, v value) { t.s.Amount, t.s.Today = v.amount, v.today }},
	{Name: "every", Scope: InStream, Form: FormFrequency, Required: true,
		Missing: "want a frequency such as month",
		Default: "required",
		Help: "day, week, 2 weeks (fortnightly), half month (twice a\n" +
			"month, semimonthly), month, 2 months, quarter, half\n" +
			"year (twice a year, semiannually), year (annually);\n" +
			"also as every month, per month, a month or monthly.\n" +
			"\"biweekly\" and \"bimonthly\" are refused: each means two\n" +
			"different things.",
		Set: "every",
		put: func(t *target, v value) { t.s.Every = v.freq }},
	{Name: "timing", Scope: InStream, Form: FormChoice,
		Choices: []Choice{{"end", int(End)}, {"start", int(Begin)}, {"begin", int(Begin)}, {"beginning", int(Begin)}},
		Noun:    "timing", Want: "end or start; begin and beginning mean start",
		Default: "end", Help: "end or start of each period; begin and beginning\n" +
			"mean start",
		put: func(t *target, v value) { t.s.Timing = Timing(v.n) }},
	{Name: "from", Scope: InStream, Form: FormMonth,
		Default: "start", Help: "first month with a period",
		put: func(t *target, v value) { t.s.From = v.month }},
	{Name: "until", Scope: InStream, Form: FormUntil,
		Default: "none",
		Help: "last month with an amount (none: open-ended); reached\n" +
			"(deposits only): through the month the target is first\n" +
			"reached",
		put: func(t *target, v value) {
			t.s.Until, t.s.HasUntil, t.s.UntilReached = v.month, !v.reached, v.reached
		}},
	{Name: "net", Scope: InWithdrawal, Form: FormChoice,
		Choices: []Choice{{"no", 0}, {"yes", 1}},
		Noun:    "answer", Want: "yes or no",
		Default: "no",
		Help: "withdrawals only: yes when amount is what the household\n" +
			"receives after the tax on withdrawals (the account pays\n" +
			"amount ÷ (1 − tax_later)); no when it is what the\n" +
			"account pays",
		put: func(t *target, v value) { t.s.Net = v.n == 1 }},
	{Name: "for", Scope: InWithdrawal, Form: FormLength,
		Default: "none", Help: "withdrawals only, instead of until: \"30 years\", \"18 months\"",
		put: func(t *target, v value) { t.s.forMonths = v.n }},
	{Name: "rule", Scope: InWithdrawal, Form: FormRule,
		Default: "the amount as written",
		Help: "withdrawals only: how the amount is decided at each\n" +
			"anniversary of from: (the first year included) from the\n" +
			"balance then, and paid in every period of that year:\n" +
			"  rule: 4% of balance\n" +
			"      a year's withdrawals are 4% of the balance\n" +
			"      (amount: is not needed)\n" +
			"  rule: cut 10% above 6%, raise 10% below 4%\n" +
			"      the amount starts as written; from the second\n" +
			"      year, when a year's withdrawals over the balance\n" +
			"      are above 6% it is cut by 10%, below 4% raised\n" +
			"      by 10%\n" +
			"The amount, floor and ceiling grow as the amount\n" +
			"grows (grow:, or today's money for \"… today\")",
		put: func(t *target, v value) {
			t.s.Rule.Kind, t.s.Rule.Share, t.s.Rule.Lower, t.s.Rule.Upper, t.s.Rule.Cut, t.s.Rule.Raise = v.rule.Kind, v.rule.Share, v.rule.Lower, v.rule.Upper, v.rule.Cut, v.rule.Raise
		}},
	{Name: "floor", Scope: InWithdrawal, Form: FormAmount,
		Default: "0", Help: "with rule: the least amount a period",
		put: func(t *target, v value) { t.s.Rule.Floor = v.amount }},
	{Name: "ceiling", Scope: InWithdrawal, Form: FormAmount,
		Default: "none", Help: "with rule: the most amount a period",
		put: func(t *target, v value) { t.s.Rule.Ceiling, t.s.Rule.HasCeiling = v.amount, true }},
	{Name: "grow", Scope: InStream, Form: FormGrowth, Min: -MaxGrowthPercent, Max: MaxGrowthPercent,
		Default: "0%", Help: "a yearly rise of the amount, or \"inflation\"",
		Set: "grow",
		put: func(t *target, v value) { t.s.GrowInflation, t.s.Grow, t.s.growSet = v.inflation, v.x, true }},

	// each one-time amount (documented under the goal's once)
	{Name: "name", Scope: InOnce, Form: FormName,
		put: func(t *target, v value) { t.o.Name = v.text }},
	{Name: "amount", Scope: InOnce, Form: FormSignedAmount, Required: true,
		put: func(t *target, v value) { t.o.Amount = v.amount }},
	{Name: "on", Scope: InOnce, Form: FormMonth, Required: true,
		Missing: "want the month, such as on: 2027-04",
		put:     func(t *target, v value) { t.o.On = v.month }},

	// each step of a rate schedule (documented under the goal's rate)
	{Name: "from", Scope: InRateStep, Form: FormMonth,
		put: func(t *target, v value) { t.st.From = v.month }},
	{Name: "rate", Scope: InRateStep, Form: FormRate, Min: MinRatePercent, Max: MaxRatePercent, Required: true,
		put: func(t *target, v value) { t.st.Rate = v.rate }},

	// each actual balance (documented under the goal's actuals)
	{Name: "month", Scope: InActual, Form: FormMonth, Required: true,
		Missing: "want the month of the statement, such as month: 2028-06",
		put:     func(t *target, v value) { t.a.Month = v.month }},
	{Name: "balance", Scope: InActual, Form: FormAmount, Required: true,
		Missing: "want the balance at the end of that month, such as balance: 7,412.30",
		put:     func(t *target, v value) { t.a.Balance = v.amount }},
	// the budget, besides a stream's keys
	{Name: "rule", Scope: InBudget, Form: FormChoice,
		Choices: []Choice{{"priority", int(ByPriority)}, {"one-at-a-time", int(OneAtATime)}},
		Noun:    "rule", Want: "priority or one-at-a-time",
		Default: "priority",
		Help: "how each amount is split among the goals:\n" +
			"  priority       each goal in priority order gets the\n" +
			"                 level amount it needs to meet its\n" +
			"                 deadline; what is left flows on\n" +
			"  one-at-a-time  everything to the first goal until it\n" +
			"                 is reached, then the next",
		put: func(t *target, v value) { t.b.Rule = Rule(v.n) }},
	{Name: "changes", Scope: InBudget, Form: FormList, Items: InBudgetChange, MaxItems: MaxBudgetChanges,
		Default: "none",
		Help: "the amount from a month on, at the budget's dates from\n" +
			"that month's first; grow rises each amount yearly from\n" +
			"its own month, months in order, none before from:\n" +
			"  - from: 2029-01\n" +
			"    amount: 1,100"},
	{Name: "from", Scope: InBudgetChange, Form: FormMonth, Required: true,
		Missing: "want the month the amount changes, such as from: 2029-01",
		Default: "required", Help: "the month the new amount starts",
		put: func(t *target, v value) { t.c.From = v.month }},
	{Name: "amount", Scope: InBudgetChange, Form: FormAmountToday, Required: true,
		Missing: "want the new amount, such as amount: 1,100",
		Default: "required", Help: "per period from then; \"1,100 today\" is in today's money",
		put: func(t *target, v value) { t.c.Amount, t.c.Today = v.amount, v.today }},

	// each scenario
	{Name: "name", Scope: InScenario, Form: FormName, Required: true,
		Missing: "every scenario needs a name",
		Default: "required", Help: "unique within the file; --scenario NAME picks it",
		put: func(t *target, v value) { t.sc.Name = v.text }},
	{Name: "name", Scope: InPerson, Form: FormName, Required: true,
		Default: "required", Help: "a role such as earner or partner, used in ages such as \"earner at 67\"",
		put: func(t *target, v value) { t.who.Name = v.text }},
	{Name: "born", Scope: InPerson, Form: FormMonth, Required: true,
		Default: "required", Help: "the birth month, YYYY-MM",
		put: func(t *target, v value) { t.who.Born = v.month }},

	{Name: "changes", Scope: InScenario, Form: FormList, Items: InChange, Required: true, MaxItems: MaxChanges,
		Missing: "want a list of changes, such as - goal: Retirement",
		Default: "required", Help: "a list of changes, applied in order"},

	// each change of a scenario; its what-if keys follow (withChangeKeys)
	{Name: "goal", Scope: InChange, Form: FormName,
		Default: "every goal",
		Help: "the goal changed, by name; needed for a stream's key\n" +
			"when the file has several goals"},
	{Name: "stream", Scope: InChange, Form: FormName,
		Default: "the first",
		Help: "the deposit or withdrawal stream that deposit,\n" +
			"withdrawal, grow and every change, by name"},
})

// withChangeKeys returns keys with, after them, one key of scope InChange
// for each name in [OverrideKeys]: the key --set changes under that name,
// written as one value (a rate schedule cannot be a what-if). A change's
// values are applied by [Plan.With], as --set's are.
func withChangeKeys(keys []*Key) []*Key {
	for _, name := range OverrideKeys {
		for _, k := range keys {
			if k.Set != name && k.SetOut != name && k.SetBudget != name {
				continue
			}
			c := *k
			c.Name, c.Scope, c.Set, c.SetOut, c.SetBudget, c.put = name, InChange, "", "", "", nil
			c.Required, c.Missing, c.Default = false, "", "unchanged"
			if c.Form == FormRates {
				c.Form, c.MaxItems = FormRate, 0
			}
			c.Help = "as --set " + name + "=VALUE: the goal's " + k.Name
			switch {
			case k.Scope == InPlan:
				c.Help = "as --set " + name + "=VALUE: the plan's " + k.Name
			case name == k.SetOut:
				c.Help = "as --set " + name + "=VALUE: the withdrawal stream's " + k.Name
			case name == k.SetBudget:
				c.Help = "as --set " + name + "=VALUE: the budget's " + k.Name
			case k.NeedsGoal():
				c.Help = "as --set " + name + "=VALUE: the deposit stream's " + k.Name
			}
			if k.Form == FormChoice {
				c.Help += " (" + k.Want + ")"
			}
			keys = append(keys, &c)
			break
		}
	}
	return keys
}

// keysIn returns the keys of a scope in table order; a withdrawal has the
// stream's keys and its own. The slice is shared: callers do not change it.
func keysIn(s Scope) []*Key { return scopes()[s].keys }

// keyNamesIn returns the names of keysIn(s), in the same order.
func keyNamesIn(s Scope) []string { return scopes()[s].names }

// A scopeKeys is the keys of one scope and their names.
type scopeKeys struct {
	keys  []*Key
	names []string
}

// scopes is each scope's keys, taken from [Keys] once: every mapping the
// decoder reads asks for them.
var scopes = sync.OnceValue(func() map[Scope]scopeKeys {
	m := map[Scope]scopeKeys{}
	add := func(s Scope, k *Key) {
		sk := m[s]
		sk.keys, sk.names = append(sk.keys, k), append(sk.names, k.Name)
		m[s] = sk
	}
	for _, k := range Keys {
		add(k.Scope, k)
		if k.Scope == InStream {
			add(InWithdrawal, k)
			add(InBudget, k)
		}
	}
	for s, sk := range m {
		m[s] = scopeKeys{slices.Clip(sk.keys), slices.Clip(sk.names)}
	}
	return m
})

// KeysIn returns the keys that may appear in a mapping of scope s, in table
// order: a withdrawal and the budget have the stream's keys and their own.
// The slice is shared: callers read it and do not change it.
func KeysIn(s Scope) []*Key { return keysIn(s) }

// Pattern returns how a value of k is written, as text, in a regular
// expression anchored at both ends, or "" when the form has no one written
// shape (a name, a list). The pattern reads the same in Go's regexp and in
// ECMAScript, as JSON Schema's pattern keyword does: no flags, so words match
// in any case through [aA] classes, as the decoder reads them. It describes
// the text only; ranges (a rate's Min and Max, the amount limit) are checked
// after it. The JSON Schema of the goals file is built from it, and a test
// holds it to the decoder: what the decoder accepts matches, and a sample of
// what it refuses does not.
func (k *Key) Pattern() string {
	switch k.Form {
	case FormChoice:
		ws := make([]string, len(k.Choices))
		for i, c := range k.Choices {
			ws[i] = c.Word
		}
		return `^\s*` + words(ws) + `\s*$`
	case FormRates:
		return patterns()[FormRate]
	}
	return patterns()[k.Form]
}

// Words returns the words a value of k may be, in lower case, for a schema's
// examples and for completion: the choices, the currency codes, the rounding
// rules, the payment frequencies; nil for other forms.
func (k *Key) Words() []string {
	switch k.Form {
	case FormChoice:
		var out []string
		for _, c := range k.Choices {
			out = append(out, c.Word)
		}
		return out
	case FormCurrency:
		return money.CurrencyCodes()
	case FormRounding:
		return []string{"half-even", "half-up"}
	case FormFrequency:
		var out []string
		for f := money.Daily; f <= money.Yearly; f++ {
			out = append(out, f.String())
		}
		return out
	case FormGrowth:
		return []string{"inflation"}
	}
	return nil
}

// Written forms, for [Key.Pattern].
var (
	// rateForms are the words after a bare rate's % sign that leave it the
	// effective annual rate (money.ParseRate).
	rateEffective = []string{"effective", "apy", "effective annual", "annual effective", "effective a year", "ear"}
	roundingWords = []string{"half-even", "halfeven", "half_even", "half-up", "halfup", "half_up"}

	// patterns is built when first asked for (the schema, the help, their
	// tests), not by every command at start-up.
	patterns = sync.OnceValue(func() map[Form]string {
		var all, payment, periodic []string
		for w, f := range money.FrequencyWords() {
			all = append(all, w)
			if f != money.Continuous {
				payment = append(payment, w)
			}
			if (strings.HasPrefix(w, "per ") || strings.HasPrefix(w, "a ")) && f != money.Continuous &&
				(f != money.Yearly || w == "per year") {
				periodic = append(periodic, w)
			}
		}
		number := `[-+−]?(?:\d+(?:\.\d*)?|\.\d+)`
		tail := `(?:` + words(rateEffective) + `|` + words(periodic) +
			`|(?:` + words([]string{"nominal", "apr"}) + `\s*)?(?:` + words([]string{"annual"}) + `\s*)?` +
			words([]string{"compounded"}) + `\s*` + words(all) + `)`
		rate := `\s*` + number + `\s*%\s*(?:` + words([]string{"a year", "per year"}) + `\s*)?` + tail + `?\s*`
		digits := `(?:\d{1,3}(?:,\d{3})+|\d{1,3}(?:_\d{3})+|\d+)(?:\.\d+)?[kKmM]?`
		amount := func(sign string) string { return `\s*` + sign + `(?:[$€£¥]\s*)?` + digits }
		return map[Form]string{
			FormVersion:      `^1$`,
			FormMonth:        `^\s*(?:(?:19\d\d|2\d\d\d)-(?:0[1-9]|1[0-2])|\S.*\s[aA][tT]\s+\d{1,3})\s*$`,
			FormCurrency:     `^\s*` + words(money.CurrencyCodes()) + `\s*$`,
			FormRounding:     `^\s*` + words(roundingWords) + `\s*$`,
			FormRate:         `^` + rate + `$`,
			FormVolatility:   `^\s*\+?0*(?:100(?:\.0*)?|\d{1,2}(?:\.\d*)?|\.\d+)\s*%\s*$`,
			FormAmount:       `^` + amount(`\+?`) + `\s*$`,
			FormAmountToday:  `^` + amount(`\+?`) + `(?:\s* ` + words([]string{"today"}) + `)?\s*$`,
			FormSignedAmount: `^` + amount(`[-+−]?`) + `\s*$`,
			FormFrequency:    `^\s*` + words(payment) + `\s*$`,
			FormLength:       `^\s*\+?0*[1-9]\d*\s+` + words([]string{"year", "years", "month", "months"}) + `\s*$`,
			FormGrowth:       `^(?:` + rate + `|\s*` + words([]string{"inflation"}) + `\s*)$`,
			FormCount:        `^\s*\+?\d+\s*$`,
			FormRule:         `^(?:\s*\+?(?:\d+(?:\.\d*)?|\.\d+)\s*%\s*` + words([]string{"of"}) + `\s+(?:` + words([]string{"the"}) + `\s+)?` + words([]string{"balance"}) + `\s*|\s*` + words([]string{"cut"}) + `\s*\+?(?:\d+(?:\.\d*)?|\.\d+)\s*%\s*` + words([]string{"above"}) + `\s*\+?(?:\d+(?:\.\d*)?|\.\d+)\s*%\s*,?\s*` + words([]string{"raise"}) + `\s*\+?(?:\d+(?:\.\d*)?|\.\d+)\s*%\s*` + words([]string{"below"}) + `\s*\+?(?:\d+(?:\.\d*)?|\.\d+)\s*%\s*)$`,
			FormUntil:        `^\s*(?:(?:19\d\d|2\d\d\d)-(?:0[1-9]|1[0-2])|\S.*\s[aA][tT]\s+\d{1,3}|` + words([]string{"reached"}) + `)\s*$`,
			FormTaxRate:      `^\s*\+?0*(?:\d{1,2}(?:\.\d*)?|\.\d+)\s*%\s*$`,
			FormShare:        `^\s*\+?0*(?:100(?:\.0*)?|\d{1,2}(?:\.\d*)?|\.\d+)\s*%\s*$`,
		}
	})
)

// words returns a group matching any of ws in any case, a run of white
// space where a word has one space, longest first.
func words(ws []string) string {
	ws = slices.Clone(ws)
	slices.SortFunc(ws, func(a, b string) int {
		if len(a) != len(b) {
			return len(b) - len(a)
		}
		return strings.Compare(a, b)
	})
	var b strings.Builder
	b.WriteString("(?:")
	for i, w := range ws {
		if i > 0 {
			b.WriteString("|")
		}
		for _, r := range w {
			switch {
			case r == ' ':
				b.WriteString(`\s+`)
			case r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z':
				b.WriteString("[" + strings.ToLower(string(r)) + strings.ToUpper(string(r)) + "]")
			default:
				b.WriteString(regexp.QuoteMeta(string(r)))
			}
		}
	}
	b.WriteString(")")
	return b.String()
}
