package render

import (
	"bytes"
	"strings"
	"testing"

	"cairn/money"
	"cairn/plan"
)

var usd = money.Currency{Code: "USD", Places: 2}

func amount(t *testing.T, s string) money.Amount {
	t.Helper()
	a, err := money.ParseAmount(s)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

// TestCell checks that each kind of cell is shown and written to CSV from
// its value. The expected strings are cairn's own output conventions
// (grouped amounts shown, plain in CSV; rates as percent with four places in
// CSV): common practice, no source.
func TestCell(t *testing.T) {
	tests := []struct {
		name             string
		cell             Cell
		text, whole, csv string
	}{
		{"text", Text("paycheck, every 2 weeks"), "paycheck, every 2 weeks", "paycheck, every 2 weeks", "paycheck, every 2 weeks"},
		{"label", Label("short by 682.98", "short"), "short by 682.98", "short by 682.98", "short"},
		{"none", None(), "-", "-", ""},
		{"amount", Amount(amount(t, "1234567.891"), usd), "1,234,567.89", "1,234,568", "1234567.89"},
		{"amount then words", Amount(amount(t, "160"), usd).Then(" every month"), "160.00 every month", "160 every month", "160.00"},
		{"negative amount", Amount(amount(t, "-2500"), usd), "-2,500.00", "-2,500", "-2500.00"},
		{"rate", Rate(0.065), "6.5%", "6.5%", "6.5000"},
		// the machine form keeps every digit shown (issue 17: one fact, one reading)
		{"small rate", Rate(0.0001095890), "0.010959%", "0.010959%", "0.010959"},
		{"zero rate", Rate(0), "0%", "0%", "0.0000"},
		{"share", Share(0.234, 1), "23.4%", "23.4%", "23.4000"},
		{"share two places", Share(0.9, 2), "90.00%", "90.00%", "90.0000"},
		{"exact rate", ExactRate(0.01), "1%", "1%", "1.000000"},
		{"month", Month(plan.MonthOf(2029, 6)), "2029-06", "2029-06", "2029-06"},
		{"count", Count(12000).Then(" of 20,000"), "12,000 of 20,000", "12,000 of 20,000", "12000"},
		{"int", Int(1560), "1560", "1560", "1560"},
		{"bool", Bool(true), "true", "true", "true"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := tt.cell.text(false); got != tt.text {
				t.Errorf("text = %q, want %q", got, tt.text)
			}
			if got := tt.cell.text(true); got != tt.whole {
				t.Errorf("text in whole units = %q, want %q", got, tt.whole)
			}
			if got := tt.cell.Plain(); got != tt.csv {
				t.Errorf("Plain() = %q, want %q", got, tt.csv)
			}
		})
	}
}

// doc is a small document with a facts block, a table with a hidden column
// and a totals row, a preformatted block, a remark, the note and a caution.
func doc(t *testing.T) *Doc {
	facts := &Facts{Title: "Details"}
	facts.Add("amount", Amount(amount(t, "1500"), usd))
	tbl := &Table{Cols: []Column{{Head: "year", Key: "year"}, {Head: "secret", Key: "secret", Hidden: true}, {Head: "closing", Key: "closing", Numeric: true}}}
	tbl.Add(Text("2027"), Text("kept in csv"), Amount(amount(t, "1000"), usd))
	tbl.Total = []Cell{Text("total"), Text(""), Amount(amount(t, "1000"), usd)}
	return &Doc{
		Lead:    []string{"The answer."},
		Blocks:  []Block{facts, tbl, Pre{Text: "##\n"}},
		After:   []string{"A remark."},
		Notices: []Notice{{Kind: Note, Key: "note", Text: "the note"}, {Kind: Caution, Key: "caution_x", Text: "the caution"}},
		Data:    map[string]any{"answer": "1500.00"},
		CSV:     tbl,
	}
}

