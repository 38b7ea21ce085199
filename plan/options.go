package plan

import "fmt"

// Ranges of the options a command passes to plan: how many simulated paths,
// what share of them must succeed. Commands ask here rather than decide.

// CheckPaths reports an error if n simulated paths is outside [MinPaths]
// to [MaxPaths].
func CheckPaths(n int) error {
	if n < MinPaths || n > MaxPaths {
		return fmt.Errorf("%d is out of range (want %d to %d)", n, MinPaths, MaxPaths)
	}
	return nil
}

// ParseSuccess parses a success level, the share of simulated paths that
// must meet the target: a percentage more than 0% and at most 100%, returned
// as a fraction.
func ParseSuccess(s string) (float64, error) {
	x, err := ParsePercent(s)
	if err != nil {
		return 0, err
	}
	if !(x > 0 && x <= 1) {
		return 0, fmt.Errorf("%q is out of range (want more than 0%% and at most 100%%)", s)
	}
	return x, nil
}
