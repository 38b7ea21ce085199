// Package money holds cairn's value types and the formulas of the time value
// of money: decimal amounts, annual rates in the trade's stated forms,
// payment and compounding frequencies, and the compound-interest factors.
//
// The package does no I/O and reads no clock; it is pure values and
// arithmetic, so every number a user sees can be traced to one place.
//
// # Amounts
//
// An [Amount] is an exact decimal (it wraps shopspring/decimal and never
// changes that library's global settings). Arithmetic on amounts is exact;
// the only rounding is [Amount.Round], which rounds to a number of decimal
// places (a currency's minor unit, see [Currency]) under a named [Rounding]
// rule: [HalfEven] (the default, "banker's rounding") or [HalfUp].
//
// # Rates
//
// A [Rate] is an annual rate stated in one of the trade's forms:
//
//   - effective annual: the yield over one year, what Regulation DD calls the
//     annual percentage yield (APY). A bare "4.1%" means this form.
//   - nominal annual compounded m times a year: "3.9% compounded monthly"
//     means 3.9%/12 per month.
//   - continuously compounded: "5% compounded continuously", a force of
//     interest of 0.05 a year.
//   - periodic: "0.35% per month", the rate for one period of a frequency.
//
// Any form converts to any other, and [Rate.PerPeriod] gives the equivalent
// rate for one period of any [Frequency]: the rate to use when compounding is
// more or less frequent than payments. Rates are float64 inside, not decimal:
// the conversions and factors are transcendental (powers with fractional
// exponents, logarithms), so a decimal type would only pretend to be exact.
// Amounts stay decimal; a factor multiplies an amount and the product is
// rounded to the cent where it is posted.
//
// # Exact rounding of products
//
// A product posted to the cent must round by the rule when it is exactly
// halfway: 1,503 × 2%/12 = 2.505 is 2.50 half-even and 2.51 half-up, and
// 75 × 1.025 = 76.875 is 76.88 under both. In float64 such a product lands a
// hair to either side of the half. A [Multiplier] carries a factor's float
// and, when the factor is rational, its exact form: a rate stated as a
// decimal for one period of its own frequency or a whole multiple of it (a
// nominal rate's x/m, a periodic rate, and (1 + x/m)^k − 1 for k whole), a
// fee's twelfth, and a growth by a decimal rate over whole years, (1 + x)^n.
// [RoundProduct] rounds the float product when it is clearly away from a
// half and, only within a small margin of one, redoes the product exactly,
// in 64- and 128-bit integers or, when those would overflow, big.Rat.
// A decimal is read back from its float64 as the nearest decimal of 15
// significant digits, which is the decimal a person wrote.
//
// The float product alone is exact enough for the irrational factors: an
// effective rate per month ((1 + x)^(1/12) − 1), a continuously compounded
// rate, inflation over part of a year, fractional-period accrual. Their
// products with a whole number of cents are never exactly halfway, and a
// float64 is good to about 16 significant digits, far below a cent.
//
// Division of amounts goes through [Amount.DivRound], from the exact
// quotient with an explicit number of places and rule; the decimal
// library's global division precision is never used.
//
// # Frequencies
//
// A [Frequency] is how often something happens in a year: day (365), week
// (52), 2 weeks (26), half month (24), month (12), 2 months (6), quarter (4),
// half year (2) and year (1), plus [Continuous] for compounding only. Words
// that mean two different things in common use ("biweekly", "bimonthly",
// "biannually") are refused rather than guessed.
//
// # Factors
//
// The compound-interest factors follow the trade's notation, (X/Y, i, n):
// "find X given Y at rate i per period over n periods". Their placement
// conventions, which the plan package relies on:
//
//   - P, a present amount, sits at t = 0;
//   - A, a uniform series, is paid at the end of periods 1..n, nothing at t = 0;
//   - F, a future amount, sits at t = n, on the same date as the last A;
//   - G, an arithmetic gradient, is 0 at the end of period 1, G at the end of
//     period 2, …, (n−1)G at the end of period n;
//   - a geometric series starts at A₁ at the end of period 1 and grows by g a
//     period: A₁(1+g)^(k−1) at the end of period k.
//
// Every factor is exact at i = 0 (it returns the limit, not a division by
// zero), accurate for tiny i (it works through log1p and expm1), and defined
// for non-integer n.
package money
