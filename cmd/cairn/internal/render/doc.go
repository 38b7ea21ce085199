// Package render holds cairn's output document and one renderer per format.
//
// A [Doc] is one command's answer before it has a format: lead sentences,
// blocks (tables, facts, preformatted text), closing remarks, notices (the
// note every result carries, each caution) and the JSON form. Table cells are
// typed ([Amount], [Rate], [Month], [Count], [Text] …), so the plain text and
// the CSV form of a cell both come from its value. The renderers are [Doc.Write]
// for text, Markdown, CSV and JSON, and [Page.Write] for the HTML report; no
// command edits rendered text.
package render

import (
	"math"
	"strconv"
	"strings"

	"cairn/money"
	"cairn/plan"
)

// LineWidth is the width plain-text output is wrapped and fitted to.
const LineWidth = 80

// A Doc is one command's output before it is put into a format.
type Doc struct {
	Lead    []string       // the answer first, one sentence a line
	Blocks  []Block        // tables, facts and preformatted text, in order
	After   []string       // closing remarks
	Notices []Notice       // the note, then each caution
	Data    map[string]any // the JSON form, without the notices
	CSV     Block          // the block written as CSV; nil for the first table or facts
}

// Tables returns the tables of d in order.
func (d *Doc) Tables() []*Table {
	var ts []*Table
	for _, b := range d.Blocks {
		if t, ok := b.(*Table); ok {
			ts = append(ts, t)
		}
	}
	return ts
}

// A Block is a part of a document between its lead and its closing remarks:
// a [*Table], [*Facts] or [Pre].
type Block interface{ block() }

// A Column is one column of a table.
type Column struct {
	Head    string // in text and Markdown
	Long    string // in the report, where there is room; Head when empty
	Key     string // in CSV
	Numeric bool   // right-aligned
	Hidden  bool   // left out of text, Markdown and the report; kept in CSV
	// Below puts the column's cell, in plain text, on lines of its own
	// under its row, indented and wrapped to [LineWidth], so that a long
	// explanation does not widen the table; a column as any other in the
	// other formats.
	Below bool
}

// A Table is a grid of typed cells with an optional totals row.
type Table struct {
	Title string
	Cols  []Column
	Rows  [][]Cell
	Total []Cell // nil for none
	// WholeUnits shows amounts in whole units in text and Markdown, for a
	// table that would not fit in [LineWidth] columns with cents; CSV, JSON
	// and the report keep every place.
	WholeUnits bool
}

// Add appends a row.
func (t *Table) Add(cells ...Cell) { t.Rows = append(t.Rows, cells) }

// Width measures t for fitting in [LineWidth]: the widest head or cell of
// each shown column, amounts at their places, two spaces between columns.
func (t *Table) Width() int {
	total := 0
	for i, c := range t.Cols {
		if c.Hidden || c.Below {
			continue
		}
		w := len([]rune(c.Head))
		for _, r := range t.rowsAndTotal() {
			w = max(w, len([]rune(r[i].text(false))))
		}
		total += w + 2
	}
	return total - 2
}

func (t *Table) rowsAndTotal() [][]Cell {
	if t.Total == nil {
		return t.Rows
	}
	return append(t.Rows[:len(t.Rows):len(t.Rows)], t.Total)
}

// A Fact is one item and its value.
type Fact struct{ Item, Value Cell }

// Facts are items with their values: a two-column table in text, Markdown
// and CSV (item, value), a definition list in the report.
type Facts struct {
	Title string
	Items []Fact
}

// Add appends a fact.
func (f *Facts) Add(item string, value Cell) { f.Items = append(f.Items, Fact{Text(item), value}) }

func (f *Facts) table() *Table {
	t := &Table{Title: f.Title, Cols: []Column{{Head: "item", Key: "item"}, {Head: "value", Key: "value", Numeric: true}}}
	for _, it := range f.Items {
		t.Add(it.Item, it.Value)
	}
	return t
}

// Pre is preformatted text for the terminal, such as a chart drawn in
// characters. The text renderer prints it as it is; the other formats leave
// it out.
type Pre struct{ Text string }

func (*Table) block() {}
func (*Facts) block() {}
func (Pre) block()    {}

// A NoticeKind says what a notice is.
type NoticeKind int

const (
	Note    NoticeKind = iota // the note every result carries
	Caution                   // a caution some results carry
)

// A Notice is the note or a caution: in the footer of text and Markdown,
// under Key in JSON, on standard error with CSV.
type Notice struct {
	Kind NoticeKind
	Key  string // its JSON key
	Text string
}

// Label is the notice's word: "Note" or "Caution".
func (n Notice) Label() string {
	if n.Kind == Note {
		return "Note"
	}
	return "Caution"
}

// A cellKind says how a cell's value is written.
type cellKind int

const (
	textCell cellKind = iota
	amountCell
	rateCell
	shareCell
	exactRateCell
	monthCell
	countCell
	intCell
	boolCell
)

