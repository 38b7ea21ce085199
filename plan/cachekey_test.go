package plan

import (
	"fmt"
	"reflect"
	"testing"

	"cairn/money"
	"cairn/plan/internal/engine"
)

// keyPlans are plans that use every key the model has: rate steps, a fee,
// inflation, deposits and withdrawals (growing, in today's money, bounded),
// one-time amounts in and out, a tax on growth.
var keyPlans = []string{`cairn: 1
start: 2027-01
inflation: 2.5%
goals:
  - name: g
    balance: 5000
    rate:
      - 5% compounded daily
      - {from: 2030-01, rate: 3% compounded daily}
    fee: 0.5%
    between: simple
    target: 90000
    by: 2036-12
    leave: 100
    tax: as-it-grows
    tax_rate: 25%
    deposits:
      - {amount: 400 today, every: month, timing: start, from: 2027-03, until: 2033-12, grow: 2%}
    withdrawals:
      - {amount: 250, every: quarter, from: 2031-01, until: 2036-12, grow: inflation}
    once:
      - {amount: 3000, on: 2028-06}
      - {amount: -1500, on: 2034-02}
`, `cairn: 1
start: 2027-01
goals:
  - name: g
    balance: 100
    rate: 4% compounded monthly
    deposits:
      - {amount: 75, every: 2 weeks, until: 2031-06}
      - {amount: 20 today, every: month, grow: inflation}
`}

// mutations returns changed copies of v, one per change tried: a field of
// each kind the model uses, changed in a way that keeps the plan valid.
func mutations(v reflect.Value) []reflect.Value {
	var out []reflect.Value
	add := func(x any) { out = append(out, reflect.ValueOf(x).Convert(v.Type())) }
	switch x := v.Interface().(type) {
	case money.Amount:
		add(x.Add(money.Cents(123)))
		add(money.Zero)
	case money.Rate:
		add(money.ForceRate(x.Force() + 0.01))
		r, _ := money.ParseRate("6% compounded quarterly")
		add(r)
	case money.Frequency:
		if x == money.Monthly {
			add(money.Quarterly)
		} else {
			add(money.Monthly)
		}
	case money.Currency:
		add(money.Currency{Code: "XYZ", Symbol: "X", Places: 3})
	case money.Rounding:
		add(1 - x)
	case Month:
		add(x + 1)
	case Between:
		add((x + 1) % 3)
	case Timing:
		add(1 - x)
	default:
		switch v.Kind() {
		case reflect.Bool:
			add(!v.Bool())
		case reflect.String:
			add(v.String() + "x")
		case reflect.Float64:
			add(v.Float()*1.5 + 0.01)
		case reflect.Int:
			add(v.Int() + 1)
		}
	}
	return out
}

// Every field of Plan, Goal, Stream, Once (and RateStep, within a goal)
// either changes the schedule cache's key or does not change the answer: a
// ledger walked on the schedule cached for the unchanged plan equals one
// walked on a schedule compiled afresh for the changed plan. Fields are
// found by reflection, so one added later is checked without a change here.
// Check values: the ledger of the fresh compile (the model's own answer).
func TestScheduleKeyIsComplete(t *testing.T) {
	types := map[reflect.Type]bool{}
	for i, src := range keyPlans {
		p, err := Parse(fmt.Sprintf("key%d.yaml", i), []byte(src), 0)
		if err != nil {
			t.Fatal(err)
		}
		// each change: a path to a field, applied to a clone
		type change struct {
			name  string
			apply func(q *Plan)
		}
		var changes []change
		var visit func(name string, get func(q *Plan) reflect.Value, typ reflect.Type)
		visit = func(name string, get func(q *Plan) reflect.Value, typ reflect.Type) {
			types[typ] = true
			for f := range typ.NumField() {
				fd := typ.Field(f)
				if !fd.IsExported() {
					continue
				}
				field := func(q *Plan) reflect.Value { return get(q).Field(f) }
				fv := field(p)
				fname := name + "." + fd.Name
				switch {
				case fv.Kind() == reflect.Slice && fv.Type().Elem().Kind() == reflect.Pointer && fv.Type().Elem().Elem().Kind() == reflect.Struct:
					for k := range fv.Len() {
						visit(fmt.Sprintf("%s[%d]", fname, k), func(q *Plan) reflect.Value { return field(q).Index(k).Elem() }, fv.Type().Elem().Elem())
					}
				case fv.Kind() == reflect.Slice && fv.Type().Elem().Kind() == reflect.Struct && !isValue(fv.Type().Elem()):
					for k := range fv.Len() {
						visit(fmt.Sprintf("%s[%d]", fname, k), func(q *Plan) reflect.Value { return field(q).Index(k) }, fv.Type().Elem())
					}
				default:
					for m, mv := range mutations(fv) {
						changes = append(changes, change{fmt.Sprintf("%s #%d", fname, m), func(q *Plan) { field(q).Set(mv) }})
					}
				}
			}
		}
		visit("Plan", func(q *Plan) reflect.Value { return reflect.ValueOf(q).Elem() }, reflect.TypeOf(Plan{}))
		for _, c := range changes {
			q := p.Clone()
			c.apply(q)
			g0, g := p.Goals[0], q.Goals[0]
			end := Horizon(p, g0)
			before, after := goalShape(p, g0, end), goalShape(q, g, end)
			cache := new(engine.Cache)
			cache.Compile(&before)
			q.cache = cache
			cached := compile(q, g, end).ledger(compile(q, g, end).defaultParams())
			q.cache = nil
			fresh := compile(q, g, end).ledger(compile(q, g, end).defaultParams())
			if engine.Key(&before) != engine.Key(&after) {
				continue
			}
			if !sameLedger(cached, fresh) {
				t.Errorf("plan %d: %s leaves the schedule key unchanged but changes the ledger (closing %s cached, %s fresh)", i, c.name, cached.Closing, fresh.Closing)
			}
		}
	}
	for _, typ := range []reflect.Type{reflect.TypeOf(Plan{}), reflect.TypeOf(Goal{}), reflect.TypeOf(Stream{}), reflect.TypeOf(Once{})} {
		if !types[typ] {
			t.Errorf("no field of %v was changed: the plans above must hold one", typ)
		}
	}
}

// isValue reports whether a struct type is a value the mutations change
// whole (money's types), not one whose fields are visited.
func isValue(t reflect.Type) bool { return t.PkgPath() == reflect.TypeOf(money.Zero).PkgPath() }

func sameLedger(a, b *Ledger) bool {
	if a.Closing.Cmp(b.Closing) != 0 || len(a.Entries()) != len(b.Entries()) {
		return false
	}
	for i, e := range a.Entries() {
		f := b.Entries()[i]
		if e.Tick != f.Tick || e.Kind != f.Kind || e.Source != f.Source || e.Amount.Cmp(f.Amount) != 0 || e.Balance.Cmp(f.Balance) != 0 || e.Short.Cmp(f.Short) != 0 {
			return false
		}
	}
	return true
}
