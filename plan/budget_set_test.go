package plan_test

import (
	"reflect"
	"strings"
	"testing"

	"cairn/examples"
	"cairn/plan"
)

// TestSetBudgetIsTheFile: --set budget=VALUE (and a scenario's change
// budget: VALUE) gives the plan, and the allocation, that writing the value
// as the budget's amount in the file gives; it needs no goal named.
func TestSetBudgetIsTheFile(t *testing.T) {
	src := string(examples.Budget)
	const line = "  amount: 650 "
	if !strings.Contains(src, line) {
		t.Fatalf("examples/budget.yaml has no %q line", line)
	}
	for _, v := range []string{"700", "1,234.56", "700 today", "0"} {
		file := mustParse(t, "budget.yaml", strings.Replace(src, line, "  amount: "+v+" ", 1))
		p := mustParse(t, "budget.yaml", src)
		set, err := p.Change("", "", []plan.Override{{Key: "budget", Value: v}})
		if err != nil {
			t.Fatalf("--set budget=%s: %v", v, err)
		}
		if !reflect.DeepEqual(*set.Budget, *file.Budget) {
			t.Errorf("--set budget=%s gives the budget %+v, the file %+v", v, *set.Budget, *file.Budget)
		}
		if p.Budget.Amount == set.Budget.Amount && v != "650" {
			t.Errorf("--set budget=%s changed the original plan's budget too", v)
		}
		got, err1 := plan.Allocate(set)
		want, err2 := plan.Allocate(file)
		if err1 != nil || err2 != nil {
			t.Fatalf("budget=%s: allocate: %v, %v", v, err1, err2)
		}
		if !reflect.DeepEqual(allocated(got), allocated(want)) {
			t.Errorf("--set budget=%s allocates %+v, the edited file %+v", v, allocated(got), allocated(want))
		}
	}
}

// allocated is what an allocation says, without the plan it points into.
func allocated(a *plan.Allocation) []any {
	out := []any{a.End, a.Amount, a.Dates, a.Amounts, a.Unallocated}
	for _, sh := range a.Shares {
		c := *sh
		c.Goal = nil
		out = append(out, sh.Goal.Name, c)
	}
	return out
}
