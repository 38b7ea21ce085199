package main

import (
	"bytes"
	"encoding/json"
	"slices"
	"strings"

	"cairn/cmd/cairn/internal/render"
)

// This file documents the shape of each command's JSON output (--format
// json) as a JSON Schema: `cairn help COMMAND --format schema` writes it,
// schema/output/COMMAND.schema.json is it, committed, and CI validates each
// command's actual output on the example with ajv. A test checks that the
// keys each command writes are the keys listed here. Amounts, rates and
// months are strings, so that no figure passes through a binary float.

// A jsonField is one top-level key of a command's JSON output.
type jsonField struct {
	name   string
	typ    string // JSON types, "|" between; "" for any
	always bool   // written on every run, or only in some cases
	doc    string
}

// planFields are written by every command that reads a goals file.
var planFields = []jsonField{
	{"file", "string", true, "the goals file read; <stdin> for standard input"},
	{"start", "string", true, "the plan's first month, YYYY-MM"},
	{"currency", "string", true, "the ISO 4217 code"},
	{"inflation", "string", true, "inflation a year, effective, as a decimal fraction"},
	{"scenario", "string", false, "with --scenario: the name of the file's scenario applied"},
}

// noticeFields are the notices: the note on every output, the cautions where
// they apply.
var noticeFields = []jsonField{
	{"note", "string", true, "the not-advice note"},
	{"caution", "string", false, "the running-out caution, where money is drawn down"},
	{"caution_simulation", "string", false, "the caution that simulated returns are assumptions"},
}

