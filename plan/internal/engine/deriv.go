package engine

import "math"

// deriv carries, beside a smooth walk's balances, their derivatives with
// respect to one parameter of the rates (see Options.DRates): every rule
// of the walk differentiated in place, so that a search for a rate takes
// Newton steps on the walk's own balance.
type deriv struct {
	bal, base, acc, accrued, low float64
	taxable                      float64   // interest credited since the last tax (Shape.Tax)
	dw                           []float64 // derivative of each weight (see Schedule.weights)
}

// dweights returns the derivative of each of weights' values for rates
// js whose derivatives are djs.
func (s *Schedule) dweights(js, djs []float64, b Between) []float64 {
	nt := len(s.taus)
	w := make([]float64, 2*len(js)*nt)
	for k, j := range js {
		l := math.Log1p(j)
		for i, tau := range s.taus {
			w[2*(k*nt+i)] = dAccrual(b, l, tau, false) * djs[k]
			w[2*(k*nt+i)+1] = dAccrual(b, l, tau, true) * djs[k]
		}
	}
	return w
}

// dAccrual is the derivative of [Accrual] with respect to the periodic
// rate j, whose log is l.
func dAccrual(b Between, l, tau float64, out bool) float64 {
	if tau == 1 {
		return 1
	}
	switch b {
	case Simple:
		return tau
	case None:
		if out {
			return 1
		}
		return 0
	}
	return tau * math.Exp((tau-1)*l)
}

// dlowest is the derivative of lowest(low, v, tau), dlow and dv those of
// low and v.
func dlowest(low, v, tau, dlow, dv float64) float64 {
	if tau == 1 || v < low {
		return dv
	}
	return dlow
}