// TestDoc_Write checks where each slot goes in each format: the chart only in
// text, hidden columns only in CSV, the notices in the footer, under their
// keys in JSON and on standard error with CSV. The table layout itself is
// tablewriter's, pinned by the command scripts' golden files.
func TestDoc_Write(t *testing.T) {
	tests := []struct {
		format     Format
		inOrder    []string // each must appear, in this order
		absent     []string
		wantStderr string
	}{
		{FormatText, []string{"The answer.\n\nDetails\nitem", "amount  1,500.00\n\nyear", "total  1,000.00\n\n##\n\nA remark.\n\nNote: the note\nCaution: the caution\n"},
			[]string{"secret", "kept in csv"}, ""},
		{FormatMarkdown, []string{"The answer.\n\n**Details**\n\n| item", "| amount | 1,500.00 |\n\n| year", "| total | 1,000.00 |\n\nA remark.\n\n*Note: the note*\n\n*Caution: the caution*\n"},
			[]string{"secret", "kept in csv", "##"}, ""},
		{FormatCSV, []string{"year,secret,closing\n2027,kept in csv,1000.00\ntotal,,1000.00\n"}, []string{"Details", "##", "note"},
			"cairn: note: the note\ncairn: caution: the caution\n"},
		{FormatJSON, []string{"{\n  \"answer\": \"1500.00\",\n  \"cairn_json\": 1,\n  \"caution_x\": \"the caution\",\n  \"note\": \"the note\"\n}\n"}, []string{"##", "Details"}, ""},
	}
	for _, tt := range tests {
		var out, errw bytes.Buffer
		if err := doc(t).Write(&out, &errw, tt.format); err != nil {
			t.Fatal(err)
		}
		rest := out.String()
		for _, w := range tt.inOrder {
			i := strings.Index(rest, w)
			if i < 0 {
				t.Errorf("format %d: %q missing or out of order in\n%s", tt.format, w, out.String())
				break
			}
			rest = rest[i+len(w):]
		}
		for _, w := range tt.absent {
			if strings.Contains(out.String(), w) {
				t.Errorf("format %d: %q should be left out of\n%s", tt.format, w, out.String())
			}
		}
		if errw.String() != tt.wantStderr {
			t.Errorf("format %d: stderr %q, want %q", tt.format, errw.String(), tt.wantStderr)
		}
	}
}

// TestTable_Width checks the measure that decides whole units: the widest
// cell of each shown column, two spaces between columns, hidden columns left
// out.
func TestTable_Width(t *testing.T) {
	tbl := doc(t).Blocks[1].(*Table)
	// "total" (5) + 2 + "1,000.00" (8); the hidden column does not count
	if got, want := tbl.Width(), 15; got != want {
		t.Errorf("Width() = %d, want %d", got, want)
	}
}

// TestPage_Write checks that the report shows a table's Long heads, every
// place although the table is in whole units, and a caution with its class.
func TestPage_Write(t *testing.T) {
	tbl := &Table{Cols: []Column{{Head: "year"}, {Head: "today", Long: "in today’s money", Numeric: true}}, WholeUnits: true}
	tbl.Add(Text("2027"), Amount(amount(t, "1234.5"), usd))
	p := &Page{Title: "t", Status: tbl, Notices: []Notice{{Kind: Note, Text: "n"}, {Kind: Caution, Text: "c"}}}
	var b bytes.Buffer
	if err := p.Write(&b); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`<th scope="col" class="num">in today’s money</th>`, `<td class="num">1,234.50</td>`,
		`<p><strong>Note:</strong> n</p>`, `<p class="caution"><strong>Caution:</strong> c</p>`} {
		if !strings.Contains(b.String(), want) {
			t.Errorf("the page lacks %s", want)
		}
	}
}

// TestBelow checks that a column marked Below goes, in text, on lines of
// its own under its row, indented and wrapped to LineWidth without
// breaking a parenthesised group, and stays a column in CSV and Markdown.
func TestBelow(t *testing.T) {
	long := "× (F/A, 0.44717%, 12) = 12.299576 × (F/A, 3%, 5.5%, 13) = 21.489607 × (F/P, 0.44717%, 8) = 1.036339"
	tb := &Table{Cols: []Column{{Head: "term", Key: "term"}, {Head: "factors", Key: "factors", Below: true}, {Head: "value", Key: "value", Numeric: true}}}
	tb.Add(Text("deposits"), Text(long), Text("32,248.34"))
	tb.Add(Text("gift"), Text(""), Text("1,970.29"))
	var text bytes.Buffer
	if err := tb.writeGrid(&text, false); err != nil {
		t.Fatal(err)
	}
	want := "term          value\n" +
		"---------------------\n" + // the rule runs under the last column's padding too
		"deposits  32,248.34\n" +
		"  × (F/A, 0.44717%, 12) = 12.299576 × (F/A, 3%, 5.5%, 13) = 21.489607 ×\n" +
		"  (F/P, 0.44717%, 8) = 1.036339\n" +
		"gift       1,970.29\n"
	if text.String() != want {
		t.Errorf("text:\n%s\nwant:\n%s", text.String(), want)
	}
	if w := tb.Width(); w != len("deposits  32,248.34") {
		t.Errorf("Width() = %d, want the shown columns' %d", w, len("deposits  32,248.34"))
	}
	var md bytes.Buffer
	if err := tb.writeGrid(&md, true); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(md.String(), "factors") || !strings.Contains(md.String(), "(F/P, 0.44717%, 8)") {
		t.Errorf("markdown lacks the factors column:\n%s", md.String())
	}
	d := &Doc{Blocks: []Block{tb}}
	var csv, stderr bytes.Buffer
	if err := d.writeCSV(&csv, &stderr); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(csv.String(), "term,factors,value\n") {
		t.Errorf("csv:\n%s", csv.String())
	}
}
