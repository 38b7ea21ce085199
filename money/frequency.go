package money

import (
	"fmt"
	"strings"
)

// A Frequency is how many times a year something happens: a deposit, a
// withdrawal or an interest credit. The zero value is not a frequency.
type Frequency int

// The frequencies, most frequent first. Continuous applies to compounding
// only.
const (
	Daily          Frequency = iota + 1 // 365 a year
	Weekly                              // 52 a year
	EveryTwoWeeks                       // 26 a year
	TwiceAMonth                         // 24 a year
	Monthly                             // 12 a year
	EveryTwoMonths                      // 6 a year
	Quarterly                           // 4 a year
	TwiceAYear                          // 2 a year
	Yearly                              // 1 a year
	Continuous                          // compounding only
)

var freqInfo = [...]struct {
	perYear   int
	noun, adj string
}{
	Daily:          {365, "day", "daily"},
	Weekly:         {52, "week", "weekly"},
	EveryTwoWeeks:  {26, "2 weeks", "every 2 weeks"},
	TwiceAMonth:    {24, "half month", "twice a month"},
	Monthly:        {12, "month", "monthly"},
	EveryTwoMonths: {6, "2 months", "every 2 months"},
	Quarterly:      {4, "quarter", "quarterly"},
	TwiceAYear:     {2, "half year", "twice a year"},
	Yearly:         {1, "year", "yearly"},
	Continuous:     {0, "continuous", "continuously"},
}

// Frequencies lists every frequency that payments can have, most frequent
// first (Continuous is not among them).
var Frequencies = []Frequency{Daily, Weekly, EveryTwoWeeks, TwiceAMonth, Monthly, EveryTwoMonths, Quarterly, TwiceAYear, Yearly}

func (f Frequency) valid() bool { return f >= Daily && f <= Continuous }

// PerYear returns how many times a year f happens: 365 for Daily, 26 for
// EveryTwoWeeks, 1 for Yearly. It returns 0 for Continuous.
func (f Frequency) PerYear() int {
	if !f.valid() {
		return 0
	}
	return freqInfo[f].perYear
}

// String returns the period as a noun phrase, as written after "every" in a
// goals file: "day", "2 weeks", "half month", "month", "quarter".
func (f Frequency) String() string {
	if !f.valid() {
		return fmt.Sprintf("%%!Frequency(%d)", int(f))
	}
	return freqInfo[f].noun
}

// Adjective returns the frequency as an adverb of time: "daily", "every 2
// weeks", "twice a month", "quarterly", "continuously".
func (f Frequency) Adjective() string {
	if !f.valid() {
		return f.String()
	}
	return freqInfo[f].adj
}

var freqWords = map[string]Frequency{
	"day": Daily, "daily": Daily, "every day": Daily, "a day": Daily, "per day": Daily,
	"week": Weekly, "weekly": Weekly, "every week": Weekly, "a week": Weekly, "per week": Weekly,
	"2 weeks": EveryTwoWeeks, "two weeks": EveryTwoWeeks, "every 2 weeks": EveryTwoWeeks,
	"every two weeks": EveryTwoWeeks, "fortnight": EveryTwoWeeks, "fortnightly": EveryTwoWeeks,
	"every fortnight": EveryTwoWeeks, "a fortnight": EveryTwoWeeks, "per fortnight": EveryTwoWeeks,
	"per 2 weeks": EveryTwoWeeks, "per two weeks": EveryTwoWeeks,
	"half month": TwiceAMonth, "half-month": TwiceAMonth, "twice a month": TwiceAMonth,
	"semimonthly": TwiceAMonth, "semi-monthly": TwiceAMonth, "per half month": TwiceAMonth,
	"month": Monthly, "monthly": Monthly, "every month": Monthly, "a month": Monthly, "per month": Monthly,
	"2 months": EveryTwoMonths, "two months": EveryTwoMonths, "every 2 months": EveryTwoMonths,
	"every two months": EveryTwoMonths, "per 2 months": EveryTwoMonths, "per two months": EveryTwoMonths,
	"quarter": Quarterly, "quarterly": Quarterly, "every quarter": Quarterly, "3 months": Quarterly,
	"every 3 months": Quarterly, "a quarter": Quarterly, "per quarter": Quarterly,
	"half year": TwiceAYear, "half-year": TwiceAYear, "twice a year": TwiceAYear,
	"semiannually": TwiceAYear, "semi-annually": TwiceAYear, "semiannual": TwiceAYear,
	"semi-annual": TwiceAYear, "6 months": TwiceAYear, "every 6 months": TwiceAYear,
	"half-yearly": TwiceAYear, "per half year": TwiceAYear,
	"year": Yearly, "yearly": Yearly, "annually": Yearly, "annual": Yearly, "every year": Yearly,
	"a year": Yearly, "per year": Yearly, "12 months": Yearly, "every 12 months": Yearly,
	"continuous": Continuous, "continuously": Continuous,
}

var ambiguousWords = map[string]string{
	"biweekly":    `"every 2 weeks" (26 a year) or "twice a month" (24 a year)`,
	"bi-weekly":   `"every 2 weeks" (26 a year) or "twice a month" (24 a year)`,
	"bimonthly":   `"every 2 months" (6 a year) or "twice a month" (24 a year)`,
	"bi-monthly":  `"every 2 months" (6 a year) or "twice a month" (24 a year)`,
	"biannually":  `"twice a year" (2 a year); every 2 years is not a frequency cairn has`,
	"biannual":    `"twice a year" (2 a year); every 2 years is not a frequency cairn has`,
	"bi-annually": `"twice a year" (2 a year); every 2 years is not a frequency cairn has`,
	"biennially":  `"twice a year" or "yearly"; every 2 years is not a frequency cairn has`,
}

// ParseFrequency parses a frequency written as a plain word or phrase:
// "daily", "week", "every 2 weeks", "fortnightly", "twice a month",
// "semimonthly", "monthly", "every 2 months", "quarterly", "twice a year",
// "semiannually", "yearly", "annually", "continuously". Case and extra spaces
// do not matter. Words with two meanings in common use, such as "biweekly"
// and "bimonthly", are refused with the two unambiguous spellings.
func ParseFrequency(s string) (Frequency, error) {
	key := strings.Join(strings.Fields(strings.ToLower(s)), " ")
	if f, ok := freqWords[key]; ok {
		return f, nil
	}
	if alt, ok := ambiguousWords[key]; ok {
		return 0, fmt.Errorf("ambiguous frequency %s (it means two different things; write %s)", Quote(s), alt)
	}
	return 0, fmt.Errorf("unknown frequency %s (want daily, weekly, every 2 weeks, twice a month, monthly, every 2 months, quarterly, twice a year or yearly)", Quote(s))
}

// FrequencyWords returns every word [ParseFrequency] accepts (in lower case,
// words one space apart) with the frequency it stands for, so that a schema
// of the goals file can list exactly what the parser reads.
func FrequencyWords() map[string]Frequency {
	out := make(map[string]Frequency, len(freqWords))
	for w, f := range freqWords {
		out[w] = f
	}
	return out
}
