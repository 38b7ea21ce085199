package plan

import (
	"errors"
	"fmt"
	"sort"
)

// A Position is a place in a goals file. Line and Column count from 1; a
// zero Line means the position is unknown.
type Position struct {
	File         string
	Line, Column int
}

// String returns the position as file:line:column, file:line, or file.
func (p Position) String() string {
	switch {
	case p.Line == 0:
		return p.File
	case p.Column == 0:
		return fmt.Sprintf("%s:%d", p.File, p.Line)
	}
	return fmt.Sprintf("%s:%d:%d", p.File, p.Line, p.Column)
}

// An Error is a problem at a position in a goals file.
type Error struct {
	Pos Position
	Msg string
}

func (e *Error) Error() string {
	if e.Pos.File == "" && e.Pos.Line == 0 {
		return e.Msg
	}
	return e.Pos.String() + ": " + e.Msg
}

// An ErrorList is every problem [Parse] found in a file, in file order.
type ErrorList []*Error

// MaxErrors is how many errors an ErrorList prints before "(and N more
// errors)".
const MaxErrors = 20

func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	s := ""
	for i, e := range l {
		if i == MaxErrors {
			return s + fmt.Sprintf("\n(and %d more errors)", len(l)-MaxErrors)
		}
		if i > 0 {
			s += "\n"
		}
		s += e.Error()
	}
	return s
}

// Sort orders the list by position.
func (l ErrorList) Sort() {
	sort.SliceStable(l, func(i, j int) bool {
		a, b := l[i].Pos, l[j].Pos
		if a.Line != b.Line {
			return a.Line < b.Line
		}
		return a.Column < b.Column
	})
}

// Err returns the list as an error, or nil if it is empty.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}

// A SolveError is returned by the solvers when the question has no answer:
// the goal cannot be reached, no rate in range meets it, the money never
// runs out. Reason says why in plain words.
type SolveError struct {
	Goal   string
	Reason string
}

func (e *SolveError) Error() string { return e.Goal + ": " + e.Reason }

// IsNoSolution reports whether err is (or wraps) a [SolveError].
func IsNoSolution(err error) bool {
	var se *SolveError
	return errors.As(err, &se)
}
