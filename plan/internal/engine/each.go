package engine

// each is the state of every source valued alone, carried beside the
// walk's own balance in one pass (see Options.Each): a smooth walk is
// linear in the amounts, so each source's flows grow as if alone. It holds
// one source's copy of the walk's state a source, side by side, so that a
// step of every source reads one run of memory.
type each []alone

// alone is one source's state in each: the walk's own, for it alone.
type alone struct {
	bal, base, acc, accrued, low, pool float64
	taxable                            float64 // interest credited since the last tax (Shape.Tax)
}

func newEach(n int) each { return make(each, n) }

// interest credits (or accrues) one interest date at rate j.
func (ea each) interest(j float64, none, accrue bool) {
	for k := range ea {
		a := &ea[k]
		b, plus := a.base, a.acc
		if none {
			b, plus = a.low, 0
		}
		x := b*j + plus
		if accrue {
			a.accrued += x
			a.base = a.bal + a.accrued
		} else {
			a.bal += x
			a.base = a.bal
			a.taxable += x
		}
		a.acc = 0
		a.low = a.base
	}
}

// credit posts the interest accrued since the last credit.
func (ea each) credit() {
	for k := range ea {
		a := &ea[k]
		a.bal += a.accrued
		a.taxable += a.accrued
		a.accrued = 0
	}
}

// fee takes fraction fee of every balance; wOut is what a unit leaving
// earns by the credit.
func (ea each) fee(fee, wOut, tau float64, none bool) {
	for k := range ea {
		ea[k].flow(-ea[k].bal*fee, wOut, tau, none)
	}
}

// flow moves x into (or out of) the source's balance; w is what a unit of
// it earns by the credit.
func (a *alone) flow(x, w, tau float64, none bool) {
	a.bal += x
	if none {
		a.low = lowest(a.low, a.bal+a.accrued, tau)
	}
	if tau == 1 {
		a.base += x
	} else {
		a.acc += x * w
	}
}

// payIncome deposits each source's waiting income at a withdrawal, as the
// walk does; wIn is what a unit arriving earns by the credit.
func (ea each) payIncome(wIn, tau float64, none bool) {
	for k := range ea {
		if a := &ea[k]; a.pool != 0 {
			a.flow(a.pool, wIn, tau, none)
			a.pool = 0
		}
	}
}

// endMonth drops the income the month's withdrawals did not need.
func (ea each) endMonth() {
	for k := range ea {
		ea[k].pool = 0
	}
}

// tax takes fraction rate of each balance's interest since the last tax, at
// a year's end (an interest date: the next period's base), when the whole
// walk pays a tax (paid: its year's interest is positive). Each source's
// share is taken whatever its sign, so that the shares sum to the whole
// walk's tax; a year the whole walk pays none, no source pays or is
// refunded any.
func (ea each) tax(rate float64, paid bool) {
	for k := range ea {
		a := &ea[k]
		x := a.taxable * rate
		a.taxable = 0
		if !paid {
			continue
		}
		a.bal -= x
		a.base -= x
		a.low = a.bal + a.accrued
	}
}

// balances writes each source's balance to bal.
func (ea each) balances(bal []float64) {
	for k := range ea {
		bal[k] = ea[k].bal
	}
}
