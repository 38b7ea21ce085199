// Package plan is cairn's engine: the goals file, an exact ledger of every
// movement on each goal's account, and solvers for whichever quantity is
// unknown — time, deposit, rate, starting sum, withdrawal, or how long money
// lasts. It never reads the clock; callers pass today's month.
//
// # Goals file
//
// A household writes its goals in one YAML file, format version 1 ("cairn:
// 1"). [Parse] decodes it through yaml.Node so that every problem carries a
// file, line and column, and reports all of them at once as an [ErrorList].
// Unknown keys are errors (with a "did you mean" hint), and so are wrong
// types, bad dates, dates out of order, ambiguous frequencies, negative
// deposits and values beyond the limits (see [MaxFileSize], [MaxGoals],
// [HorizonYears] and the other limits), and so is a file whose streams
// multiply past the work budget ([MaxEvents] a goal, [MaxFileEvents] a
// file; a simulation [MaxSimulationSteps]), counted from the file before
// anything is compiled.
//
// One table, [Keys], says for every key where it may appear, how its value
// is written and checked, where it goes in the model, its help text and
// whether a what-if may change it. The decoder, [Plan.With] (--set and
// --vary) and the help on the file all read it, and the rules across keys
// (a target in today's money needs a deadline) run after parsing and after
// every what-if, so a what-if the file would refuse is refused alike.
//
// # Time
//
// Time is exact. Every event sits on an integer tick of a year divided into
// [TicksPerYear] = 113,880 ticks, the least common multiple of the counts a
// year of every frequency, so 52 weeks and 26 two-week periods are exactly a
// year, and the ledger agrees with the compound-interest factors. Month m of
// the plan spans ticks [m·9490, (m+1)·9490). Dates are shown by month; there
// are no day counts. A deadline "by: 2029-06" is the end of June 2029.
//
// A stream every p per year from month M has period k spanning
// [M + k/p, M + (k+1)/p) years; timing end (the default, an ordinary
// annuity) puts its amount at the end of the period, timing start (an
// annuity due) at its beginning. An end-timed monthly stream from January
// has its first amount at the end of January, one period after its start,
// and a deadline at the end of a month includes that month's end-timed
// amount: F falls on the date of the last A. Growth ("grow: 3%") raises the
// amount once a year on the stream's anniversary; an amount "in today's
// money" ("250 today") is grown by inflation from the plan's start to the
// stream's first month, and then rises with inflation each year unless grow
// says otherwise. Today's money means money at the plan's start.
//
// # Interest
//
// Interest is credited at the compounding dates of the goal's first rate:
// every 1/m year for a rate compounded m times a year, each period for a
// periodic rate, and monthly (at the equivalent monthly rate) for effective
// and continuously compounded rates. A rate schedule changes the rate from a
// month on; each interest period uses the rate in force in the month it
// begins. Each credit is rounded to the cent (the currency's minor unit)
// with the file's rounding rule; so is each fee and each amount of a growing
// stream. A credit, fee or amount that is exactly halfway between two cents
// (1,503 × 2%/12 = 2.505, 75 × 1.025 = 76.875) goes by the rule, not by
// float noise: the walk rounds through [money.RoundProduct], which settles
// near-halfway products in exact arithmetic. The monthly credit of interest
// accrued more often than monthly is the float sum rounded: its exact value
// has powers of the daily or weekly rate in its denominator and is never
// halfway. So is interest that includes money moved part way through an
// interest period: under compound it is irrational, under simple (j·τ) it
// is rational but summed in float, a known limit. When compounding is more frequent than monthly (daily, weekly),
// interest accrues unrounded at every compounding date, itself earning
// interest, and is credited at each month end, as banks credit daily
// interest and as Regulation DD's daily-rate examples assume. Fees ("fee: 0.25%", a year) are taken at each month end as a
// twelfth of the rate times the balance then, after that month's interest.
//
// When compounding is more frequent than deposits, balances compound at
// every interest date between deposits, so results equal the factors at the
// effective rate per deposit period. When it is less frequent, the goal's
// between rule decides what money arriving or leaving between two interest
// dates earns until the next one. With j the rate per interest period and τ
// the fraction of the period left when the money arrives:
//
//   - compound (the default): (1+j)^τ − 1, fractional-period compounding;
//     this equals compounding at the effective rate per deposit period.
//   - simple: j·τ, simple interest for the fraction, credited at the date.
//   - none: interest on the lowest balance held throughout the interest
//     period. A deposit earns nothing until the period ends; money
//     withdrawn earns nothing for that period; flows within a period offset
//     first, so a withdrawal takes from the period's deposits before the
//     balance the period began with. At a non-negative rate this interest
//     is never negative.
//
// A worked example: 4% compounded quarterly (j = 1%) and 1,000 deposited one
// month into a quarter (τ = 2/3). At the quarter's end, compound credits
// 1,000 × (1.01^(2/3) − 1) = 6.656… → 6.66; simple credits 1,000 × 0.01 ×
// 2/3 = 6.666… → 6.67; none credits 0.00. A 1,000 withdrawal from a balance
// of 5,000 one month into the quarter leaves 4,000 earning, under none,
// 40.00 for the quarter instead of compound's 5,000 × 0.01 − 6.66 = 43.34.
// And 1,000 in at the end of January and out at the end of February, on an
// empty account: the lowest balance of the quarter is 0.00, so none credits
// 0.00 (the two flows offset; neither is charged against the other).
//
// Under none the walk is not linear in the amounts — the lowest balance of
// a sum is not the sum of the lowest balances — so the values of the flows
// each taken alone add up to the balance only when no interest period
// holds, after its first instant, money both in and out or a fee. Otherwise
// the equation of value shows the difference as a term of its own,
// "offsetting flows".
//
// # Order at one instant
//
// Several things can happen at one tick. They happen in this order: the
// interest credit for the period ending then (and, for daily or weekly
// compounding, the month's credit of what has accrued); the month's fee;
// the amounts due at the end of a period — money in (deposits, one-time
// amounts in) before money out (withdrawals, one-time amounts out); the
// month-end balance; then the amounts due at the start of a period, again
// money in before money out. So money that arrives at an instant can pay
// what leaves at it: a one-time 1,000 at the end of the month a 1,000
// withdrawal falls due pays it, even on an empty account. The month-end
// balance is the one a statement for that month shows: it excludes the
// next month's start-of-period amounts, which fall at the same tick.
//
// # Conventions
//
// What to know to check cairn against a statement:
//
//   - A rate "x%" or "x% per year" is effective: what a year's interest
//     adds, compounding included. "x% compounded monthly" is nominal, 12
//     credits of x/12; "x% per month" is periodic.
//   - Compounding dates count from the plan's start, not the calendar: a
//     rate compounded quarterly in a plan starting in February credits at
//     the ends of April, July, October and January.
//   - Daily compounding has 365 interest dates a year, one every 365th of
//     a year, and a month is a twelfth of a year (30 5/12 days), so a
//     month's credit covers the whole days that end within it: 30 or 31,
//     in the pattern 30, 30, 31, 30, 31, 30, 30, 31, 30, 31, 30, 31 from
//     the plan's start (182 in the first six months, 365 in a year). The
//     fraction of a day at a month's end is carried: it is paid with the
//     next month's first day.
//   - Interest accrued at daily or weekly dates is credited at the month
//     end rounded to the cent; the fraction of a cent left over is carried
//     to the next month's credit, and earns interest meanwhile (it can
//     round a later credit up or down by a cent).
//   - Every interest credit, fee and amount is rounded once, to the cent,
//     with the file's rounding rule (half-even unless "rounding: half-up").
//   - "every 2 weeks" is 26 amounts a year, exactly half of the 52 weekly
//     ones: the time grid divides a year into 26 equal two-week periods,
//     not into 14-day periods (which would make about 26.07). "twice a
//     month" is 24.
//   - The fee ("fee: 0.25%", a year) is taken at each month end as a
//     twelfth of the rate times the balance then: after that month's
//     interest credit and before the amounts due at that instant.
//   - The leave of a withdrawal goal ("leave: 10,000") is the balance at
//     the end of the month of the last withdrawal (the latest until of its
//     withdrawal streams), after that month's interest and fee.
//   - A deadline "by: 2029-06" is the end of June 2029, and includes the
//     amounts due then.
//
// # Ledger
//
// The [Ledger] is exact: every balance and posting is a whole number of the
// currency's minor unit, reported as a decimal [money.Amount]. The package
// does not use the decimal library directly: amounts are multiplied,
// divided and rounded only through package money. It records
// every movement — opening balance,
// deposits, one-time amounts, withdrawals, interest, fees — with its tick,
// month, amount and the balance after it. A withdrawal larger than the
// balance takes what is there and records the shortfall; nothing goes
// negative silently. [Ledger.Rows] sums it by month or by year, with each
// closing balance also in today's money.
//
// # Solvers
//
// [Solve] answers a [Question] with an [Answer]: the answer, the ledger that
// proves it, and the [Equation] of value — one [Term] per flow with its
// value at the deadline and, where one chain of factors describes it, the
// factors, e.g. 250.00 × (F/A, 0.1539%, 65). Searches walk the same
// compiled schedule as the ledger, with the same exact arithmetic (the
// ledger is the walk with its movements recorded), so an answer is what the
// ledger shows: a deposit solved for meets the target and one cent less
// misses. Only root finding for a rate uses the smooth, unrounded balance,
// and the exact walk then settles the last cent.
//
// No balance goes below zero (a withdrawal larger than the balance is paid
// in part), so the balance at a deadline never falls as the rate rises: the
// rates that meet a target are one range, and the answer is its lowest. A
// root of the smooth balance where the exact balance does not cross the
// target (the smooth one goes negative where the exact one stops at zero)
// is not a rate; when the balance at the deadline is the same at every rate
// and meets the target, the answer is that every rate meets it (a
// [SolveError], not a rate). A solved rate is shown rounded up to the places
// shown, so that written back it meets the target (see
// [Answer.ShownNominal]).
//
// [Compare] solves one question over a grid of what-if overrides, and
// [StatusOf] gives every goal at a glance.
//
// # Household budget
//
// A plan's [Budget] is what the household can set aside: a stream of
// amounts (its frequency, timing, from, until and growth as a deposit
// stream's) shared by the goals with a priority, 1 first. A goal's own
// deposits (an employer's, a gift) are not the budget and run as written.
// Each goal drawing on the budget gets a deposit stream of its own, the
// budget share, on the budget's dates; its amount at each date is decided
// by the rule, and the goal's ledger is the one walk with those amounts.
// The goals are allocated in priority order, each from what the goals
// before it left at each date, in whole cents:
//
//   - by priority (rule: priority): a goal gets a level amount L a date
//     until its deadline, taken from what is left; at a date with less left
//     than it is owed, it takes what is left and is owed the rest, paid as
//     soon as enough is left (so its shares through any date sum to the
//     lesser of L times the dates so far and what was left to it by then).
//     L is the least whole-cent level with which it is reached by its
//     deadline. When none is — or the goal has no deadline — it takes
//     everything left. After its deadline, a goal not yet reached takes
//     everything left.
//   - one at a time (rule: one-at-a-time): a goal takes everything left:
//     everything goes to the first goal until it is reached, then to the
//     next.
//
// A deposit stream of a goal's own with until: reached pays through the
// month the target is first reached and stops (found by walking the goal
// with the stream open-ended: what it would pay later cannot change that
// month); for a goal on the budget, the month its shares reach it.
//
// A goal is reached at the first month end its balance meets its target;
// from the next budget date on (a date in a later month) it gets nothing
// and its share goes to the goals after it. What no goal takes is
// unallocated. With a budget equal to the sum of the goals' solved deposits
// at the budget's frequency, each goal gets exactly its solved deposit.
// [Allocate] splits the file's budget; [SmallestBudget] finds the least
// budget amount, in whole cents, with which every goal (or the first k)
// meets its deadline — one cent less misses one, by the same ledgers.
//
// The budget's amount may change from a month on (changes:, each a month
// and an amount): from the first budget date in that month, on the
// budget's own dates, the amount is the change's, until the next change.
// Grow applies to each amount from its own start: a change's amount at a
// date is the amount times (1 + grow) to the whole years from the change's
// month to the date's month (an amount in today's money is first indexed
// by inflation to the change's month). The smallest budget is the least
// first amount; the changes stay as written.
package plan
