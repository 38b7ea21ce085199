package plan_test

import (
	"strings"
	"testing"

	"cairn/plan"
)

// A drawdown lasts only when every withdrawal is paid in full and the
// goal's leave remains after the last one (issue 15, item 1). The amounts
// are hand arithmetic at a zero rate: 100,000 − 12 × 1,000 = 88,000
// (common practice, no source).
func TestLastsNeedsLeave(t *testing.T) {
	for _, tc := range []struct {
		name, leave string
		lasts       bool
		target      int64 // cents
	}{
		{"nothing to leave", "0", true, 0},
		{"leave met", "88,000", true, 88_000_00},
		{"leave missed by a cent", "88,000.01", false, 88_000_01},
		{"leave missed", "90,000", false, 90_000_00},
		// 10,000 today grown by 2.5% for the one year to the end of
		// 2027-12: 10,000 × 1.025 = 10,250 (common practice, no source)
		{"leave today", "10,000 today", true, 10_250_00},
		{"leave today missed", "88,000 today", false, 90_200_00},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := "cairn: 1\nstart: 2027-01\ninflation: 2.5%\ngoals:\n  - name: g\n    balance: 100,000\n    rate: 0%\n" +
				"    withdrawals:\n      - { amount: 1000, every: month, from: 2027-01, for: 12 months }\n    leave: " + tc.leave + "\n"
			p := mustParse(t, tc.name, src)
			g := p.Goals[0]
			a, err := plan.Solve(p, g, plan.Question{For: plan.ForLasts})
			if err != nil {
				t.Fatal(err)
			}
			if a.Lasts != tc.lasts || !a.Paid || cents(a.Left) != 88_000_00 || cents(a.Target) != tc.target {
				t.Fatalf("lasts %v paid %v left %s leave %s; want lasts %v, paid, left 88,000.00, leave %d cents", a.Lasts, a.Paid, a.Left, a.Target, tc.lasts, tc.target)
			}
			if !tc.lasts && !strings.Contains(a.Note, "short of the") {
				t.Errorf("note %q does not say the leave is missed", a.Note)
			}
			st := plan.StatusOf(p)
			if st.Goals[0].Lasts == nil || st.Goals[0].Lasts.Lasts != tc.lasts {
				t.Errorf("status says lasts %+v, want %v", st.Goals[0].Lasts, tc.lasts)
			}
			// zero volatility: every path is the ledger (issue 15 checks)
			vol := 0.0
			sim, err := plan.Simulate(p, g, plan.SimOptions{Paths: 100, Volatility: &vol})
			if err != nil {
				t.Fatal(err)
			}
			want := 0
			if tc.lasts {
				want = 100
			}
			if sim.LastsPaths != want || sim.RunOutPaths != 0 || sim.LeaveShortPaths != 100-want || cents(sim.Leave) != tc.target {
				t.Errorf("simulated lasts %d, run out %d, short of leave %d (leave %s); want %d, 0, %d", sim.LastsPaths, sim.RunOutPaths, sim.LeaveShortPaths, sim.Leave, want, 100-want)
			}
			// the largest withdrawal that leaves it: (100,000 − leave)/12,
			// rounded down to the cent
			w, err := plan.Solve(p, g, plan.Question{For: plan.ForWithdrawal})
			if err != nil {
				t.Fatal(err)
			}
			if got, wantW := cents(w.Amount), (100_000_00-tc.target)/12; got != wantW {
				t.Errorf("withdrawal %s, want %d cents", w.Amount, wantW)
			}
		})
	}
}

