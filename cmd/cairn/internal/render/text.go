package render

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"
)

// A Format is an output format of a command.
type Format int

const (
	FormatText Format = iota // plain text tables for the terminal
	FormatCSV
	FormatJSON
	FormatMarkdown
)

// Write renders d to w in format f. With CSV the notices go to stderr, each
// on a line "cairn: note: …". A number that is not finite is an error, and
// nothing is written.
func (d *Doc) Write(w, stderr io.Writer, f Format) error {
	if err := d.finite(); err != nil {
		return err
	}
	switch f {
	case FormatJSON:
		return d.writeJSON(w)
	case FormatCSV:
		return d.writeCSV(w, stderr)
	case FormatMarkdown:
		return d.writeMarkdown(w)
	}
	return d.writeText(w)
}

// writeText writes the lead, each block after a blank line, the closing
// remarks after a blank line and the notices after another, wrapped to
// [LineWidth].
func (d *Doc) writeText(w io.Writer) error {
	var b bytes.Buffer
	for _, l := range d.Lead {
		b.WriteString(Wrap(l, LineWidth))
	}
	for _, blk := range d.Blocks {
		if b.Len() > 0 {
			b.WriteString("\n")
		}
		if p, ok := blk.(Pre); ok {
			b.WriteString(p.Text)
			continue
		}
		t := gridOf(blk)
		if t.Title != "" {
			fmt.Fprintf(&b, "%s\n", t.Title)
		}
		if err := t.writeGrid(&b, false); err != nil {
			return err
		}
	}
	if len(d.After) > 0 {
		b.WriteString("\n")
		for _, l := range d.After {
			b.WriteString(Wrap(l, LineWidth))
		}
	}
	for i, n := range d.Notices {
		if i == 0 {
			b.WriteString("\n")
		}
		b.WriteString(Wrap(n.Label()+": "+n.Text, LineWidth))
	}
	_, err := w.Write(b.Bytes())
	return err
}

// writeMarkdown writes the document as GitHub-style Markdown; preformatted
// blocks are left out.
func (d *Doc) writeMarkdown(w io.Writer) error {
	var b bytes.Buffer
	for _, l := range d.Lead {
		fmt.Fprintf(&b, "%s\n\n", mdText(l))
	}
	for _, blk := range d.Blocks {
		t := gridOf(blk)
		if t == nil {
			continue
		}
		if t.Title != "" {
			fmt.Fprintf(&b, "**%s**\n\n", mdEscape(t.Title))
		}
		if err := t.writeGrid(&b, true); err != nil {
			return err
		}
		b.WriteString("\n")
	}
	for _, l := range d.After {
		fmt.Fprintf(&b, "%s\n\n", mdText(l))
	}
	for i, n := range d.Notices {
		if i > 0 {
			b.WriteString("\n")
		}
		fmt.Fprintf(&b, "*%s: %s*\n", n.Label(), mdText(n.Text))
	}
	_, err := w.Write(b.Bytes())
	return err
}

// writeCSV writes one block (d.CSV, else the first table or facts) with a
// header of column keys, every column kept and every place shown.
func (d *Doc) writeCSV(w, stderr io.Writer) error {
	cw := csv.NewWriter(w)
	blk := d.CSV
	for _, b := range d.Blocks {
		if blk == nil && gridOf(b) != nil {
			blk = b
		}
	}
	if t := gridOf(blk); t != nil {
		head := make([]string, len(t.Cols))
		for i, c := range t.Cols {
			head[i] = c.Key
		}
		cw.Write(head)
		for _, r := range t.rowsAndTotal() {
			cw.Write(machineRow(r))
		}
	}
	cw.Flush()
	for _, n := range d.Notices {
		fmt.Fprintf(stderr, "cairn: %s: %s\n", strings.ToLower(n.Label()), n.Text)
	}
	return cw.Error()
}

// JSONVersion is the version of every command's JSON form, written under
// "cairn_json": it changes only when a key is removed or changes meaning,
// not when one is added. Each command's shape is documented by its schema
// (cairn help COMMAND --format schema).
const JSONVersion = 1

