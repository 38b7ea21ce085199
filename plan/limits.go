package plan

import "cairn/money"

// Limits on goals files. Files beyond them are refused with a message, not
// processed slowly. Each limit has one name; messages, checks and the help
// text all read it from here.
const (
	MaxFileSize      = 1 << 20 // bytes
	MaxGoals         = 100
	MaxStreams       = 50 // deposits plus withdrawals, per goal
	MaxOnce          = 1000
	MaxActuals       = 2000 // actual balances a goal, from the file and its CSV
	MaxRateSteps     = 200
	HorizonYears     = 150 // no date may lie more than this after the start
	MaxAmountUnits   = 1_000_000_000_000
	MaxBalanceUnits  = 10_000_000_000_000 // largest balance or target computed to the cent
	MaxNameLength    = 100                // characters in a goal's, stream's or one-time amount's name
	MaxRatePercent   = 100                // effective a year
	MinRatePercent   = -99                // effective a year
	MaxFeePercent    = 20
	MaxInflationPct  = 50
	MaxGrowthPercent = 50 // a stream's yearly rise or fall, effective
	MaxScenarios     = 50 // named scenarios in a file
	MaxPeople        = 10 // people in a file
	MaxChanges       = 50 // changes in one scenario
	MaxBudgetChanges = 50 // changes of the budget's amount
)

// amountLimit is [MaxAmountUnits] as messages write it, grouped in
// thousands: "1,000,000,000,000". Messages use this name, never the digits.
var amountLimit = money.Units(MaxAmountUnits).Format(money.Currency{Places: 0}, false)
