package main

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"

	"cairn/examples"
	"cairn/plan"
)

// TestBudgetGoalFigures: for every goal of examples/budget.yaml that draws
// on the budget, the balance at its deadline reads the same in status (its
// "projected" in JSON and in the report's status table), in project's JSON
// totals and in the report's projection table of the goal's page; solve
// --for time gives status's month reached. Cross-command agreement is the
// assertion (common practice, no source).
func TestBudgetGoalFigures(t *testing.T) {
	root := parseXHTML(t, reportOf(t, examples.Budget)) // in a temporary directory holding plan.yaml
	p, err := plan.Parse("plan.yaml", examples.Budget, plan.MonthOf(2026, 12))
	if err != nil {
		t.Fatal(err)
	}
	jsonOf := func(args ...string) map[string]any {
		t.Helper()
		var stdout, stderr bytes.Buffer
		argv := append([]string{"cairn"}, append(args, "--as-of", "2026-12", "--format", "json")...)
		if code := run(argv, strings.NewReader(""), &stdout, &stderr, fixedNow); code != 0 && code != 1 {
			t.Fatalf("%q: exit %d\n%s", argv, code, stderr.String())
		}
		var m map[string]any
		if err := json.Unmarshal(stdout.Bytes(), &m); err != nil {
			t.Fatalf("%q: %v\n%s", argv, err, stdout.String())
		}
		return m
	}
	status := jsonOf("status", "plan.yaml")
	tables := root.find(func(n *node) bool { return n.name == "table" && n.hasClass("projection") })
	if len(tables) != len(p.Goals) {
		t.Fatalf("%d projection tables for %d goals", len(tables), len(p.Goals))
	}
	for i, g := range p.Goals {
		var sg map[string]any
		for _, x := range status["goals"].([]any) {
			if m := x.(map[string]any); m["goal"] == g.Name || m["name"] == g.Name {
				sg = m
			}
		}
		if sg == nil {
			t.Fatalf("status JSON has no goal %s: %v", g.Name, status["goals"])
		}
		projected, _ := sg["projected"].(string)
		proj := jsonOf("project", "plan.yaml", "--goal", g.Name)
		closing := proj["totals"].(map[string]any)["closing"]
		foot := tables[i].find(func(n *node) bool { return n.name == "tr" && n.parent.name == "tfoot" })
		if len(foot) != 1 {
			t.Fatalf("%s: %d totals rows in the report", g.Name, len(foot))
		}
		c := foot[0].elems()
		page := strings.ReplaceAll(c[len(c)-2].allText(), ",", "")
		if projected == "" || closing != projected || page != projected {
			t.Errorf("%s: at the deadline status %q, project %v, the report's page %q", g.Name, projected, closing, page)
		}
		if _, ok := proj["priority"]; !ok {
			t.Errorf("%s: project's JSON does not say the goal draws on the budget", g.Name)
		}
		solved := jsonOf("solve", "plan.yaml", "--goal", g.Name, "--for", "time")
		if solved["answer"] != sg["reached"] {
			t.Errorf("%s: solve --for time %v, status reached %v", g.Name, solved["answer"], sg["reached"])
		}
	}
}