// jsonOutputs lists each command's own keys.
var jsonOutputs = map[string][]jsonField{
	"status": {
		{"goals", "array", true, "one object a goal: target, deadline, projected balance, status and deposit needed; for a goal with actual balances, \"actual\": the latest against the plan, the goal re-planned from it and the return earned"},
		{"monthly_now", "string", true, "the total set aside a month now"},
		{"monthly_needed", "string", true, "the total a month needed to meet every goal"},
		{"cases", "array", false, "with several scenarios: the plan as written (base), then each scenario, each with its goals and totals"},
		{"employer_monthly", "string", false, "where an employer matches deposits: its contributions a month in the first year, apart from the household's"},
		{"monthly_now_from_pay", "string", false, "where a goal's deposits come from pay before tax: monthly_now as it costs take-home pay"},
		{"monthly_needed_from_pay", "string", false, "where a goal's deposits come from pay before tax: monthly_needed as it costs take-home pay"},
		{"budget", "object", false, "with a budget: its rule, amount, frequency, monthly equivalent now and the smallest amount that makes every deadline"},
	},
	"budget": {
		{"rule", "string", true, "the budget's rule: priority or one-at-a-time"},
		{"amount", "string", true, "the budget's amount a period, before growth"},
		{"every", "string", true, "the budget's frequency"},
		{"goals", "array", true, "one object a goal in priority order: its level share, the month reached, on time or how many months late"},
		{"rows", "array", true, "the allocation by year (or month): the budget, each goal's share, what is left unallocated, the goals reached"},
		{"unallocated", "string", true, "what no goal took, in total over the rows"},
		{"smallest", "object|null", true, "the smallest budget that makes the deadlines asked (every goal, or the top k), with the goal one cent less misses; null when none does"},
	},
	"check": {
		{"valid", "boolean", true, "true: the file was read without a problem"},
		{"goals", "array", true, "each goal as cairn understood it"},
	},
	"solve": {
		{"goal", "string", true, "the goal's name"},
		{"for", "string", true, "the quantity solved for"},
		{"answer", "string|null", true, "the answer, or null when there is none"},
		{"reason", "string", false, "why there is no answer"},
		{"balance", "string", false, "the balance at the start"},
		{"target", "string", false, "the target at its deadline"},
		{"deadline", "string", false, "the deadline month"},
		{"months", "integer", false, "the months until the target is reached or the money runs out"},
		{"lasts", "boolean", false, "for lasts: whether the money lasts through the last withdrawal"},
		{"lasts_through", "string", false, "for lasts: the last month paid in full"},
		{"left", "string", false, "for withdrawal and lasts: the balance left after the last withdrawal"},
		{"paid_through", "string", false, "for lasts: every withdrawal is paid through this month, but less than leave is left"},
		{"leave", "string", false, "for lasts and capital: what must be left after the last withdrawal, in money of then"},
		{"capital_at", "string", false, "for capital: the month at whose end the capital is needed"},
		{"stream", "string", false, "the stream solved for"},
		{"every", "string", false, "the stream's frequency"},
		{"first_amount", "string", false, "the first payment, when amounts grow"},
		{"grow", "string", false, "the stream's yearly rise, when the answer is its first year's amount"},
		{"amount_is", "string", false, "\"first year\" when the answer is the first year's amount of a rising stream"},
		{"before_fee", "string", false, "for rate: the goal's fee a year; the rate solved is before it"},
		{"in_todays_money", "boolean", false, "whether the answer is in today's money"},
		{"nominal", "string", false, "for rate: the rate as a nominal rate at its compounding"},
		{"compounding", "string", false, "for rate: the compounding of the nominal rate"},
		{"other_rates", "array", false, "for rate: the goal's other rates, unchanged"},
		{"period", "string", false, "the period of the periodic rate"},
		{"closed_form_periods", "string", false, "the periods by the closed form, where it applies"},
		{"remark", "string", false, "a remark on the answer"},
		{"tax", "object", false, "the goal's tax treatment and rates, as the file states them"},
		{"from_pay", "string", false, "for deposit, where deposits come from pay before tax: what the deposit costs from take-home pay"},
		{"net", "string", false, "for withdrawal, where withdrawals are taxed: what the withdrawal leaves to spend after tax"},
		{"balance_after_tax", "string", false, "where withdrawals are taxed: what the balance would leave to spend after tax"},
		{"after_tax_rate", "string", false, "with the equation, where interest is taxed as it grows: the effective annual rate after that tax"},
		{"equation", "array", false, "with --explain: the equation of value, one term a flow"},
		{"equation_sum", "string", false, "with --explain: the sum of the terms"},
		{"income_not_deposited", "string", false, "with --explain, where income is larger than its months' withdrawals: the income they did not need, which the ledger does not deposit and the income's term counts in full"},
	},
	"project": {
		{"goal", "string", true, "the goal's name"},
		{"by", "string", true, "year or month: one row each"},
		{"priority", "integer", false, "for a goal that draws on the household budget: its priority; budget_share in each row is its share of the budget as allocated"},
		{"rows", "array", true, "ages at the period's end (when the file names people), opening, budget_share (a goal that draws on the budget), deposits, interest, fees, income paying withdrawals (with income), withdrawals and closing balance each period"},
		{"totals", "object", false, "the sums of the rows"},
		{"runs_out", "string", false, "the month the money runs out, if it does"},
		{"tax", "object", false, "the goal's tax treatment and rates, as the file states them"},
		{"moved_over_cap", "string", false, "with cap_excess: what passed the yearly cap and went to the goal it names"},
		{"closing_after_tax", "string", false, "where withdrawals are taxed: what the closing balance would leave to spend after tax"},
		{"leave_short_by", "string", false, "how much less than leave is left after the last withdrawal, when every withdrawal is paid but it is"},
	},
	"compare": {
		{"goal", "string", true, "the goal's name"},
		{"for", "string", true, "the quantity solved for"},
		{"base", "object", true, "the answer with no change"},
		{"cells", "array", true, "one object each combination of the --vary values, with its answer or reason (and for a withdrawal taxed on the way out, net: what it leaves to spend)"},
		{"before_fee", "string", false, "for rate: the goal's fee a year; the rates solved are before it"},
		{"amount_is", "string", false, "\"first year\" when the answers are first-year amounts of a rising stream"},
		{"grow", "string", false, "the stream's yearly rise, when the answers are first-year amounts"},
	},
	"simulate": {
		{"goal", "string", true, "the goal's name"},
		{"for", "string", false, "deposit, withdrawal or start, when solving for one"},
		{"answer", "string|null", false, "with --for: the answer, or null when there is none"},
		{"reason", "string", false, "why there is no answer"},
		{"success_level", "string", false, "with --for: the share of paths asked for"},
		{"paths", "integer", false, "the number of paths"},
		{"seed", "integer", false, "the seed of the random numbers"},
		{"from", "string", false, "the first month simulated"},
		{"to", "string", false, "the last month simulated"},
		{"deadline", "string", false, "the goal's deadline"},
		{"target", "string", false, "the target"},
		{"target_varies", "boolean", false, "whether the target differs by path (random inflation)"},
		{"success", "string", false, "the share of paths that meet the target"},
		{"success_paths", "integer", false, "the number of paths that meet the target"},
		{"fixed_rate_balance", "string", false, "the balance at the deadline with fixed returns"},
		{"volatility", "string", false, "the volatility of returns used"},
		{"volatility_source", "string", false, "where the volatility came from"},
		{"inflation_volatility", "string", false, "the volatility of inflation used"},
		{"inflation_volatility_source", "string", false, "where it came from"},
		{"at_deadline", "object", false, "percentiles of the balance at the deadline"},
		{"years", "array", false, "percentiles of the balance at each year's end"},
		{"deposit", "object", false, "with --for deposit: the deposit found and its paths"},
		{"withdrawal", "object", false, "with --for withdrawal: the withdrawal found that lasts in the share asked for, and its paths"},
		{"opening_balance", "object", false, "with --for start: the opening balance found that succeeds in the share asked for, and its paths"},
		{"withdrawals", "object", false, "how often withdrawals were paid in full"},
		{"tax", "object", false, "the goal's tax treatment and rates, as the file states them"},
		{"at_deadline_after_tax", "object", false, "where withdrawals are taxed: the percentiles at the deadline after that tax"},
	},
	"convert": {
		{"rate", "string", true, "the rate as read"},
		{"effective", "string", true, "the effective annual rate, as a decimal fraction"},
		{"forms", "array", true, "the rate in each form"},
		{"inflation", "string", false, "with --inflation: inflation a year, effective"},
		{"real", "string", false, "with --inflation: the real rate a year, effective"},
	},
}

