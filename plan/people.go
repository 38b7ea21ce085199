package plan

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"sync"

	"cairn/money"
)

// A Person is one of the household's people, named by a role or a first
// name the file chooses, with the month they were born: any month in the
// file may then be written as that person's age ("earner at 67" is earner's
// 67th birthday month), and output shows ages beside months.
type Person struct {
	Name string
	Born Month
}

// ageForm is a month written as a person's age: "earner at 67".
var ageForm = sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(`(?i)^\s*(\S.*?)\s+at\s+(\d{1,3})\s*$`) })

// MonthOf parses a month as the goals file writes it: YYYY-MM, or a
// person's age such as "earner at 67", the month of that birthday.
func (p *Plan) MonthOf(s string) (Month, error) {
	m, err := ParseMonth(s)
	if err == nil {
		return m, nil
	}
	sub := ageForm().FindStringSubmatch(s)
	if sub == nil {
		if len(p.People) > 0 {
			return 0, fmt.Errorf("%v, or an age such as %s at 67", err, p.People[0].Name)
		}
		return 0, err
	}
	who := p.Person(sub[1])
	if who == nil {
		var names []string
		for _, q := range p.People {
			names = append(names, money.Quote(q.Name))
		}
		if len(names) == 0 {
			return 0, fmt.Errorf("no person named %s (name the household's people under people:)", money.Quote(sub[1]))
		}
		return 0, fmt.Errorf("no person named %s (the people are %s)", money.Quote(sub[1]), strings.Join(names, ", "))
	}
	age, _ := strconv.Atoi(sub[2])
	if age > maxAge {
		return 0, fmt.Errorf("age %d of %s is past %d (want an age a person reaches)", age, who.Name, maxAge)
	}
	return who.Born.Add(12 * age), nil
}

// maxAge is the oldest age a month may be written by.
const maxAge = 120

// Person returns the person with the given name (case-insensitive), or nil.
func (p *Plan) Person(name string) *Person {
	for i := range p.People {
		if sameName(p.People[i].Name, name) {
			return &p.People[i]
		}
	}
	return nil
}

// AgeList gives the household's people's ages in month m, in file order,
// "earner/partner" and "66/63": a name and an age for each person born by
// month end (the last of a table's rows), "-" for one not yet born in m, so
// that every row's ages line up with the names; both "" when the file names
// no one born by then.
func (p *Plan) AgeList(m, end Month) (names, ages string) {
	var ns, as []string
	for _, q := range p.People {
		if end < q.Born {
			continue // not born by the end: not a column at all
		}
		age := "-" // not born yet at m
		if m >= q.Born {
			age = fmt.Sprint(int(m-q.Born) / 12)
		}
		ns, as = append(ns, q.Name), append(as, age)
	}
	return strings.Join(ns, "/"), strings.Join(as, "/")
}

// AgesAt says how old each of the household's people is in month m:
// "when earner is 88 and partner is 85", or "" when the file names no one.
func (p *Plan) AgesAt(m Month) string {
	var parts []string
	for _, q := range p.People {
		years := int(m-q.Born) / 12
		if m < q.Born {
			continue
		}
		parts = append(parts, fmt.Sprintf("%s is %d", q.Name, years))
	}
	switch len(parts) {
	case 0:
		return ""
	case 1:
		return "when " + parts[0]
	}
	return "when " + strings.Join(parts[:len(parts)-1], ", ") + " and " + parts[len(parts)-1]
}
