package plan

import "cairn/money"

// amountLimit is [MaxAmountUnits] as messages write it, grouped in
// thousands: "1,000,000,000,000". Messages use this name, never the digits.
var amountLimit = money.Units(MaxAmountUnits).Format(money.Currency{Places: 0}, false)
