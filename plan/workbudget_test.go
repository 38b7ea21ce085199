package plan

import (
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"

	"cairn/plan/internal/engine"
)

// budgetFile is a goals file of goals goals, each with streams daily deposit
// streams over the whole 150 years and a target it never reaches (so the
// time solve walks to the plan's end).
func budgetFile(goals, streams int) string {
	var b strings.Builder
	b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n")
	for i := range goals {
		fmt.Fprintf(&b, "  - name: g%d\n    rate: 4%% compounded daily\n    target: 900000M\n    by: 2176-12\n    volatility: 10%%\n    deposits:\n", i)
		for k := range streams {
			fmt.Fprintf(&b, "      - {name: s%d, amount: 1, every: day}\n", k)
		}
	}
	return b.String()
}

// The count the budget is checked against is an upper bound of the events
// compiled, so that a file within the budget is within it when compiled:
// every example file, and the daily-stream files below.
func TestEventsOfBoundsTheSchedule(t *testing.T) {
	files, _ := filepath.Glob("../examples/*.yaml")
	srcs := map[string]string{"1 goal × 4 daily streams": budgetFile(1, 4), "3 goals × 1": budgetFile(3, 1)}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		srcs[filepath.Base(f)] = string(data)
	}
	for name, src := range srcs {
		p, err := Parse(name, []byte(src), MonthOf(2026, 12))
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		for _, g := range p.Goals {
			s := compile(p, g, horizonEnd(p))
			if n, bound := int64(s.eng.Len()), eventsOf(p, g, horizonEnd(p)); n > bound {
				t.Errorf("%s, goal %s: %d events compiled, over the %d counted", name, g.Name, n, bound)
			}
		}
	}
}

// A file whose streams multiply past the work budget is refused when read
// and when a what-if would take it there, with the goal's position, before
// anything is compiled; a simulation past its budget is refused too.
func TestWorkBudgetRefused(t *testing.T) {
	tests := []struct {
		name, src, want string
	}{
		{"60 goals, one daily stream each", budgetFile(60, 1), `budget.yaml:361:5: goal "g51": with the goals before it, the plan's amounts and interest dates come to about 6,068,556 events`},
		{"two goals of 50 daily streams", budgetFile(2, 50), `goal "g1": with the goals before it`},
	}
	for _, tt := range tests {
		_, err := Parse("budget.yaml", []byte(tt.src), 0)
		if err == nil || !strings.Contains(err.Error(), tt.want) {
			t.Errorf("%s: Parse error %v, want one containing %q", tt.name, err, tt.want)
		}
	}
	// two goals of 50 weekly streams are within the budget; every day
	// they are not
	weekly := strings.ReplaceAll(budgetFile(2, 50), "every: day", "every: week")
	p, err := Parse("budget.yaml", []byte(weekly), 0)
	if err != nil {
		t.Fatalf("50 weekly streams: %v", err)
	}
	if _, _, err := p.With("g0", "s0", []Override{{Key: "every", Value: "day"}}); err != nil {
		t.Errorf("one of them daily: %v, want it within the budget", err)
	}
	q := p
	for k := range 100 {
		if q, _, err = q.With(fmt.Sprintf("g%d", k/50), fmt.Sprintf("s%d", k%50), []Override{{Key: "every", Value: "day"}}); err != nil {
			if !strings.Contains(err.Error(), "more than the 6,000,000 one file may have") {
				t.Errorf("stream %d made daily: %v, want the budget's refusal", k, err)
			}
			break
		}
	}
	if err == nil {
		t.Errorf("100 daily streams were accepted through --set")
	}
	// simulating 100,000 paths over a goal of four daily streams
	p, err = Parse("budget.yaml", []byte(budgetFile(1, 4)), 0)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Simulate(p, p.Goals[0], SimOptions{Paths: 100_000}); err == nil || !strings.Contains(err.Error(), "more than the 500,000,000 one command may take") {
		t.Errorf("Simulate: %v, want the budget's refusal", err)
	}
}

// The worst file within the budget — daily streams up to the file's
// budget, each goal's target out of reach so that its time solve walks to
// the plan's end — is read and given its household status within counts
// that do not depend on the machine: the memory the issue allows a status
// (200 MB, allocated in all), the walks of a status (a few per goal), and a
// cache no larger than its bound.
func TestWorkBudgetWorstWithinLimits(t *testing.T) {
	if testing.Short() {
		t.Skip("a status over 5 million events")
	}
	for _, tt := range []struct {
		name         string
		goals, count int
	}{
		{"51 goals of a daily stream", 51, 1},   // 51 × about 119,000 events: just within 6,000,000
		{"one goal of 50 daily streams", 1, 50}, // the most streams a goal may have, about 5,482,000
	} {
		src := budgetFile(tt.goals, tt.count)
		var before, after runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&before)
		walks := engine.Walks()
		p, err := Parse("worst.yaml", []byte(src), 0)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		st := StatusOf(p)
		runtime.ReadMemStats(&after)
		walks = engine.Walks() - walks
		if alloc := after.TotalAlloc - before.TotalAlloc; alloc > 200<<20 {
			t.Errorf("%s: parse and status allocated %d MB, want at most 200 MB", tt.name, alloc>>20)
		}
		if max := int64(tt.goals * 20); walks > max {
			t.Errorf("%s: parse and status walked %d times, want at most %d (20 a goal)", tt.name, walks, max)
		}
		if n := p.cache.Events(); n > engine.MaxCachedEvents {
			t.Errorf("%s: the cache holds %d events, over its bound %d", tt.name, n, engine.MaxCachedEvents)
		}
		if len(st.Goals) != tt.goals || st.Goals[0].OnTrack {
			t.Errorf("%s: status of %d goals, first on track %v; want %d, not on track", tt.name, len(st.Goals), st.Goals[0].OnTrack, tt.goals)
		}
	}
}
