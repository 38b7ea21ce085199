// Command ratespeed times cairn's uniform-annuity rate solver
// (money.AnnuityRate, the closed form the plan engine uses for such goals)
// on the problems written by testdata/oracle/speed.mjs, which also timed the
// reference library on them, and prints both throughputs and their ratio.
// It is run by .ci/side-by-side.sh; its numbers are printed, not asserted.
package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"time"

	"cairn/money"
)

func main() {
	if len(os.Args) != 2 {
		fmt.Fprintln(os.Stderr, "usage: ratespeed PROBLEMS.json")
		os.Exit(2)
	}
	data, err := os.ReadFile(os.Args[1])
	if err != nil {
		fmt.Fprintln(os.Stderr, "ratespeed:", err)
		os.Exit(2)
	}
	var in struct {
		Seconds   float64
		Converged int
		Problems  []struct {
			N, Pv, Pmt, Fv, Made float64
			When                 string
		}
	}
	if err := json.Unmarshal(data, &in); err != nil {
		fmt.Fprintln(os.Stderr, "ratespeed:", err)
		os.Exit(2)
	}
	ps := in.Problems
	answers := make([]float64, len(ps))
	run := func() time.Duration {
		t0 := time.Now()
		for k, p := range ps {
			answers[k], _ = money.AnnuityRate(p.N, p.Pv, p.Pmt, p.Fv, p.When == "begin")
		}
		return time.Since(t0)
	}
	run() // warm up
	best := time.Duration(math.MaxInt64)
	for range 5 {
		best = min(best, run())
	}
	converged := 0
	for k, p := range ps {
		if math.Abs(answers[k]-p.Made) < 1e-6 {
			converged++
		}
	}
	s := best.Seconds()
	fmt.Printf("cairn AnnuityRate: %d problems in %.2f ms, %.0f a second; converged to the made rate on %d\n", len(ps), s*1e3, float64(len(ps))/s, converged)
	fmt.Printf("ratio: cairn is %.1f× the reference library's throughput; every problem has a root (each was made at a known rate): cairn converged on %d of %d, the library on %d\n",
		in.Seconds/s, converged, len(ps), in.Converged)
}
