package plan

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// ParsePercent parses a percentage written with a percent sign, "12%" or
// "12.5 %", and returns it as a fraction (0.12).
func ParsePercent(s string) (float64, error) {
	t := strings.TrimSpace(s)
	num, ok := strings.CutSuffix(t, "%")
	num = strings.TrimSpace(num)
	x, err := strconv.ParseFloat(num, 64)
	if !ok || err != nil || num == "" || strings.ContainsAny(num, "eExXpP_") || math.IsNaN(x) || math.IsInf(x, 0) {
		return 0, fmt.Errorf("invalid percentage %q (want a number and a percent sign, such as 12%%)", s)
	}
	return x / 100, nil
}

// ParseVolatility parses a volatility a year, "15%", within 0% and
// [MaxVolatilityPercent].
func ParseVolatility(s string) (float64, error) {
	x, err := ParsePercent(s)
	if err != nil {
		return 0, err
	}
	if x < 0 || x > MaxVolatilityPercent/100.0 {
		return 0, fmt.Errorf("volatility %q is out of range (want 0%% to %d%% a year)", s, MaxVolatilityPercent)
	}
	return x, nil
}

// ParseTaxRate parses a flat tax rate, "25%", from 0% up to but not
// including 100% (an amount net of a 100% tax has no gross).
func ParseTaxRate(s string) (float64, error) {
	x, err := ParsePercent(s)
	if err != nil {
		return 0, err
	}
	if x < 0 || x >= 1 {
		return 0, fmt.Errorf("tax rate %q is out of range (want 0%% or more and below 100%%)", s)
	}
	return x, nil
}
