package main

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
	"github.com/urfave/cli/v2"
)

// The note every result carries, and the caution for plans that draw money
// down.
const (
	noteText = "A planning estimate, not financial, tax or investment advice. It assumes the rates " +
		"and amounts given hold; taxes are not modelled. Consult a licensed professional before acting."
	cautionText = "Running out of money is the risk that matters once withdrawals begin: " +
		"review the withdrawals every year."
)

// A format is an output format.
type format int

const (
	formatTable format = iota
	formatCSV
	formatJSON
	formatMarkdown
)

func parseFormat(c *cli.Context) (format, error) {
	switch strings.ToLower(c.String("format")) {
	case "", "table":
		return formatTable, nil
	case "csv":
		return formatCSV, nil
	case "json":
		return formatJSON, nil
	case "markdown", "md":
		return formatMarkdown, nil
	}
	return 0, usagef("", "--format: unknown format %q (want table, csv, json or markdown)", c.String("format"))
}

// A column of a grid: its header, its JSON key, and whether it holds
// numbers (right-aligned).
type column struct {
	head    string
	key     string
	numeric bool
	hidden  bool // left out of table and Markdown output (kept in CSV)
}

// A grid is one table of output. raw, when set, holds the same cells in
// machine form (plain numbers) for CSV.
type grid struct {
	title    string
	cols     []column
	rows     [][]string
	raw      [][]string
	total    []string // a totals row, or nil
	rawTotal []string
}

// add appends a row shown as text and written to CSV as raw.
func (g *grid) add(text, raw []string) {
	g.rows = append(g.rows, text)
	g.raw = append(g.raw, raw)
}

// A doc is one command's output before it is put into a format: lead
// sentences (the answer first), tables, closing lines, and the JSON form.
type doc struct {
	lead     []string
	grids    []*grid
	primary  int // the grid written as CSV
	after    []string
	json     map[string]any
	drawdown bool // add the caution
}

// write renders d to w in format f; the note goes to stderr for CSV.
func (d *doc) write(w, stderr io.Writer, f format) error {
	switch f {
	case formatJSON:
		m := d.json
		if m == nil {
			m = map[string]any{}
		}
		m["note"] = noteText
		if d.drawdown {
			m["caution"] = cautionText
		}
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		enc.SetEscapeHTML(false)
		return enc.Encode(m)
	case formatCSV:
		cw := csv.NewWriter(w)
		if len(d.grids) > 0 {
			g := d.grids[d.primary]
			head := make([]string, len(g.cols))
			for i, c := range g.cols {
				head[i] = c.key
			}
			rows, total := g.rows, g.total
			if g.raw != nil {
				rows, total = g.raw, g.rawTotal
			}
			cw.Write(head)
			for _, r := range rows {
				cw.Write(r)
			}
			if total != nil {
				cw.Write(total)
			}
		}
		cw.Flush()
		fmt.Fprintf(stderr, "cairn: note: %s\n", noteText)
		if d.drawdown {
			fmt.Fprintf(stderr, "cairn: caution: %s\n", cautionText)
		}
		return cw.Error()
	case formatMarkdown:
		var b bytes.Buffer
		for _, l := range d.lead {
			fmt.Fprintf(&b, "%s\n\n", l)
		}
		for _, g := range d.grids {
			if g.title != "" {
				fmt.Fprintf(&b, "**%s**\n\n", mdEscape(g.title))
			}
			if err := renderGrid(&b, g, true); err != nil {
				return err
			}
			b.WriteString("\n")
		}
		for _, l := range d.after {
			fmt.Fprintf(&b, "%s\n\n", l)
		}
		fmt.Fprintf(&b, "*Note: %s*\n", noteText)
		if d.drawdown {
			fmt.Fprintf(&b, "\n*Caution: %s*\n", cautionText)
		}
		_, err := w.Write(b.Bytes())
		return err
	}
	var b bytes.Buffer
	for _, l := range d.lead {
		b.WriteString(wrap(l, 80))
	}
	for _, g := range d.grids {
		if b.Len() > 0 {
			b.WriteString("\n")
		}
		if g.title != "" {
			fmt.Fprintf(&b, "%s\n", g.title)
		}
		if err := renderGrid(&b, g, false); err != nil {
			return err
		}
	}
	if len(d.after) > 0 {
		b.WriteString("\n")
		for _, l := range d.after {
			b.WriteString(wrap(l, 80))
		}
	}
	b.WriteString("\n")
	b.WriteString(wrap("Note: "+noteText, 80))
	if d.drawdown {
		b.WriteString(wrap("Caution: "+cautionText, 80))
	}
	_, err := w.Write(b.Bytes())
	return err
}

// renderGrid writes g as a plain table or a GitHub-style Markdown table.
func renderGrid(w io.Writer, g *grid, md bool) error {
	var align []tw.Align
	var head []string
	for _, c := range g.cols {
		if c.hidden {
			continue
		}
		a := tw.AlignLeft
		if c.numeric {
			a = tw.AlignRight
		}
		align = append(align, a)
		h := c.head
		if md {
			h = mdEscape(h)
		}
		head = append(head, h)
	}
	shown := func(row []string) []string {
		var out []string
		for i, c := range row {
			if i < len(g.cols) && g.cols[i].hidden {
				continue
			}
			if md {
				c = mdEscape(c)
			}
			out = append(out, c)
		}
		return out
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
	t := tablewriter.NewTable(&buf, opts...)
	t.Header(head)
	for _, row := range g.rows {
		if err := t.Append(shown(row)); err != nil {
			return err
		}
	}
	if g.total != nil {
		if md {
			// the Markdown renderer prints a footer as a plain row; so do we
			if err := t.Append(shown(g.total)); err != nil {
				return err
			}
		} else {
			t.Footer(shown(g.total))
		}
	}
	if err := t.Render(); err != nil {
		return err
	}
	for _, line := range strings.Split(strings.TrimRight(buf.String(), "\n"), "\n") {
		line = strings.TrimRight(line, " ")
		if line == "" {
			continue
		}
		fmt.Fprintln(w, line)
	}
	return nil
}

func mdEscape(s string) string { return strings.ReplaceAll(s, "|", `\|`) }

// wrap breaks text into lines of at most width characters.
func wrap(text string, width int) string {
	var b strings.Builder
	line := 0
	for i, word := range strings.Fields(text) {
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
