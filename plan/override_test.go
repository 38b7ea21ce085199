package plan_test

import (
	"errors"
	"slices"
	"strings"
	"testing"

	"cairn/plan"
)

// TestPlan_With_CrossField checks that a what-if the goals file would refuse
// is refused with the file's own message (issue 12): the expected text is
// taken from Parse on the equivalent file, not written twice.
func TestPlan_With_CrossField(t *testing.T) {
	const head = "cairn: 1\nstart: 2027-01\ngoals:\n  - name: car\n    balance: 1,000\n"
	base := mustParse(t, "w.yaml", head+"    target: 5,000\n")
	tests := []struct {
		name string
		ovs  []string
		file string // the same change written in the file, refused there
		key  string // the --set key the error is about
	}{
		{"target today without a deadline", []string{"target=5000 today"}, "    target: 5000 today\n", "target"},
		{"deadline before the start", []string{"by=2026-12"}, "    by: 2026-12\n", "by"},
		{"deadline beyond the horizon", []string{"by=2177-01"}, "    by: 2177-01\n", "by"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, ferr := plan.Parse("f.yaml", []byte(head+tt.file), 0)
			var el plan.ErrorList
			if !errors.As(ferr, &el) || len(el) != 1 {
				t.Fatalf("Parse(file with %q) = %v; want one error", tt.file, ferr)
			}
			_, msg, _ := strings.Cut(el[0].Msg, ": ") // drop the file's path, goals[0].KEY
			ovs := mustOverrides(t, tt.ovs)
			_, _, err := base.With("car", "", ovs)
			if want := tt.key + ": " + msg; err == nil || err.Error() != want {
				t.Errorf("With(%v) error = %v, want %q (the file's message)", tt.ovs, err, want)
			}
		})
	}
}

// TestPlan_With_OrderFree checks that the cross-field checks run after all
// the changes of one what-if, so their order does not matter.
func TestPlan_With_OrderFree(t *testing.T) {
	p := mustParse(t, "w.yaml", "cairn: 1\nstart: 2027-01\ngoals:\n  - name: car\n    target: 5,000\n")
	for _, ovs := range [][]plan.Override{
		{{Key: "target", Value: "5000 today"}, {Key: "by", Value: "2030-12"}},
		{{Key: "by", Value: "2030-12"}, {Key: "target", Value: "5000 today"}},
	} {
		_, g, err := p.With("car", "", ovs)
		if err != nil || !g.TargetToday || !g.HasBy {
			t.Errorf("With(%v) = %+v, %v; want a target in today's money by 2030-12", ovs, g, err)
		}
	}
}

// TestPlan_With_TodayGrows checks that a deposit set in today's money rises
// with inflation unless grow says otherwise, as in the goals file.
func TestPlan_With_TodayGrows(t *testing.T) {
	const head = "cairn: 1\nstart: 2027-01\ninflation: 2%\ngoals:\n  - name: car\n    deposits:\n      - amount: 100\n        every: month\n"
	p := mustParse(t, "w.yaml", head)
	file := mustParse(t, "f.yaml", strings.Replace(head, "amount: 100", "amount: 100 today", 1))
	_, g, err := p.With("car", "", []plan.Override{{Key: "deposit", Value: "100 today"}})
	if err != nil {
		t.Fatal(err)
	}
	if got, want := *g.Deposits[0], *file.Goals[0].Deposits[0]; got.GrowInflation != want.GrowInflation || got.Grow != want.Grow || !got.Today {
		t.Errorf("--set deposit=100 today gives %+v, the file gives %+v", got, want)
	}
	_, g, err = p.With("car", "", []plan.Override{{Key: "deposit", Value: "100 today"}, {Key: "grow", Value: "0%"}})
	if err != nil || g.Deposits[0].GrowInflation {
		t.Errorf("--set deposit=100 today --set grow=0%%: %+v, %v; want no growth", g.Deposits[0], err)
	}
}

// TestKeys checks the table of keys: every what-if name is one key's, every
// key a what-if may change is listed, and each key is named once in a scope.
func TestKeys(t *testing.T) {
	for _, name := range plan.OverrideKeys {
		if k, _ := plan.SetKey(name); k == nil {
			t.Errorf("OverrideKeys has %q, which no key of the table sets", name)
		}
	}
	seen := map[string]bool{}
	for _, k := range plan.Keys {
		for _, s := range []string{k.Set, k.SetOut, k.SetBudget} {
			if s != "" && !slices.Contains(plan.OverrideKeys, s) {
				t.Errorf("key %s is changed by %q, missing from OverrideKeys", k.Name, s)
			}
		}
		id := string(rune('0'+k.Scope)) + k.Name
		if seen[id] {
			t.Errorf("key %s appears twice in scope %d", k.Name, k.Scope)
		}
		seen[id] = true
		if k.Scope <= plan.InWithdrawal && k.Help == "" {
			t.Errorf("key %s has no help text", k.Name)
		}
	}
	for _, tt := range []struct {
		name string
		want bool
	}{{"deposit", true}, {"withdrawal", true}, {"grow", true}, {"every", true}, {"rate", false}, {"target", false}, {"inflation", false}} {
		if got := (plan.Override{Key: tt.name}).NeedsGoal(); got != tt.want {
			t.Errorf("Override{%s}.NeedsGoal() = %v, want %v", tt.name, got, tt.want)
		}
	}
}

func TestCheckPaths(t *testing.T) {
	// the limits are cairn's own (plan.MinPaths, plan.MaxPaths): common practice, no source
	for _, tt := range []struct {
		n  int
		ok bool
	}{{99, false}, {100, true}, {100_000, true}, {100_001, false}} {
		if err := plan.CheckPaths(tt.n); (err == nil) != tt.ok {
			t.Errorf("CheckPaths(%d) = %v, want ok %v", tt.n, err, tt.ok)
		}
	}
}

func TestParseSuccess(t *testing.T) {
	// the range (0%, 100%] is what a share of paths can be: common practice, no source
	for _, tt := range []struct {
		in     string
		want   float64
		expect string // must appear within the error
	}{
		{"90%", 0.9, ""},
		{"100%", 1, ""},
		{"0%", 0, `"0%" is out of range (want more than 0% and at most 100%)`},
		{"100.5%", 0, `is out of range`},
		{"90", 0, "invalid percentage"},
	} {
		x, err := plan.ParseSuccess(tt.in)
		if tt.expect == "" && (err != nil || x != tt.want) || tt.expect != "" && (err == nil || !strings.Contains(err.Error(), tt.expect)) {
			t.Errorf("ParseSuccess(%q) = %v, %v; want %v or an error containing %q", tt.in, x, err, tt.want, tt.expect)
		}
	}
}