// writeJSON writes d.Data with its version and each notice under its key.
func (d *Doc) writeJSON(w io.Writer) error {
	m := map[string]any{"cairn_json": JSONVersion}
	for k, v := range d.Data {
		m[k] = v
	}
	for _, n := range d.Notices {
		m[n.Key] = n.Text
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(m)
}

// gridOf returns b as a table, or nil when b has no grid form.
func gridOf(b Block) *Table {
	switch b := b.(type) {
	case *Table:
		return b
	case *Facts:
		return b.table()
	}
	return nil
}

// machineRow is row r as CSV cells. A text cell that a spreadsheet would
// read as a formula (it starts with =, +, -, @, a tab or a carriage return)
// gets a leading single quote, as OWASP's advice on CSV injection has it;
// numbers, a negative amount among them, are written as they are.
func machineRow(r []Cell) []string {
	out := make([]string, len(r))
	for i, c := range r {
		out[i] = c.Plain()
		if c.kind == textCell && out[i] != "" && strings.ContainsRune("=+-@\t\r", rune(out[i][0])) {
			out[i] = "'" + out[i]
		}
	}
	return out
}

// shown returns the cells of row r in the visible columns of t, as text.
func (t *Table) shown(r []Cell, md bool) []string {
	var out []string
	for i, c := range r {
		if i < len(t.Cols) && (t.Cols[i].Hidden || t.Cols[i].Below && !md) {
			continue
		}
		s := c.text(t.WholeUnits)
		if md {
			s = mdEscape(s)
		}
		out = append(out, s)
	}
	return out
}

// writeGrid writes t as a plain table or a GitHub-style Markdown table.
func (t *Table) writeGrid(w io.Writer, md bool) error {
	var align []tw.Align
	var head []string
	for _, c := range t.Cols {
		if c.Hidden || c.Below && !md {
			continue
		}
		a := tw.AlignLeft
		if c.Numeric {
			a = tw.AlignRight
		}
		align = append(align, a)
		h := c.Head
		if md {
			h = mdEscape(h)
		}
		head = append(head, h)
	}
	var buf bytes.Buffer
	var r tw.Renderer
	if md {
		r = renderer.NewMarkdown()
	} else {
		r = renderer.NewBlueprint(tw.Rendition{
			Borders: tw.BorderNone,
			Symbols: tw.NewSymbols(tw.StyleASCII),
			Settings: tw.Settings{
				Separators: tw.Separators{BetweenColumns: tw.Off, BetweenRows: tw.Off},
				Lines:      tw.Lines{ShowHeaderLine: tw.On, ShowFooterLine: tw.On},
			},
		})
	}
	opts := []tablewriter.Option{
		tablewriter.WithRenderer(r),
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithHeaderAlignmentConfig(tw.CellAlignment{PerColumn: align}),
		tablewriter.WithRowAlignmentConfig(tw.CellAlignment{PerColumn: align}),
		tablewriter.WithFooterAlignmentConfig(tw.CellAlignment{PerColumn: align}),
		tablewriter.WithRowAutoWrap(tw.WrapNone),
		tablewriter.WithHeaderAutoWrap(tw.WrapNone),
	}
	if !md {
		opts = append(opts, tablewriter.WithPadding(tw.Padding{Left: "", Right: "  ", Overwrite: true}))
	}
	tb := tablewriter.NewTable(&buf, opts...)
	tb.Header(head)
	for _, row := range t.Rows {
		if err := tb.Append(t.shown(row, md)); err != nil {
			return err
		}
	}
	if t.Total != nil {
		if md {
			// the Markdown renderer prints a footer as a plain row; so do we
			if err := tb.Append(t.shown(t.Total, md)); err != nil {
				return err
			}
		} else {
			tb.Footer(t.shown(t.Total, md))
		}
	}
	if err := tb.Render(); err != nil {
		return err
	}
	k := -2 // the row a line shows: the head and its rule come first
	for _, line := range strings.Split(strings.TrimRight(buf.String(), "\n"), "\n") {
		line = strings.TrimRight(line, " ")
		if line == "" {
			continue
		}
		fmt.Fprintln(w, line)
		if k >= 0 && k < len(t.Rows) && !md {
			t.writeBelow(w, t.Rows[k])
		}
		k++
	}
	return nil
}

// writeBelow writes the cells of row r in the columns shown below it,
// each on lines of its own, indented two spaces and wrapped to
// [LineWidth]; a line breaks between words but not inside parentheses.
func (t *Table) writeBelow(w io.Writer, r []Cell) {
	for i, c := range t.Cols {
		if !c.Below || c.Hidden || i >= len(r) {
			continue
		}
		text := r[i].text(t.WholeUnits)
		if text == "" {
			continue
		}
		// the words, each parenthesised group one word
		var words []string
		depth := 0
		for _, f := range strings.Fields(text) {
			if depth > 0 {
				words[len(words)-1] += " " + f
			} else {
				words = append(words, f)
			}
			depth += strings.Count(f, "(") - strings.Count(f, ")")
		}
		for _, l := range strings.Split(strings.TrimRight(wrapWords(words, LineWidth-2), "\n"), "\n") {
			fmt.Fprintln(w, "  "+l)
		}
	}
}

func mdEscape(s string) string { return strings.ReplaceAll(mdText(s), "|", `\|`) }

// mdText is text s as Markdown shows it, not as markup a renderer runs:
// a goal's name such as "<script>", "# [pay](https://…)" or "**x**" is
// written as its characters — HTML's three as entities, Markdown's own
// marks (emphasis, code, links, images, headings, strikethrough) escaped
// with a backslash, which every Markdown reader shows as the character.
var mdText = strings.NewReplacer("&", "&amp;", "<", "&lt;", ">", "&gt;",
	`\`, `\\`, "`", "\\`", "*", `\*`, "_", `\_`, "[", `\[`, "]", `\]`, "#", `\#`, "!", `\!`, "~", `\~`).Replace

// Wrap breaks text into lines of at most width characters, each ended by a
// newline.
func Wrap(text string, width int) string { return wrapWords(strings.Fields(text), width) }

// wrapWords joins words by spaces into lines of at most width characters
// (a longer word alone on its line), each ended by a newline.
func wrapWords(words []string, width int) string {
	var b strings.Builder
	line := 0
	for i, word := range words {
		if i > 0 && line+1+len([]rune(word)) > width {
			b.WriteString("\n")
			line = 0
		} else if i > 0 {
			b.WriteString(" ")
			line++
		}
		b.WriteString(word)
		line += len([]rune(word))
	}
	b.WriteString("\n")
	return b.String()
}
