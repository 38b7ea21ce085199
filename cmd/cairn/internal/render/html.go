package render

import (
	"fmt"
	"html/template"
	"io"
	"strings"
	"sync"
)

// A Page is the printable HTML report: the household's status, then one
// section per goal, each on a new page. Its tables are the commands' own
// tables, shown with every place.
type Page struct {
	Title         string
	Footer        string // the running footer of every printed page
	Version       string
	Meta          string // the sentence under the title
	Status        *Table
	StatusCaption string
	Remarks       []string
	// Budget is the household's monthly saving, set aside now and needed;
	// the hook for a household budget's lines.
	Budget  *Facts
	Next    []string // what to do next, one sentence a goal's step
	Notices []Notice
	Goals   []Section
	// Parts are the pages between the summary and the goals, each on a
	// new page: the household budget's, the scenarios side by side.
	Parts []Part
}

// A Part is a page of a [Page] about the whole household: its heading,
// sentences, facts, one table under a subheading, remarks and notices.
type Part struct {
	ID, Name     string
	Lead         []string
	Facts        *Facts
	TableHeading string
	Table        *Table
	Caption      string
	Remarks      []string
	Notices      []Notice
}

// A Section is one goal's part of a [Page].
type Section struct {
	ID, Kicker, Name  string
	Facts             *Facts
	Figure            Figure
	Projection        *Table
	ProjectionCaption string
	Remarks           []string
	Assumptions       *Facts
	Notices           []Notice
}

// A Figure is a drawing and its caption.
type Figure struct {
	SVG     template.HTML // trusted: drawn by cairn's chart package
	Caption string
}

// Write renders the page to w; a number that is not finite is an error,
// and nothing is written.
func (p *Page) Write(w io.Writer) error {
	if err := p.finite(); err != nil {
		return err
	}
	d := pageData{Title: p.Title, Footer: cssString(p.Footer), Version: p.Version, Meta: p.Meta,
		Status: htmlTableOf(p.Status, "status", p.StatusCaption), Remarks: p.Remarks, Budget: factsOf(p.Budget), Next: p.Next,
		Notices: noticesOf(p.Notices)}
	for _, pt := range p.Parts {
		d.Parts = append(d.Parts, partData{ID: pt.ID, Name: pt.Name, Lead: pt.Lead, Facts: factsOf(pt.Facts), TableHeading: pt.TableHeading,
			Table: htmlTableOf(pt.Table, pt.ID, pt.Caption), Remarks: pt.Remarks, Notices: noticesOf(pt.Notices)})
	}
	for _, s := range p.Goals {
		d.Goals = append(d.Goals, goalData{ID: s.ID, Kicker: s.Kicker, Name: s.Name, Facts: factsOf(s.Facts),
			Chart: s.Figure.SVG, ChartNote: s.Figure.Caption, Projection: htmlTableOf(s.Projection, "projection", s.ProjectionCaption),
			Remarks: s.Remarks, Assumptions: factsOf(s.Assumptions), Notices: noticesOf(s.Notices)})
	}
	if err := page().Execute(w, d); err != nil {
		return fmt.Errorf("writing the report: %v", err)
	}
	return nil
}

// pageData is what the page template reads.
type pageData struct {
	Title   string
	Footer  template.CSS // Title as a CSS string, for the running footer
	Version string
	Meta    string
	Status  htmlTable
	Remarks []string
	Budget  []fact
	Next    []string
	Notices []htmlNotice
	Goals   []goalData
	Parts   []partData
}

type partData struct {
	ID, Name     string
	Lead         []string
	Facts        []fact
	TableHeading string
	Table        htmlTable
	Remarks      []string
	Notices      []htmlNotice
}

type goalData struct {
	ID          string
	Kicker      string // "Goal 1 of 4: Emergency fund", the first text of its page
	Name        string
	Facts       []fact
	Chart       template.HTML
	ChartNote   string
	Projection  htmlTable
	Remarks     []string
	Assumptions []fact
	Notices     []htmlNotice
}