// outputFields returns every top-level key of command cmd's JSON output.
func outputFields(cmd string) []jsonField {
	fs := []jsonField{{"cairn_json", "", true, "the version of this JSON form; it changes only when a key is removed or changes meaning"}}
	if cmd != "convert" {
		fs = append(fs, planFields...)
	}
	fs = append(fs, jsonOutputs[cmd]...)
	return append(fs, noticeFields...)
}

// outputSchema returns the JSON Schema of command cmd's JSON output.
func outputSchema(cmd string) []byte {
	no := false
	s := &jsonSchema{
		Schema: "https://json-schema.org/draft/2020-12/schema",
		Title:  "cairn " + cmd + " --format json",
		Description: "The JSON form of cairn " + cmd + ", version " + jsonVersionText() + ". " +
			"Amounts, rates and months are strings. A planning aid, not financial advice.",
		Type: "object", Properties: map[string]*jsonSchema{}, Additional: &no,
	}
	for _, f := range outputFields(cmd) {
		p := &jsonSchema{Description: f.doc}
		switch {
		case f.name == "cairn_json":
			p.Enum = []any{render.JSONVersion}
		case strings.Contains(f.typ, "|"):
			p.Type = strings.Split(f.typ, "|")
		case f.typ != "":
			p.Type = f.typ
		}
		s.Properties[f.name] = p
		if f.always {
			s.Required = append(s.Required, f.name)
		}
	}
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	if err := enc.Encode(s); err != nil {
		panic(err) // built from constants
	}
	return b.Bytes()
}

func jsonVersionText() string { b, _ := json.Marshal(render.JSONVersion); return string(b) }

// jsonCommands are the commands with a JSON form, sorted.
func jsonCommands() []string {
	var out []string
	for c := range jsonOutputs {
		out = append(out, c)
	}
	slices.Sort(out)
	return out
}
