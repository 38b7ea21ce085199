package plan

import (
	"cairn/money"
)

// A StreamView is what the engine understood of a stream.
type StreamView struct {
	Stream        *Stream
	PerYear       int
	RatePerPeriod float64 // the goal's first rate, per period of the stream
	First, Last   Month   // months of its first and last amounts within the horizon
	Count         int     // amounts within the horizon
}

// A GoalView is what the engine understood of a goal, for checking a file.
type GoalView struct {
	Goal        *Goal
	Effective   []float64       // effective annual rate of each rate step
	Compounding money.Frequency // how often interest is credited
	PerCredit   []float64       // periodic rate at each credit, per step
	TargetAt    money.Amount
	Horizon     Month // the last month the goal's flows reach
	Streams     []StreamView
}

// Describe returns what the engine understood of goal g.
func Describe(p *Plan, g *Goal) GoalView {
	v := GoalView{Goal: g, Horizon: Horizon(p, g), TargetAt: p.TargetAt(g)}
	v.Compounding = g.Rates[0].Rate.Compounding()
	for _, st := range g.Rates {
		v.Effective = append(v.Effective, st.Rate.Effective())
		v.PerCredit = append(v.PerCredit, st.Rate.PerPeriod(v.Compounding))
	}
	s := compile(p, g, v.Horizon)
	// one pass over the events for every stream's count, first and last
	views := make([]StreamView, len(s.sources))
	for _, e := range s.events() {
		if i := int(e.Src); flowOf(&e, e.Src) && i < len(views) {
			sv := &views[i]
			if sv.Count == 0 {
				sv.First = p.Start + Month(e.Month())
			}
			sv.Last = p.Start + Month(e.Month())
			sv.Count++
		}
	}
	for _, st := range streams(g) {
		sv := views[s.sourceIndex(st)]
		sv.Stream, sv.PerYear, sv.RatePerPeriod = st, st.Every.PerYear(), g.Rates[0].Rate.PerPeriod(st.Every)
		v.Streams = append(v.Streams, sv)
	}
	return v
}
