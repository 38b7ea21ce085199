package engine

// each is the state of every source valued alone, carried beside the
// walk's own balance in one pass (see Options.Each): a smooth walk is
// linear in the amounts, so each source's flows grow as if alone. Its
// fields are the walk's, one per source.
type each struct {
	bal, base, acc, accrued, low, pool []float64
	taxable                            []float64 // interest credited since the last tax (Shape.Tax)
}

func newEach(n int) *each {
	f := make([]float64, 7*n)
	return &each{bal: f[:n:n], base: f[n : 2*n : 2*n], acc: f[2*n : 3*n : 3*n], accrued: f[3*n : 4*n : 4*n], low: f[4*n : 5*n : 5*n],
		pool: f[5*n : 6*n : 6*n], taxable: f[6*n:]}
}

// interest credits (or accrues) one interest date at rate j.
func (a *each) interest(j float64, none, accrue bool) {
	for k := range a.bal {
		b, plus := a.base[k], a.acc[k]
		if none {
			b, plus = a.low[k], 0
		}
		x := b*j + plus
		if accrue {
			a.accrued[k] += x
			a.base[k] = a.bal[k] + a.accrued[k]
		} else {
			a.bal[k] += x
			a.base[k] = a.bal[k]
			a.taxable[k] += x
		}
		a.acc[k] = 0
		a.low[k] = a.base[k]
	}
}

// credit posts the interest accrued since the last credit.
func (a *each) credit() {
	for k := range a.bal {
		a.bal[k] += a.accrued[k]
		a.taxable[k] += a.accrued[k]
		a.accrued[k] = 0
	}
}

// fee takes fraction fee of every balance; wOut is what a unit leaving
// earns by the credit.
func (a *each) fee(fee, wOut, tau float64, none bool) {
	for k := range a.bal {
		f := a.bal[k] * fee
		a.flow(k, -f, wOut, tau, none)
	}
}

// flow moves x into (or out of) source k's balance; w is what a unit of it
// earns by the credit.
func (a *each) flow(k int, x, w, tau float64, none bool) {
	a.bal[k] += x
	if none {
		a.low[k] = lowest(a.low[k], a.bal[k]+a.accrued[k], tau)
	}
	if tau == 1 {
		a.base[k] += x
	} else {
		a.acc[k] += x * w
	}
}

// payIncome deposits each source's waiting income at a withdrawal, as the
// walk does; wIn is what a unit arriving earns by the credit.
func (a *each) payIncome(wIn, tau float64, none bool) {
	for k, p := range a.pool {
		if p != 0 {
			a.flow(k, p, wIn, tau, none)
			a.pool[k] = 0
		}
	}
}

// tax takes fraction rate of each balance's interest since the last tax, at
// a year's end (an interest date: the next period's base). Each source's
// share is taken whatever its sign, so that the shares sum to the whole
// walk's tax when that is positive.
func (a *each) tax(rate float64) {
	for k := range a.bal {
		x := a.taxable[k] * rate
		a.taxable[k] = 0
		a.bal[k] -= x
		a.base[k] -= x
		a.low[k] = a.bal[k] + a.accrued[k]
	}
}
