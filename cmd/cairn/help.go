package main

// fileHelp documents every key of the goals file with its default.
const fileHelp = `THE GOALS FILE (format version 1)

A household's goals, in one YAML file. Indent with spaces. Amounts are written
as people write them: 1500, 1,500.00, 1_500, $1,500, 1.5k, 1.2M. Months are
YYYY-MM; a deadline month means the end of that month. Run ` + "`cairn init`" + ` to get
an example to edit, and ` + "`cairn check FILE`" + ` to see what cairn understood.

TOP LEVEL
  cairn       required   the format version: 1
  start       the month after --as-of (today)
                         first month of the plan; t = 0 is its start, balances
                         are as of then, and "today's money" means money then
  currency    USD        ISO 4217 code (USD, EUR, GBP, JPY, ...), for display
                         and for the places postings round to (JPY: 0)
  inflation   0%         a year; grows "today" amounts, gives today's-money figures
  inflation_volatility
              0%         for cairn simulate: the volatility of inflation a year,
                         such as 1% (see SIMULATION)
  rounding    half-even  how each interest, fee and growing amount rounds to the
                         cent: half-even or half-up
  goals       required   a list of goals

EACH GOAL
  name        required   unique within the file
  balance     0          already saved at the start
  rate        0%         a rate, or a schedule of rates:
                           rate: 4.1%                       (effective a year)
                           rate: 4.1% apy                   (the same)
                           rate: 3.9% compounded monthly    (nominal)
                           rate: 5% compounded continuously
                           rate: 0.35% per month            (periodic)
                           rate:
                             - 6.5%
                             - from: 2045-01
                               rate: 4.5%
                         A bare rate is the effective annual rate. Interest is
                         credited at the first rate's compounding dates: every
                         1/m year for "compounded m", each period for "per",
                         monthly for effective and continuous rates.
  between     compound   what money arriving or leaving between two interest
                         dates earns until the next one:
                           compound  fractional-period compounding (the
                                     effective rate per deposit period)
                           simple    simple interest for the fraction
                           none      nothing for deposits; withdrawals earn
                                     nothing for that period
  fee         0%         a year, taken monthly (a twelfth) from the balance
  volatility  none       for cairn simulate: the volatility of returns a year,
                         such as 12%, from 0% to 100% (see SIMULATION); none
                         means returns are fixed
  target      none       an amount, or "400k today" in today's money (grown by
                         inflation to the deadline; needs by)
  by          none       the deadline: the end of that month
  deposits    none       a list of streams (below)
  withdrawals none       a list of streams, plus for:
  once        none       one-time amounts: positive in, negative out
                           - name: gift       (optional)
                             amount: 1,000
                             on: 2027-12      (at the end of that month)
  leave       0          balance that must remain after the last withdrawal;
                         "50k today" is in today's money, grown by inflation
                         to the last withdrawal. The money lasts only when
                         every withdrawal is paid in full and this is left.

EACH STREAM (deposits and withdrawals)
  name        none       a label, used by --stream
  amount      required   per period, 0 or more; "250 today" is in today's money
                         and rises with inflation unless grow says otherwise
  every       required   day, week, 2 weeks (fortnightly), half month (twice a
                         month, semimonthly), month, 2 months, quarter, half
                         year (twice a year, semiannually), year (annually).
                         "biweekly" and "bimonthly" are refused: each means two
                         different things.
  timing      end        end or start of each period
  from        start      first month with a period
  until       none       last month with an amount (none: open-ended)
  for         none       withdrawals only, instead of until: "30 years", "18 months"
  grow        0%         a yearly rise of the amount, or "inflation"

SIMULATION (cairn simulate)
  cairn simulate runs the plan many times (--paths, default 10,000) with
  random returns, and otherwise exactly as the ledger: the same streams,
  growth, fees, between rule, shortfalls and rounding. Each month draws one
  log-return, normal and independent of every other month, with mean
  ln(1 + r)/12 - v^2/24 and standard deviation v/sqrt(12), where r is the
  goal's effective rate a year in force (a rate schedule shifts the mean) and
  v its volatility. So the expected growth over a year is exactly 1 + r, and
  the median grows by (1 + r)*e^(-v^2/2) a year. An interest period takes the
  draws of the months it covers, in proportion to how much of each it covers
  (a monthly credit one month's, a quarterly credit three months', a daily
  credit its share of its month): its rate is (1 + j)*e^d - 1, with j its
  fixed rate and d those draws less ln(1 + r)/12 a month. With volatility 0
  every path is the ledger.
  inflation_volatility makes inflation random the same way (mean
  ln(1 + inflation)/12 - v^2/24 a month, independent of returns). It changes
  only what follows inflation: a target in today's money, amounts in today's
  money, and streams that grow with inflation; rates and fixed amounts stay.
  A path meets the target when its balance at the end of the deadline month is
  at least its target. Percentile q of N paths is the value of rank ceil(q*N)
  from the lowest. The same --seed (default 1) and --paths give the same
  results on every run and on any number of processors.

LIMITS
  a file of at most 1 MiB, 100 goals, 50 streams and 1,000 one-time amounts a
  goal, 200 rate steps; dates within 150 years of the start; amounts up to
  1,000,000,000,000; rates from -99% to 100% a year effective; fees up to 20%;
  inflation from -50% to 50%.

EXAMPLE
  cairn: 1
  start: 2027-01
  inflation: 2.5%
  goals:
    - name: Emergency fund
      balance: 2,500
      rate: 4.0% compounded daily
      target: 15,000
      by: 2029-06
      deposits:
        - name: paycheck
          amount: 150
          every: 2 weeks

cairn is a planning aid: its results are estimates, not financial, tax or
investment advice.
`
