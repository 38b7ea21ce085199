package render

import (
	"bytes"
	"math"
	"strings"
	"testing"
)

// TestCSV_FormulaCells checks that a text cell a spreadsheet would run as a
// formula is written with a leading single quote, and that numbers are not
// touched. Source: OWASP, "CSV Injection" (the characters =, +, -, @, tab
// and carriage return at the start of a cell; prefix such a cell with a
// single quote).
func TestCSV_FormulaCells(t *testing.T) {
	tests := []struct {
		cell Cell
		want string // the CSV field as written
	}{
		{Text("=HYPERLINK(\"http://x\")"), `"'=HYPERLINK(""http://x"")"`},
		{Text("+1+2"), "'+1+2"},
		{Text("-2+3"), "'-2+3"},
		{Text("@SUM(A1)"), "'@SUM(A1)"},
		{Text("\tcar"), "'\tcar"},
		{Text("\rcar"), "\"'\rcar\""},
		{Text("car = 5"), "car = 5"},
		{Text("Emergency fund"), "Emergency fund"},
		{Label("-", ""), ""},
		{Label("shown", "=x"), "'=x"},
		{Amount(amount(t, "-12"), usd), "-12.00"}, // a number: never prefixed
		{Rate(-0.01), "-1.0000"},
		{Int(-3), "-3"},
	}
	for _, tt := range tests {
		d := &Doc{Blocks: []Block{&Table{Cols: []Column{{Head: "x", Key: "x"}}, Rows: [][]Cell{{tt.cell}}}}}
		var out, errs bytes.Buffer
		if err := d.Write(&out, &errs, FormatCSV); err != nil {
			t.Fatal(err)
		}
		got := strings.TrimSuffix(strings.TrimPrefix(out.String(), "x\n"), "\n")
		if got != tt.want {
			t.Errorf("CSV of %q = %q, want %q", tt.cell.s, got, tt.want)
		}
	}
}

// TestWrite_NotFinite checks that a number that is not finite stops every
// renderer with an error and writes nothing (issue 13 item 11: no +Inf% or
// NaN in any output). Common practice, no source.
func TestWrite_NotFinite(t *testing.T) {
	for _, x := range []float64{math.Inf(1), math.Inf(-1), math.NaN()} {
		for _, c := range []Cell{Rate(x), Share(x, 1), ExactRate(x)} {
			docs := map[string]*Doc{
				"table": {Blocks: []Block{&Table{Cols: []Column{{Key: "rate"}}, Rows: [][]Cell{{c}}}}},
				"facts": {Blocks: []Block{&Facts{Items: []Fact{{Text("rate"), c}}}}},
				"total": {Blocks: []Block{&Table{Cols: []Column{{Key: "rate"}}, Total: []Cell{c}}}},
			}
			for name, d := range docs {
				for _, f := range []Format{FormatText, FormatCSV, FormatJSON, FormatMarkdown} {
					var out, errs bytes.Buffer
					if err := d.Write(&out, &errs, f); err == nil || out.Len() > 0 {
						t.Errorf("%s with %v, format %d: err %v, wrote %q; want an error and nothing written", name, x, f, err, out.String())
					}
				}
			}
			p := &Page{Goals: []Section{{Facts: &Facts{Items: []Fact{{Text("rate"), c}}}}}}
			var out bytes.Buffer
			if err := p.Write(&out); err == nil || out.Len() > 0 {
				t.Errorf("page with %v: err %v, wrote %d bytes; want an error and nothing written", x, err, out.Len())
			}
		}
		d := &Doc{Data: map[string]any{"forms": []map[string]any{{"rate": x}}}}
		var out, errs bytes.Buffer
		if err := d.Write(&out, &errs, FormatText); err == nil {
			t.Errorf("JSON form with %v: no error", x)
		}
	}
	var out, errs bytes.Buffer
	if err := (&Doc{Blocks: []Block{&Table{Cols: []Column{{Key: "rate"}}, Rows: [][]Cell{{Rate(1e300)}}}}}).Write(&out, &errs, FormatText); err != nil {
		t.Errorf("a large finite rate: %v", err)
	}
}

// TestMarkdown_MarkupInText checks that text written into Markdown (a
// goal's name in a cell, a remark, a title) is shown as its characters and
// not run as markup by whatever renders the Markdown: <, > and & become
// entities, Markdown's own marks (# [ ] * _ ` ~ ! \) are escaped with a
// backslash, and | in a cell is escaped. Source: the CommonMark spec, its
// sections "Raw HTML" (tags pass through a renderer as HTML) and "Entity
// and numeric character references" (section names from memory).
func TestMarkdown_MarkupInText(t *testing.T) {
	name := `</title><script>alert(1)</script> & | co`
	d := &Doc{Lead: []string{"Lead " + name}, After: []string{"After " + name},
		Blocks: []Block{&Table{Title: name, Cols: []Column{{Head: "goal", Key: "goal"}}, Rows: [][]Cell{{Text(name)}}}}}
	var out, errs bytes.Buffer
	if err := d.Write(&out, &errs, FormatMarkdown); err != nil {
		t.Fatal(err)
	}
	got := out.String()
	if strings.Contains(got, "<") || strings.Contains(got, ">") {
		t.Errorf("markup left in the Markdown:\n%s", got)
	}
	for _, want := range []string{
		"Lead &lt;/title&gt;&lt;script&gt;alert(1)&lt;/script&gt; &amp; | co",
		"After &lt;/title&gt;",
		`&lt;/script&gt; &amp; \| co`, // the cell and the title
	} {
		if !strings.Contains(got, want) {
			t.Errorf("Markdown lacks %q:\n%s", want, got)
		}
	}
	// Markdown's own marks in a name are escaped too: no heading, link,
	// emphasis or code span
	d = &Doc{After: []string{"# [pay](https://x.example) **bold** `code` _it_ ~~s~~ ![img](y)"}}
	out.Reset()
	if err := d.Write(&out, &errs, FormatMarkdown); err != nil {
		t.Fatal(err)
	}
	got = out.String()
	for _, want := range []string{
		`\# \[pay\](https://x.example) \*\*bold\*\* \` + "`code\\`" + ` \_it\_ \~\~s\~\~ \!\[img\](y)`,
	} {
		if !strings.Contains(got, want) {
			t.Errorf("Markdown lacks %q:\n%s", want, got)
		}
	}
}

// TestRate_NoNegativeZero checks that a rate that rounds to zero is written
// without a minus sign in every form a cell takes (issue 13 item 11: no
// negative zero in any output). Common practice, no source.
func TestRate_NoNegativeZero(t *testing.T) {
	for _, c := range []Cell{Rate(-1e-12), ExactRate(-1e-11), Share(-1e-9, 2)} {
		if s := c.Plain(); strings.HasPrefix(s, "-") {
			t.Errorf("Plain of a rate that rounds to zero = %q", s)
		}
		if s := c.String(); strings.HasPrefix(s, "-") {
			t.Errorf("String of a rate that rounds to zero = %q", s)
		}
	}
	if s := ExactRate(-0.00001).Plain(); s != "-0.001000" {
		t.Errorf("a small negative rate = %q, want -0.001000", s)
	}
}
