package plan

import (
	"fmt"
	"strconv"
	"strings"
	"time"

	"cairn/money"
)

// A Month is a calendar month, counted from January of year 0. Plans are
// shown by month; the zero Month is not a valid plan date.
type Month int

// MonthOf returns the month m of year y.
func MonthOf(y int, m time.Month) Month { return Month(y*12 + int(m) - 1) }

// ParseMonth parses a month written YYYY-MM ("2027-01").
func ParseMonth(s string) (Month, error) {
	t := strings.TrimSpace(s)
	ys, ms, ok := strings.Cut(t, "-")
	if !ok || len(ys) != 4 || len(ms) != 2 {
		return 0, fmt.Errorf("invalid month %s (want YYYY-MM, such as 2027-01)", money.Quote(s))
	}
	y, err1 := strconv.Atoi(ys)
	m, err2 := strconv.Atoi(ms)
	if err1 != nil || err2 != nil || ys[0] == '-' || ys[0] == '+' || ms[0] == '-' || ms[0] == '+' {
		return 0, fmt.Errorf("invalid month %s (want YYYY-MM, such as 2027-01)", money.Quote(s))
	}
	if m < 1 || m > 12 {
		return 0, fmt.Errorf("invalid month %s: month out of range (want 01 to 12)", money.Quote(s))
	}
	if y < firstYear || y > lastYear {
		return 0, fmt.Errorf("invalid month %s: year out of range (want %d to %d)", money.Quote(s), firstYear, lastYear)
	}
	return MonthOf(y, time.Month(m)), nil
}

// The years a goals file may name.
const firstYear, lastYear = 1900, 2999

// Year returns the month's year.
func (m Month) Year() int { return int(m) / 12 }

// Calendar returns the month of the year (January = 1).
func (m Month) Calendar() time.Month { return time.Month(int(m)%12 + 1) }

// String returns the month as YYYY-MM.
func (m Month) String() string { return fmt.Sprintf("%04d-%02d", m.Year(), int(m.Calendar())) }

// Add returns the month n months after m.
func (m Month) Add(n int) Month { return m + Month(n) }