// Once a withdrawal cannot be paid in full the goal has run out: the
// balance is zero, what the emptied account earned in that interest period
// is forfeit, and money that arrives later does not make the money "last"
// (issue 15, item 4). At a zero rate: 1,000 − 400 − 400 = 200 paid in March
// of 400, April's 400 unpaid, then 5,000 arrives in May before its 400 goes
// out: 4,600, and 4,200 in June; unpaid 200 + 400 = 600 (common practice,
// no source).
func TestRuinEndsTheDrawdown(t *testing.T) {
	p := mustParse(t, "ruin", goalFile("balance: 1,000", "rate: 0%",
		"withdrawals:", "  - { amount: 400, every: month, from: 2027-01, until: 2027-06 }",
		"once:", "  - { amount: 5000, on: 2027-05 }"))
	g := p.Goals[0]
	l := mustProject(t, p, g, start.Add(11))
	if m, ok := l.FirstShort(); !ok || m != start.Add(2) {
		t.Fatalf("first short %s %v, want 2027-03", m, ok)
	}
	for m, want := range map[plan.Month]int64{start.Add(2): 0, start.Add(3): 0, start.Add(4): 4_600_00, start.Add(5): 4_200_00} {
		if b := l.BalanceAt(m); cents(b) != want {
			t.Errorf("balance at %s = %s, want %d cents", m, b, want)
		}
	}
	rows := l.Rows(plan.ByYear, true)
	if got := cents(rows[len(rows)-1].Short); got != 600_00 {
		t.Errorf("unpaid %d cents, want 60000", got)
	}
	a, err := plan.Solve(p, g, plan.Question{For: plan.ForLasts})
	if err != nil {
		t.Fatal(err)
	}
	if a.Lasts || a.Paid || a.Month != start.Add(2) || !a.Balance.IsZero() {
		t.Errorf("lasts %v paid %v month %s balance %s; want runs out in 2027-03 with 0", a.Lasts, a.Paid, a.Month, a.Balance)
	}
}

// After the money runs out the balance shows as zero in the simulation's
// percentiles: interest the money earned in the period before it left is
// not credited to the empty account. A yearly credit (each December) on a
// balance drawn out in March would otherwise show in December.
func TestRuinShowsZero(t *testing.T) {
	p := mustParse(t, "ruin", goalFile("balance: 1,000", "rate: 5% compounded yearly",
		"withdrawals:", "  - { amount: 400, every: month, from: 2027-01, until: 2027-06 }"))
	g := p.Goals[0]
	l := mustProject(t, p, g, start.Add(23))
	for m := start.Add(2); m <= start.Add(23); m++ {
		if b := l.BalanceAt(m); !b.IsZero() {
			t.Errorf("ledger balance at %s = %s after the money ran out, want 0", m, b)
		}
	}
	vol := 0.0
	sim, err := plan.Simulate(p, g, plan.SimOptions{Paths: 100, Volatility: &vol})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range sim.Rows {
		if r.Month >= start.Add(2) {
			for i, v := range r.P {
				if !v.IsZero() {
					t.Errorf("simulated percentile %d at %s = %s after ruin, want 0", i, r.Month, v)
				}
			}
		}
	}
}

// A goal with withdrawals is reached only before they begin: money that
// arrives later does not make it "reached" (issue 15, item 4).
func TestReachedOnlyBeforeWithdrawals(t *testing.T) {
	p := mustParse(t, "late", goalFile("balance: 1,000", "rate: 0%", "target: 1,500",
		"withdrawals:", "  - { amount: 100, every: month, from: 2027-03, for: 3 months }",
		"once:", "  - { amount: 5000, on: 2027-10 }"))
	_, err := plan.Solve(p, p.Goals[0], plan.Question{For: plan.ForTime})
	if err == nil || !strings.Contains(err.Error(), "before withdrawals begin in 2027-03") {
		t.Fatalf("Solve(time) error = %v, want not reached before withdrawals begin in 2027-03", err)
	}
	// reached before they begin: found
	p = mustParse(t, "early", goalFile("balance: 1,000", "rate: 0%", "target: 1,500",
		"withdrawals:", "  - { amount: 100, every: month, from: 2027-12, for: 3 months }",
		"once:", "  - { amount: 600, on: 2027-05 }"))
	a, err := plan.Solve(p, p.Goals[0], plan.Question{For: plan.ForTime})
	if err != nil || a.Month != start.Add(4) {
		t.Fatalf("Solve(time) = %v, %v; want 2027-05", a, err)
	}
}

// A status row never says both reached and short: a target met before the
// deadline and lost by it is not "reached" (issue 15, item 4).
func TestStatusNotReachedAndShort(t *testing.T) {
	p := mustParse(t, "lost", goalFile("balance: 1,000", "rate: 0%", "target: 1,000", "by: 2027-06",
		"once:", "  - { amount: -100, on: 2027-03 }"))
	gs := plan.StatusOf(p).Goals[0]
	if gs.OnTrack || cents(gs.Short) != 100_00 {
		t.Fatalf("on track %v short %s; want short by 100", gs.OnTrack, gs.Short)
	}
	if gs.Reach == nil || gs.Reached != 0 {
		t.Errorf("status says reached %s (err %v) while short", gs.Reached, gs.Reach)
	}
}
