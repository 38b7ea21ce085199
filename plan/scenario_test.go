package plan_test

import (
	"errors"
	"reflect"
	"strings"
	"testing"

	"cairn/plan"
)

// TestScenarioSameAsSet holds a named scenario to the --set grammar: each
// scenario of the bundled example gives every goal the same status as the
// same changes given one by one through Plan.Change, as --set gives them.
// Both sides are computed by cairn; the test is that they agree.
func TestScenarioSameAsSet(t *testing.T) {
	p := mustExample(t, "household.yaml")
	for _, tt := range []struct {
		name    string
		changes []struct{ goal, stream, set string }
	}{
		{"bigger paycheck deposit", []struct{ goal, stream, set string }{
			{"Emergency fund", "paycheck", "deposit=200"}, {"Home deposit", "", "deposit=650"}}},
		{"lower returns", []struct{ goal, stream, set string }{
			{"", "", "inflation=3%"}, {"Retirement", "", "rate=5.5%"}}},
	} {
		t.Run(tt.name, func(t *testing.T) {
			got, err := p.WithScenario(tt.name)
			if err != nil {
				t.Fatal(err)
			}
			want := p
			for _, ch := range tt.changes {
				o, err := plan.ParseOverride(ch.set)
				if err != nil {
					t.Fatal(err)
				}
				if want, err = want.Change(ch.goal, ch.stream, []plan.Override{o}); err != nil {
					t.Fatal(err)
				}
			}
			gs, ws := plan.StatusOf(got), plan.StatusOf(want)
			base := plan.StatusOf(p)
			for i := range gs.Goals {
				g, w := gs.Goals[i], ws.Goals[i]
				if g.Projected.Cmp(w.Projected) != 0 || g.Reached != w.Reached || g.OnTrack != w.OnTrack {
					t.Errorf("%s: scenario gives projected %v reached %v, --set gives %v reached %v",
						g.Goal.Name, g.Projected, g.Reached, w.Projected, w.Reached)
				}
			}
			if gs.MonthlyNeeded.Cmp(ws.MonthlyNeeded) != 0 || gs.MonthlyNow.Cmp(ws.MonthlyNow) != 0 {
				t.Errorf("monthly: scenario %v/%v, --set %v/%v", gs.MonthlyNow, gs.MonthlyNeeded, ws.MonthlyNow, ws.MonthlyNeeded)
			}
			if reflect.DeepEqual(gs.MonthlyNeeded, base.MonthlyNeeded) && reflect.DeepEqual(gs.MonthlyNow, base.MonthlyNow) {
				t.Errorf("the scenario changed nothing: the test would pass vacuously")
			}
			if got.Applied != tt.name || p.Applied != "" {
				t.Errorf("Applied = %q (base %q), want %q (base empty)", got.Applied, p.Applied, tt.name)
			}
		})
	}
}

// TestScenarioErrors checks that a scenario the file cannot apply is
// refused where it is written, with the message --set would give.
func TestScenarioErrors(t *testing.T) {
	const head = "cairn: 1\nstart: 2027-01\ngoals:\n  - name: a\n    deposits:\n      - amount: 10\n        every: month\n  - name: b\nscenarios:\n  - name: s\n    changes:\n"
	for _, tt := range []struct {
		name, change string
		expect       string // must appear within the error
	}{
		{"value", "      - goal: a\n        rate: 5\n", `household.yaml:13:15: scenarios[0].changes[0].rate: `},
		{"stream key without goal", "      - deposit: 20\n", `household.yaml:12:18: scenarios[0].changes[0].deposit: a change to one stream needs the goal named`},
		{"no such stream", "      - goal: b\n        deposit: 20\n", `household.yaml:13:18: scenarios[0].changes[0].deposit: goal "b" has no deposit stream`},
		{"today without by, as --set refuses it", "      - goal: a\n        target: 5000 today\n", `household.yaml:13:17: scenarios[0].changes[0].target: a target in today's money needs a deadline`},
		{"empty change", "      - goal: a\n", `household.yaml:12:9: scenarios[0].changes[0]: a change with nothing to change`},
	} {
		t.Run(tt.name, func(t *testing.T) {
			_, err := plan.Parse("household.yaml", []byte(head+tt.change), 0)
			var el plan.ErrorList
			if !errors.As(err, &el) || !strings.Contains(err.Error(), tt.expect) {
				t.Errorf("Parse = %v; want an ErrorList containing %q", err, tt.expect)
			}
		})
	}
}