type fact struct{ Term, Detail string }

func factsOf(f *Facts) []fact {
	if f == nil {
		return nil
	}
	var fs []fact
	for _, it := range f.Items {
		fs = append(fs, fact{it.Item.text(false), it.Value.text(false)})
	}
	return fs
}

type htmlNotice struct{ Label, Text, Class string }

func noticesOf(ns []Notice) []htmlNotice {
	var out []htmlNotice
	for _, n := range ns {
		h := htmlNotice{Label: n.Label(), Text: n.Text}
		if n.Kind == Caution {
			h.Class = "caution"
		}
		out = append(out, h)
	}
	return out
}

// An htmlTable is a table whose first column heads its rows.
type htmlTable struct {
	Class   string
	Caption string
	Head    []htmlCell
	Rows    [][]htmlCell
	Total   []htmlCell
}

type htmlCell struct {
	Text string
	Num  bool
}

// htmlTableOf turns t into an HTML table, leaving out hidden columns and
// showing every place.
func htmlTableOf(t *Table, class, caption string) htmlTable {
	h := htmlTable{Class: class, Caption: caption}
	keep := func(row []string) []htmlCell {
		var out []htmlCell
		for i, s := range row {
			if c := t.Cols[i]; !c.Hidden {
				out = append(out, htmlCell{Text: s, Num: c.Numeric})
			}
		}
		return out
	}
	text := func(r []Cell) []string {
		out := make([]string, len(r))
		for i, c := range r {
			out[i] = c.text(false)
		}
		return out
	}
	var head []string
	for _, c := range t.Cols {
		if c.Long != "" {
			head = append(head, c.Long)
		} else {
			head = append(head, c.Head)
		}
	}
	h.Head = keep(head)
	for _, r := range t.Rows {
		h.Rows = append(h.Rows, keep(text(r)))
	}
	if t.Total != nil {
		h.Total = keep(text(t.Total))
	}
	return h
}

// cssString quotes s as a CSS string, escaping every character that could
// end the string or the style element.
func cssString(s string) template.CSS {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch {
		case r == '"' || r == '\\' || r == '<' || r == '>' || r == '&' || r < 0x20 || r == 0x7f:
			fmt.Fprintf(&b, "\\%x ", r)
		default:
			b.WriteRune(r)
		}
	}
	b.WriteByte('"')
	return template.CSS(b.String())
}

