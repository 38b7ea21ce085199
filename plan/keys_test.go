package plan_test

import (
	"fmt"
	"strings"
	"testing"

	"cairn/plan"
)

// TestChoicesDocumented holds every enumerated key to one rule: each word
// it accepts is named in its help and in the message that refuses a word,
// so that no synonym is taken silently (issue 17).
func TestChoicesDocumented(t *testing.T) {
	n := 0
	for _, k := range plan.Keys {
		if k.Form != plan.FormChoice {
			continue
		}
		n++
		for _, c := range k.Choices {
			if !strings.Contains(k.Help, c.Word) {
				t.Errorf("%s: accepts %q, which its help does not name: %q", k.Name, c.Word, k.Help)
			}
			if !strings.Contains(k.Want, c.Word) {
				t.Errorf("%s: accepts %q, which its refusal does not name: %q", k.Name, c.Word, k.Want)
			}
		}
	}
	if n == 0 {
		t.Fatal("no enumerated keys found")
	}
}

// TestKeyInWrongScope gives every key of the table in a place where it does
// not belong and wants the message to say where it does (issue 17).
func TestKeyInWrongScope(t *testing.T) {
	// each place a key can be given, as a goals file with KEY where it is
	places := []struct {
		scope plan.Scope
		file  string
	}{
		{plan.InPlan, "cairn: 1\nstart: 2027-01\nKEY: x\ngoals:\n  - name: g\n"},
		{plan.InGoal, "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    KEY: x\n"},
		{plan.InStream, "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    deposits:\n      - amount: 1\n        every: month\n        KEY: x\n"},
		{plan.InOnce, "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    once:\n      - amount: 1\n        on: 2027-02\n        KEY: x\n"},
		{plan.InRateStep, "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    rate:\n      - rate: 1%\n        KEY: x\n"},
		{plan.InActual, "cairn: 1\nstart: 2027-01\ngoals:\n  - name: g\n    actuals:\n      - month: 2027-02\n        balance: 1\n        KEY: x\n"},
	}
	for _, k := range plan.Keys {
		if k.Scope == plan.InChange {
			continue // what-if names, not keys of the plan: a misplaced one is answered as the plan's key
		}
		for _, pl := range places {
			if belongs(k.Name, pl.scope) {
				continue
			}
			t.Run(fmt.Sprintf("%s in scope %d", k.Name, pl.scope), func(t *testing.T) {
				_, err := plan.Parse("t.yaml", []byte(strings.Replace(pl.file, "KEY", k.Name, 1)), 0)
				want := fmt.Sprintf("unknown key %q here: it belongs in ", k.Name)
				if err == nil || !strings.Contains(err.Error(), want) {
					t.Errorf("Parse = %v; want an error containing %q", err, want)
				}
			})
		}
	}
}

// belongs reports whether some key named name may be given in scope s (a
// deposit stream has the stream keys).
func belongs(name string, s plan.Scope) bool {
	for _, k := range plan.Keys {
		if k.Name == name && k.Scope == s {
			return true
		}
	}
	return false
}
