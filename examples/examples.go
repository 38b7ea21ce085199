// Package examples holds cairn's example goals files, embedded so that
// `cairn init` can write one. Every file here is parsed, projected and solved
// by the plan package's tests.
package examples

import _ "embed"

// Household is examples/household.yaml: an invented household with an
// emergency fund, a home deposit, education savings and retirement.
//
//go:embed household.yaml
var Household []byte

// Taxes is examples/taxes.yaml: three accounts taxed differently (as they
// grow, on the way out, never again), with scenarios that put the same
// saving in each.
//
//go:embed taxes.yaml
var Taxes []byte

// Retirement is examples/retirement.yaml: retirement income with a pension,
// part-time work and a bequest, and no target (the capital it needs is the
// answer).
//
//go:embed retirement.yaml
var Retirement []byte

// Budget is examples/budget.yaml: an invented young couple with one budget
// from every paycheck shared by three goals in priority order.
//
//go:embed budget.yaml
var Budget []byte