// A Cell is one typed value of a table. Its plain text and its CSV form are
// both written from the value.
type Cell struct {
	kind   cellKind
	s      string // a text cell's text
	csv    string // a label's CSV form
	label  bool
	then   string // words shown after the value in text, Markdown and the report
	a      money.Amount
	cur    money.Currency
	x      float64
	places int
	n      int
	m      plan.Month
	b      bool
}

// Text is words, the same in every format.
func Text(s string) Cell { return Cell{kind: textCell, s: s} }

// Label is words shown one way and written to CSV another: "short by 682.98"
// shown, "short" in CSV.
func Label(shown, csv string) Cell { return Cell{kind: textCell, s: shown, csv: csv, label: true} }

// None is a missing value: "-" shown, empty in CSV.
func None() Cell { return Label("-", "") }

// Amount is an amount of currency c: grouped with c's places in text
// ("1,500.00"), plain in CSV ("1500.00").
func Amount(a money.Amount, c money.Currency) Cell { return Cell{kind: amountCell, a: a, cur: c} }

// Rate is an annual rate or a rate per period, as a fraction: "6.5%" shown
// (see [money.RateText]), "6.5000" in CSV ([RatePlain]: the same digits).
func Rate(x float64) Cell { return Cell{kind: rateCell, x: x} }

// Share is a share of paths, as a fraction: "23.4%" shown with places
// decimals, "23.4000" in CSV.
func Share(x float64, places int) Cell { return Cell{kind: shareCell, x: x, places: places} }

// ExactRate is a rate converted between forms: six places both ways, "1%"
// shown ([money.Percent]), "1.000000" in CSV.
func ExactRate(x float64) Cell { return Cell{kind: exactRateCell, x: x} }

// Month is a calendar month, "2029-06" in every format.
func Month(m plan.Month) Cell { return Cell{kind: monthCell, m: m} }

// Count is a number of things: grouped in text ("2,000"), plain in CSV.
func Count(n int) Cell { return Cell{kind: countCell, n: n} }

// Int is a whole number, plain in every format.
func Int(n int) Cell { return Cell{kind: intCell, n: n} }

// Bool is true or false, in every format.
func Bool(b bool) Cell { return Cell{kind: boolCell, b: b} }

// Then returns c with words shown after its value ("160.00" then " every
// month"); CSV keeps the value alone.
func (c Cell) Then(words string) Cell {
	c.then += words
	return c
}

// Grouped is n with thousands separators: "12,000".
func Grouped(n int) string { return money.Units(int64(n)).Format(money.Currency{Places: 0}, false) }

// RatePlain is a rate, as a fraction, in its machine form: a percent
// without the sign, with every digit text shows ([money.RateText]: four
// places, six below 1%), trailing zeros kept: 0.065 is "6.5000", 0.00173216
// is "0.173216". CSV and JSON then read as the table does.
func RatePlain(x float64) string {
	places := 4
	if x != 0 && math.Abs(x) < 0.01 {
		places = 6
	}
	return fixed(x*100, places)
}

// fixed is x with places decimals, and no minus sign on a figure that
// rounds to zero (a rate of −0.00000001% is written 0.000000, not
// −0.000000).
func fixed(x float64, places int) string {
	s := strconv.FormatFloat(x, 'f', places, 64)
	if strings.Trim(s, "-0.") == "" {
		return strings.TrimPrefix(s, "-")
	}
	return s
}

// String is c as text shows it, amounts with every place.
func (c Cell) String() string { return c.text(false) }

// text is c as shown; whole shows amounts in whole units.
func (c Cell) text(whole bool) string {
	var s string
	switch c.kind {
	case textCell:
		s = c.s
	case amountCell:
		cur := c.cur
		if whole {
			cur.Places = 0
		}
		s = c.a.Format(cur, false)
	case rateCell:
		s = money.RateText(c.x)
	case shareCell:
		s = fixed(c.x*100, c.places) + "%"
	case exactRateCell:
		s = money.Percent(c.x, 6)
	case monthCell:
		s = c.m.String()
	case countCell:
		s = Grouped(c.n)
	case intCell:
		s = strconv.Itoa(c.n)
	case boolCell:
		s = strconv.FormatBool(c.b)
	}
	return s + c.then
}

// Plain is c as written to CSV and JSON.
func (c Cell) Plain() string {
	switch c.kind {
	case textCell:
		if c.label {
			return c.csv
		}
		return c.s
	case amountCell:
		return c.a.Plain(c.cur.Places)
	case rateCell:
		return RatePlain(c.x)
	case shareCell:
		return fixed(c.x*100, 4)
	case exactRateCell:
		return fixed(c.x*100, 6)
	case countCell, intCell:
		return strconv.Itoa(c.n)
	case monthCell:
		return c.m.String()
	case boolCell:
		return strconv.FormatBool(c.b)
	}
	return ""
}
