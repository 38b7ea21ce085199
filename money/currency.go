package money

import (
	"fmt"
	"slices"
	"strings"
)

// A Currency is an ISO 4217 currency as cairn displays it: its code, the
// symbol written before amounts and its number of decimal places (its minor
// unit). cairn never converts between currencies; the code is for display
// and for the places to which postings are rounded.
type Currency struct {
	Code   string
	Symbol string
	Places int
}

var currencies = map[string]Currency{
	"USD": {"USD", "$", 2},
	"EUR": {"EUR", "€", 2},
	"GBP": {"GBP", "£", 2},
	"JPY": {"JPY", "¥", 0},
	"CAD": {"CAD", "CA$", 2},
	"AUD": {"AUD", "A$", 2},
	"NZD": {"NZD", "NZ$", 2},
	"CHF": {"CHF", "CHF ", 2},
	"SEK": {"SEK", "SEK ", 2},
	"NOK": {"NOK", "NOK ", 2},
	"DKK": {"DKK", "DKK ", 2},
	"INR": {"INR", "₹", 2},
	"CNY": {"CNY", "CN¥", 2},
	"KRW": {"KRW", "₩", 0},
	"MXN": {"MXN", "MX$", 2},
	"BRL": {"BRL", "R$", 2},
	"ZAR": {"ZAR", "R ", 2},
	"SGD": {"SGD", "S$", 2},
	"HKD": {"HKD", "HK$", 2},
	"PLN": {"PLN", "PLN ", 2},
	"ISK": {"ISK", "ISK ", 0},
	"KWD": {"KWD", "KWD ", 3},
	"BHD": {"BHD", "BHD ", 3},
}

// USD is the US dollar, the default currency.
var USD = currencies["USD"]

// LookupCurrency returns the currency with the given ISO 4217 code
// (case-insensitive). Unknown codes are an error that quotes the input.
func LookupCurrency(code string) (Currency, error) {
	c, ok := currencies[strings.ToUpper(strings.TrimSpace(code))]
	if !ok {
		return Currency{}, fmt.Errorf("unknown currency %s (want an ISO 4217 code such as USD, EUR, GBP or JPY)", Quote(code))
	}
	return c, nil
}

// CurrencyCodes returns the ISO 4217 codes [LookupCurrency] knows, sorted.
func CurrencyCodes() []string {
	out := make([]string, 0, len(currencies))
	for c := range currencies {
		out = append(out, c)
	}
	slices.Sort(out)
	return out
}