// reportPage is the page. Its CSS prints on A4 and on Letter alike: size
// auto takes the printer's paper, and the margins (15 mm, 16 mm at the
// foot) leave a text block of 180 × 266 mm on A4 (210 × 297 mm) and
// 186 × 248 mm on Letter (216 × 279 mm); the layout is fluid, so it fits
// either. The @page margin boxes hold our own footer, which also keeps
// Chromium from printing its date and file address there. Series are told
// apart by dash and weight, the band by a grey fill, so that greyscale
// printing loses nothing. It is parsed when first used: only the report
// pays for it.
var page = sync.OnceValue(func() *template.Template {
	return template.Must(template.Must(template.New("report").Parse(`<!DOCTYPE html>
<html xmlns="http://www.w3.org/1999/xhtml" lang="en">
<head>
<meta charset="utf-8"/>
<meta name="viewport" content="width=device-width, initial-scale=1"/>
<meta name="generator" content="cairn {{.Version}}"/>
<title>{{.Title}}</title>
<style>
@page {
  size: auto;
  margin: 15mm 15mm 16mm 15mm;
  @top-left { content: ""; }
  @bottom-left { content: {{.Footer}}; font: 7.5pt "DejaVu Sans", Arial, sans-serif; }
  @bottom-right { content: "page " counter(page) " of " counter(pages); font: 7.5pt "DejaVu Sans", Arial, sans-serif; }
}
html { color: #000; background: #fff; }
body { font-family: "DejaVu Serif", Georgia, "Times New Roman", serif; font-size: 10.5pt; line-height: 1.4; max-width: 50rem; margin: 1.5rem auto; padding: 0 1rem; }
h1, h2, h3, caption, th, .kicker, dt { font-family: "DejaVu Sans", "Helvetica Neue", Arial, sans-serif; }
h1 { font-size: 20pt; margin: 0 0 0.2rem; }
h2 { font-size: 16pt; margin: 0.1rem 0 0.6rem; }
h3 { font-size: 11.5pt; margin: 1.2rem 0 0.4rem; }
.kicker { font-size: 9pt; letter-spacing: 0.02em; margin: 0; }
.meta { margin: 0 0 1rem; }
.note { border-top: 0.75pt solid #000; border-bottom: 0.75pt solid #000; padding: 0.35rem 0; font-size: 9.5pt; }
.note p { margin: 0.15rem 0; }
table { border-collapse: collapse; width: 100%; font-size: 9pt; font-variant-numeric: tabular-nums; margin: 0.3rem 0 0.6rem; }
caption { caption-side: top; text-align: left; font-size: 9pt; padding: 0 0 0.3rem; }
th, td { padding: 0.12rem 0.4rem; border-bottom: 0.5pt solid #9a9a9a; vertical-align: top; text-align: left; }
.num { text-align: right; white-space: nowrap; }
thead th { border-bottom: 1.25pt solid #000; font-weight: bold; }
tbody th { font-weight: normal; }
tfoot th, tfoot td { border-top: 1.25pt solid #000; border-bottom: none; font-weight: bold; }
table.status td, table.status th { font-size: 8.5pt; }
figure { margin: 0.6rem 0; }
svg.chart { display: block; width: 100%; height: auto; }
figcaption { font-size: 9pt; }
figcaption p { margin: 0.1rem 0; }
dl { display: grid; grid-template-columns: max-content auto; gap: 0.1rem 1rem; margin: 0.4rem 0; font-size: 9.5pt; }
dt { font-weight: bold; font-size: 9pt; }
dd { margin: 0; }
ul.remarks, ul.next { padding-left: 1.2rem; }
p.remark { margin: 0.3rem 0; }
ul.next li { margin: 0.15rem 0; }
nav ol { display: inline; padding: 0; }
nav li { display: inline; margin-left: 0.4rem; }
@media print {
  body { max-width: none; margin: 0; padding: 0; font-size: 10pt; line-height: 1.3; }
  nav { display: none; }
  table.projection { line-height: 1.15; }
  table.projection th, table.projection td { padding-top: 0.04rem; padding-bottom: 0.04rem; }
  p.remark, ul.remarks { font-size: 9pt; }
  dl { font-size: 9pt; line-height: 1.25; }
  h3 { margin: 0.8rem 0 0.3rem; }
  section.part, section.goal { break-before: page; page-break-before: always; }
  thead { display: table-header-group; }
  tfoot { display: table-row-group; }
  tr, figure, dl.facts, .note { break-inside: avoid; page-break-inside: avoid; }
  dt { break-after: avoid; page-break-after: avoid; }
  h1, h2, h3, caption, .kicker { break-after: avoid; page-break-after: avoid; }
  .keep, dl.budget, ul.next li { break-inside: avoid; page-break-inside: avoid; }
  h3.with-table + table thead, h3.with-table + table tbody tr:nth-child(-n+3) { break-before: avoid; page-break-before: avoid; }
  svg.chart { max-height: 46mm; }
  figure { margin: 0.4rem 0; }
  .note { font-size: 9pt; }
  a { color: inherit; text-decoration: none; }
}
</style>
</head>
<body>
<header>
<h1>Household plan</h1>
<p class="meta">{{.Meta}}</p>
</header>
<main>
<section id="status" class="summary" aria-labelledby="status-h">
<h2 id="status-h">The household at a glance</h2>
{{template "table" .Status}}
{{- if .Remarks}}
<ul class="remarks">
{{- range .Remarks}}
<li>{{.}}</li>
{{- end}}
</ul>
{{- end}}
{{- if .Budget}}
<div class="keep">
<h3 id="budget-h">Saving each month</h3>
<dl class="budget" aria-labelledby="budget-h">
{{- range .Budget}}
<dt>{{.Term}}</dt><dd>{{.Detail}}</dd>
{{- end}}
</dl>
</div>
{{- end}}
<div class="keep">
{{- if .Next}}
<h3 id="next-h">What to do next</h3>
<ul class="next" aria-labelledby="next-h">
{{- range .Next}}
<li>{{.}}</li>
{{- end}}
</ul>
{{- end}}
<nav aria-label="goals">
<div>Each goal follows on its own page:
<ol>
{{- range .Goals}}
<li><a href="#{{.ID}}">{{.Name}}</a></li>
{{- end}}
</ol></div>
</nav>
{{template "note" .Notices}}
</div>
</section>
{{- range .Parts}}
<section id="{{.ID}}" class="part" aria-labelledby="{{.ID}}-h">
<h2 id="{{.ID}}-h">{{.Name}}</h2>
{{- range .Lead}}
<p class="remark">{{.}}</p>
{{- end}}
{{- if .Facts}}
<dl class="facts">
{{- range .Facts}}
<dt>{{.Term}}</dt><dd>{{.Detail}}</dd>
{{- end}}
</dl>
{{- end}}
<h3 class="with-table">{{.TableHeading}}</h3>
{{template "table" .Table}}
<div class="keep">
{{- range .Remarks}}
<p class="remark">{{.}}</p>
{{- end}}
{{template "note" .Notices}}
</div>
</section>
{{- end}}
{{- range .Goals}}
<section id="{{.ID}}" class="goal" aria-labelledby="{{.ID}}-h">
<div class="keep">
<p class="kicker">{{.Kicker}}</p>
<h2 id="{{.ID}}-h">{{.Name}}</h2>
<dl class="facts">
{{- range .Facts}}
<dt>{{.Term}}</dt><dd>{{.Detail}}</dd>
{{- end}}
</dl>
</div>
<figure class="balance">
{{.Chart}}
<figcaption>{{.ChartNote}}</figcaption>
</figure>
<h3 class="with-table">Yearly projection</h3>
{{template "table" .Projection}}
{{- range .Remarks}}
<p class="remark">{{.}}</p>
{{- end}}
<div class="keep">
<h3>Assumptions</h3>
<dl class="assumptions">
{{- range .Assumptions}}
<dt>{{.Term}}</dt><dd>{{.Detail}}</dd>
{{- end}}
</dl>
{{template "note" .Notices}}
</div>
</section>
{{- end}}
</main>
</body>
</html>
`)).Parse(`
{{define "table" -}}
<table class="{{.Class}}">
<caption>{{.Caption}}</caption>
<thead>
<tr>
{{- range .Head}}<th scope="col"{{if .Num}} class="num"{{end}}>{{.Text}}</th>{{end -}}
</tr>
</thead>
<tbody>
{{- range .Rows}}
<tr>
{{- range $i, $c := .}}{{if eq $i 0}}<th scope="row">{{$c.Text}}</th>{{else}}<td{{if $c.Num}} class="num"{{end}}>{{$c.Text}}</td>{{end}}{{end -}}
</tr>
{{- end}}
</tbody>
{{- if .Total}}
<tfoot>
<tr>
{{- range $i, $c := .Total}}{{if eq $i 0}}<th scope="row">{{$c.Text}}</th>{{else}}<td{{if $c.Num}} class="num"{{end}}>{{$c.Text}}</td>{{end}}{{end -}}
</tr>
</tfoot>
{{- end}}
</table>
{{- end}}
{{define "note" -}}
<div class="note">
{{- range .}}
<p{{if .Class}} class="{{.Class}}"{{end}}><strong>{{.Label}}:</strong> {{.Text}}</p>
{{- end}}
</div>
{{- end}}
`))
})
