package main

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"cairn/cmd/cairn/internal/render"
	"cairn/examples"
	"cairn/plan"
)

// The report's structure is checked, not its whitespace: the page is read
// with encoding/xml (it is XHTML-compatible by design) into an outline of
// its elements — tag, id, classes, the attributes that carry meaning, and
// the text of headings and header cells — with runs of identical siblings
// folded into one line "×N". The outline is compared with a golden file in
// testdata/report; `go test ./cmd/cairn -update` rewrites it.

// A node is one element of the page, or a run of text ("#text").
type node struct {
	name     string
	attrs    map[string]string
	text     string // of a #text node: its character data, white space squeezed
	children []*node
	parent   *node
}

// parseXHTML reads the page as XML; any well-formedness error fails.
func parseXHTML(t *testing.T, data []byte) *node {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(data))
	root := &node{name: "#document"}
	cur := root
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			line, col := d.InputPos()
			t.Fatalf("the report is not well-formed XHTML at %d:%d: %v", line, col, err)
		}
		switch tk := tok.(type) {
		case xml.StartElement:
			n := &node{name: tk.Name.Local, attrs: map[string]string{}, parent: cur}
			for _, a := range tk.Attr {
				name := a.Name.Local
				if a.Name.Space == "xmlns" || name == "xmlns" {
					continue
				}
				n.attrs[name] = a.Value
			}
			cur.children = append(cur.children, n)
			cur = n
		case xml.EndElement:
			cur = cur.parent
		case xml.CharData:
			if s := strings.Join(strings.Fields(string(tk)), " "); s != "" {
				cur.children = append(cur.children, &node{name: "#text", text: s, parent: cur})
			}
		}
	}
	if cur != root {
		t.Fatalf("the report ends inside <%s>", cur.name)
	}
	return root
}

// allText is the text of n and everything inside it.
func (n *node) allText() string {
	var parts []string
	var walk func(*node)
	walk = func(m *node) {
		if m.text != "" {
			parts = append(parts, m.text)
		}
		for _, c := range m.children {
			walk(c)
		}
	}
	walk(n)
	return strings.Join(parts, " ")
}

func (n *node) find(match func(*node) bool) []*node {
	var out []*node
	var walk func(*node)
	walk = func(m *node) {
		if match(m) {
			out = append(out, m)
		}
		for _, c := range m.children {
			walk(c)
		}
	}
	walk(n)
	return out
}

// elems returns n's child elements, without its text.
func (n *node) elems() []*node {
	var out []*node
	for _, c := range n.children {
		if c.name != "#text" {
			out = append(out, c)
		}
	}
	return out
}

func (n *node) hasClass(c string) bool {
	for _, x := range strings.Fields(n.attrs["class"]) {
		if x == c {
			return true
		}
	}
	return false
}

// outlineAttrs are the attributes an outline shows.
var outlineAttrs = []string{"scope", "role", "aria-labelledby", "aria-label", "lang", "href"}

// outline returns the element outline of n's children, one line each,
// indented by depth.
func outline(n *node, depth int) []string {
	var lines []string
	var prev []string
	count := 0
	flush := func() {
		if prev == nil {
			return
		}
		switch {
		case count > 1 && n.name == "g" && inSVG(n):
			// tick marks and labels follow the data's range: fold their runs
			// without a count, so that the outline is of the chart's parts
			prev[0] += " ×n"
		case count > 1:
			prev[0] += fmt.Sprintf(" ×%d", count)
		}
		lines = append(lines, prev...)
	}
	for _, c := range n.children {
		if c.name == "#text" {
			continue
		}
		sub := append([]string{strings.Repeat("  ", depth) + describeNode(c)}, outline(c, depth+1)...)
		if prev != nil && strings.Join(sub, "\n") == strings.Join(prev, "\n") {
			count++
			continue
		}
		flush()
		prev, count = sub, 1
	}
	flush()
	return lines
}

// inSVG reports whether n is an svg element or inside one.
func inSVG(n *node) bool {
	for ; n != nil; n = n.parent {
		if n.name == "svg" {
			return true
		}
	}
	return false
}

func describeNode(n *node) string {
	s := n.name
	if id := n.attrs["id"]; id != "" {
		s += "#" + id
	}
	for _, c := range strings.Fields(n.attrs["class"]) {
		s += "." + c
	}
	for _, a := range outlineAttrs {
		if v, ok := n.attrs[a]; ok {
			s += fmt.Sprintf(" [%s=%s]", a, v)
		}
	}
	switch {
	case n.name == "title" || n.name == "h1" || n.name == "h2" || n.name == "h3" || n.name == "dt" || n.hasClass("kicker"):
		s += " " + strconv.Quote(n.allText())
	case n.name == "th" && n.attrs["scope"] == "col":
		s += " " + strconv.Quote(n.allText())
	}
	return s
}

func reportOf(t *testing.T, yaml []byte, args ...string) []byte {
	t.Helper()
	t.Chdir(t.TempDir()) // so that the file is named plan.yaml in the page
	if err := os.WriteFile("plan.yaml", yaml, 0o644); err != nil {
		t.Fatal(err)
	}
	var stdout, stderr bytes.Buffer
	argv := append([]string{"cairn", "report", "plan.yaml", "--out", "-", "--as-of", "2026-12"}, args...)
	if code := run(argv, strings.NewReader(""), &stdout, &stderr, fixedNow); code != 0 {
		t.Fatalf("%q: exit %d\n%s", argv, code, stderr.String())
	}
	if stderr.Len() > 0 {
		t.Errorf("%q wrote to stderr:\n%s", argv, stderr.String())
	}
	return stdout.Bytes()
}

func readFixture(t *testing.T, name string) []byte {
	t.Helper()
	data, err := os.ReadFile(filepath.Join("testdata", "report", name))
	if err != nil {
		t.Fatal(err)
	}
	return data
}

// TestReport_Outline compares the outline of the reports of the example
// household and of a goal with a volatility with their golden files.
func TestReport_Outline(t *testing.T) {
	goldenDir, err := filepath.Abs(filepath.Join("testdata", "report"))
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name, golden string
		yaml         []byte
		args         []string
	}{
		{"household", "household.outline", examples.Household, nil},
		{"one goal", "retirement.outline", examples.Household, []string{"--goal", "retirement"}},
		{"volatility", "volatile.outline", readFixture(t, "volatile.yaml"), nil},
		{"budget", "budget.outline", examples.Budget, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			root := parseXHTML(t, reportOf(t, tt.yaml, tt.args...))
			got := strings.Join(outline(root, 0), "\n") + "\n"
			path := filepath.Join(goldenDir, tt.golden)
			if *update {
				if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test ./cmd/cairn -update to write it)", err)
			}
			if got != string(want) {
				t.Errorf("outline of the report differs from %s (-update rewrites it):\n%s", path, lineDiff(string(want), got))
			}
		})
	}
}

// lineDiff shows the first lines where want and got differ.
func lineDiff(want, got string) string {
	w, g := strings.Split(want, "\n"), strings.Split(got, "\n")
	var b strings.Builder
	shown := 0
	for i := 0; i < max(len(w), len(g)) && shown < 12; i++ {
		var a, c string
		if i < len(w) {
			a = w[i]
		}
		if i < len(g) {
			c = g[i]
		}
		if a != c {
			fmt.Fprintf(&b, "line %d:\n  want %s\n  got  %s\n", i+1, a, c)
			shown++
		}
	}
	return b.String()
}

// TestReport_Rules checks what every report must be, whatever its layout:
// self-contained, accessible, printable, and carrying the note.
func TestReport_Rules(t *testing.T) {
	for _, tc := range []struct {
		name string
		yaml []byte
	}{
		{"household", examples.Household},
		{"volatility", readFixture(t, "volatile.yaml")},
		{"names to escape, no target", readFixture(t, "odd.yaml")},
	} {
		t.Run(tc.name, func(t *testing.T) {
			data := reportOf(t, tc.yaml)
			root := parseXHTML(t, data)
			p, err := plan.Parse("plan.yaml", tc.yaml, plan.MonthOf(2026, 12))
			if err != nil {
				t.Fatal(err)
			}

			// self-contained: no scripts, nothing fetched
			if n := root.find(func(n *node) bool {
				return n.name == "script" || n.name == "link" || n.name == "img" || n.name == "iframe"
			}); len(n) > 0 {
				t.Errorf("the report has a <%s>", n[0].name)
			}
			for _, n := range root.find(func(*node) bool { return true }) {
				for k, v := range n.attrs {
					if strings.HasPrefix(k, "on") || k == "src" || (k == "href" && !strings.HasPrefix(v, "#")) {
						t.Errorf("<%s %s=%q>: the report must not run scripts or fetch anything", n.name, k, v)
					}
				}
			}
			css := strings.Join(func() []string {
				var s []string
				for _, n := range root.find(func(n *node) bool { return n.name == "style" }) {
					s = append(s, n.allText())
				}
				return s
			}(), "\n")
			for _, bad := range []string{"url(", "@import", "@font-face"} {
				if strings.Contains(css, bad) {
					t.Errorf("the style sheet has %s: it must need nothing from outside", bad)
				}
			}
			// printing: paper, page breaks, repeated headers
			for _, want := range []*regexp.Regexp{
				regexp.MustCompile(`@page\s*{[^}]*size:\s*auto`),
				regexp.MustCompile(`section\.goal\s*{[^}]*break-before:\s*page`),
				regexp.MustCompile(`thead\s*{[^}]*display:\s*table-header-group`),
			} {
				if !want.MatchString(css) {
					t.Errorf("the style sheet lacks %s", want)
				}
			}
			// greyscale: every colour given is a grey
			for _, c := range regexp.MustCompile(`(?i)(?:color|fill|stroke|background)\s*(?::|=)\s*"?#([0-9a-f]{6}|[0-9a-f]{3})\b`).FindAllStringSubmatch(string(data), -1) {
				h := strings.ToLower(c[1])
				if len(h) == 3 {
					h = string([]byte{h[0], h[0], h[1], h[1], h[2], h[2]})
				}
				if h[0:2] != h[2:4] || h[2:4] != h[4:6] {
					t.Errorf("%s is not a grey: the report must read the same in greyscale", c[0])
				}
			}

			// ids unique, references resolve
			ids := map[string]bool{}
			for _, n := range root.find(func(n *node) bool { return n.attrs["id"] != "" }) {
				if ids[n.attrs["id"]] {
					t.Errorf("id %q is used twice", n.attrs["id"])
				}
				ids[n.attrs["id"]] = true
			}
			for _, n := range root.find(func(n *node) bool { return n.attrs["aria-labelledby"] != "" || n.attrs["href"] != "" }) {
				refs := strings.Fields(n.attrs["aria-labelledby"])
				if h := n.attrs["href"]; h != "" {
					refs = append(refs, strings.TrimPrefix(h, "#"))
				}
				for _, r := range refs {
					if !ids[r] {
						t.Errorf("<%s> refers to id %q, which is not in the page", n.name, r)
					}
				}
			}

			// every chart is named and described; every table has header cells
			svgs := root.find(func(n *node) bool { return n.name == "svg" })
			if len(svgs) != len(p.Goals) {
				t.Errorf("%d charts for %d goals", len(svgs), len(p.Goals))
			}
			for _, s := range svgs {
				if es := s.elems(); len(es) < 2 || es[0].name != "title" || es[1].name != "desc" || es[0].allText() == "" || es[1].allText() == "" {
					t.Errorf("a chart does not begin with a <title> and a <desc>")
				}
				if s.attrs["role"] != "img" {
					t.Errorf("a chart has role %q, want img", s.attrs["role"])
				}
			}
			for _, tb := range root.find(func(n *node) bool { return n.name == "table" }) {
				heads := tb.find(func(n *node) bool {
					return n.name == "th" && n.attrs["scope"] == "col" && n.parent.parent.name == "thead"
				})
				if len(heads) == 0 {
					t.Errorf("table.%s has no column headers", tb.attrs["class"])
				}
				for _, tr := range tb.find(func(n *node) bool { return n.name == "tr" && n.parent.name != "thead" }) {
					es := tr.elems()
					if len(es) == 0 || es[0].name != "th" || es[0].attrs["scope"] != "row" {
						t.Errorf("table.%s: a row does not begin with a row header", tb.attrs["class"])
					}
					if len(es) != len(heads) {
						t.Errorf("table.%s: a row has %d cells under %d headers", tb.attrs["class"], len(es), len(heads))
					}
				}
			}

			// the note on the summary and on every goal, the caution where money is drawn down
			goals := root.find(func(n *node) bool { return n.name == "section" && n.hasClass("goal") })
			if len(goals) != len(p.Goals) {
				t.Fatalf("%d goal sections for %d goals", len(goals), len(p.Goals))
			}
			parts := root.find(func(n *node) bool { return n.name == "section" && n.hasClass("part") })
			text := root.allText()
			if got, want := strings.Count(text, "Note: "+noteText), 1+len(parts)+len(p.Goals); got != want {
				t.Errorf("the note is in the report %d times, want %d (the summary, every page of the household and every goal)", got, want)
			}
			for i, s := range goals {
				g := p.Goals[i]
				st := s.allText()
				if !strings.Contains(st, "Note: "+noteText) {
					t.Errorf("%s: no note", g.Name)
				}
				if got, want := strings.Contains(st, "Caution: "+cautionText), len(g.Withdrawals) > 0; got != want {
					t.Errorf("%s: caution shown %v, want %v", g.Name, got, want)
				}
				if !strings.Contains(st, g.Between.Words()) {
					t.Errorf("%s: the between rule is not stated in words", g.Name)
				}
				band := len(s.find(func(n *node) bool { return n.name == "path" && n.hasClass("band") })) > 0
				if want := g.HasVolatility && g.Volatility > 0 || p.HasInflationVolatility && p.InflationVolatility > 0; band != want {
					t.Errorf("%s: band drawn %v, want %v (volatility %v)", g.Name, band, want, g.Volatility)
				}
				if band && !strings.Contains(st, fmt.Sprintf("%s simulated paths (seed %d)", render.Grouped(reportPaths), reportSeed)) {
					t.Errorf("%s: the band does not state its paths and seed", g.Name)
				}
			}
		})
	}
}

// TestReport_Figures checks that the report's figures are the plan
// package's: the status table is the status command's, and each yearly
// table is the ledger's rows to the cent.
func TestReport_Figures(t *testing.T) {
	root := parseXHTML(t, reportOf(t, examples.Household))
	p, err := plan.Parse("plan.yaml", examples.Household, plan.MonthOf(2026, 12))
	if err != nil {
		t.Fatal(err)
	}
	cells := func(tr *node) []string {
		var out []string
		for _, c := range tr.elems() {
			out = append(out, c.allText())
		}
		return out
	}
	status := root.find(func(n *node) bool { return n.name == "table" && n.hasClass("status") })
	if len(status) != 1 {
		t.Fatalf("%d status tables, want 1", len(status))
	}
	want := statusDoc(p, plan.StatusOf(p)).Tables()[0]
	rows := status[0].find(func(n *node) bool { return n.name == "tr" && n.parent.name == "tbody" })
	if len(rows) != len(want.Rows) {
		t.Fatalf("status table: %d rows, want %d", len(rows), len(want.Rows))
	}
	for i, r := range rows {
		var w []string
		for k, c := range want.Rows[i] {
			if !want.Cols[k].Hidden {
				w = append(w, c.String())
			}
		}
		if got := cells(r); strings.Join(got, "|") != strings.Join(w, "|") {
			t.Errorf("status row %d = %q, want %q (as cairn status prints it)", i+1, got, w)
		}
	}
	tables := root.find(func(n *node) bool { return n.name == "table" && n.hasClass("projection") })
	if len(tables) != len(p.Goals) {
		t.Fatalf("%d projection tables for %d goals", len(tables), len(p.Goals))
	}
	for i, g := range p.Goals {
		l, err := plan.Project(p, g, plan.Horizon(p, g))
		if err != nil {
			t.Fatal(err)
		}
		lrows := l.Rows(plan.ByYear, true)
		body := tables[i].find(func(n *node) bool { return n.name == "tr" && n.parent.name == "tbody" })
		foot := tables[i].find(func(n *node) bool { return n.name == "tr" && n.parent.name == "tfoot" })
		if len(body) != len(lrows)-1 || len(foot) != 1 {
			t.Fatalf("%s: %d rows and %d totals, want %d and 1", g.Name, len(body), len(foot), len(lrows)-1)
		}
		for k, tr := range append(body, foot...) {
			c := cells(tr)
			r := lrows[k]
			if c[0] != r.Label || c[1] != amt(p, r.Opening) || c[len(c)-2] != amt(p, r.Closing) || c[len(c)-1] != amt(p, r.ClosingToday) {
				t.Errorf("%s row %s = %q, want opening %s, closing %s, today %s (the ledger's)", g.Name, r.Label, c, amt(p, r.Opening), amt(p, r.Closing), amt(p, r.ClosingToday))
			}
		}
	}
}

// TestReport_Writes checks the file handling: written whole, never over an
// existing file without --force, no file and no temporary file on error,
// and the exit codes.
func TestReport_Writes(t *testing.T) {
	dir := t.TempDir()
	hh := filepath.Join(dir, "household.yaml")
	if err := os.WriteFile(hh, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "plan.html")
	runIt := func(args ...string) (int, string, string) {
		var stdout, stderr bytes.Buffer
		code := run(append([]string{"cairn", "report", hh}, args...), strings.NewReader(""), &stdout, &stderr, fixedNow)
		return code, stdout.String(), stderr.String()
	}
	files := func() []string {
		es, err := os.ReadDir(dir)
		if err != nil {
			t.Fatal(err)
		}
		var ns []string
		for _, e := range es {
			ns = append(ns, e.Name())
		}
		return ns
	}

	code, stdout, _ := runIt("--out", out)
	if code != 0 {
		t.Fatalf("report: exit %d", code)
	}
	if want := "wrote " + out + "\n\n" + render.Wrap("Note: "+noteText, render.LineWidth) + render.Wrap("Caution: "+cautionText, render.LineWidth); stdout != want {
		t.Errorf("stdout = %q, want %q", stdout, want)
	}
	first, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasSuffix(first, []byte("</html>\n")) {
		t.Errorf("the written file does not end with </html>")
	}
	if err := os.WriteFile(out, []byte("kept"), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, stderr := runIt("--out", out)
	if code != exitBadInput || !strings.Contains(stderr, "already exists; not overwriting it") || !strings.Contains(stderr, "--force") {
		t.Errorf("report over an existing file: exit %d, stderr %q; want 2 and a refusal with a hint", code, stderr)
	}
	if b, _ := os.ReadFile(out); string(b) != "kept" {
		t.Errorf("the existing file was changed without --force")
	}
	if code, _, _ = runIt("--out", out, "--force"); code != 0 {
		t.Errorf("report --force: exit %d", code)
	}
	if b, _ := os.ReadFile(out); !bytes.Equal(b, first) {
		t.Errorf("report --force did not write the same report")
	}
	if got := strings.Join(files(), " "); got != "household.yaml plan.html" {
		t.Errorf("files after the runs: %s, want household.yaml plan.html (no temporary files)", got)
	}
	missing := filepath.Join(dir, "no-such-dir", "plan.html")
	if code, _, stderr = runIt("--out", missing); code != exitBadInput || !strings.Contains(stderr, "cannot write") {
		t.Errorf("report into a missing directory: exit %d, stderr %q", code, stderr)
	}

	tests := []struct {
		name string
		args []string
		want int
		err  string
	}{
		{"unknown goal", []string{"--goal", "Boat", "--out", "-"}, 2, `no goal named "Boat"`},
		{"empty out", []string{"--out", ""}, 2, "--out is given with no value"},
		{"bad as-of", []string{"--as-of", "2026-13", "--out", "-"}, 2, "--as-of"},
		{"two files", []string{hh, "--out", "-"}, 2, "too many arguments"},
		{"bad flag", []string{"--format", "json"}, 2, "unknown option --format"},
		{"one goal to stdout", []string{"--goal", "education", "--out", "-"}, 0, ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, stdout, stderr := runIt(tt.args...)
			if code != tt.want || !strings.Contains(stderr, tt.err) {
				t.Errorf("report %q: exit %d, stderr %q; want %d and %q", tt.args, code, stderr, tt.want, tt.err)
			}
			if tt.want == 2 && stdout != "" {
				t.Errorf("report %q wrote to stdout on error: %q", tt.args, stdout)
			}
		})
	}
	if got := strings.Join(files(), " "); got != "household.yaml plan.html" {
		t.Errorf("files after the failed runs: %s, want household.yaml plan.html", got)
	}
}

// TestReport_PDF prints the report with headless Chromium, as
// .ci/report-e2e.sh does, and checks its pages. It is skipped when
// chromium or poppler-utils is not installed (the script installs them).
func TestReport_PDF(t *testing.T) {
	if testing.Short() {
		t.Skip("skipped in -short mode: it starts a browser")
	}
	chromium, err := exec.LookPath("chromium")
	if err != nil {
		t.Skip("chromium is not installed; .ci/report-e2e.sh installs it and runs this check")
	}
	for _, tool := range []string{"pdfinfo", "pdftotext"} {
		if _, err := exec.LookPath(tool); err != nil {
			t.Skipf("%s is not installed (Debian: poppler-utils); .ci/report-e2e.sh installs it", tool)
		}
	}
	page := reportOf(t, examples.Household)
	p, err := plan.Parse("plan.yaml", examples.Household, plan.MonthOf(2026, 12))
	if err != nil {
		t.Fatal(err)
	}
	// Chromium prints on Letter unless told; the report's size: auto takes
	// that paper. A copy asking for A4 checks the other sheet.
	for _, paper := range []struct{ name, size, pdfinfo string }{{"letter", "auto", "(letter)"}, {"a4", "A4", "(A4)"}} {
		t.Run(paper.name, func(t *testing.T) {
			dir := t.TempDir()
			html := filepath.Join(dir, "plan.html")
			data := bytes.Replace(page, []byte("size: auto;"), []byte("size: "+paper.size+";"), 1)
			if err := os.WriteFile(html, data, 0o644); err != nil {
				t.Fatal(err)
			}
			profile := filepath.Join(dir, "profile")
			if err := os.Mkdir(profile, 0o755); err != nil {
				t.Fatal(err)
			}
			pdf := filepath.Join(dir, "plan.pdf")
			cmd := exec.Command(chromium, "--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
				"--disable-component-update", "--disable-sync", "--disable-quic", "--user-data-dir="+profile, "--print-to-pdf="+pdf, "file://"+html)
			if out, err := cmd.CombinedOutput(); err != nil {
				t.Fatalf("chromium: %v\n%s", err, out)
			}
			info, err := exec.Command("pdfinfo", pdf).Output()
			if err != nil {
				t.Fatalf("pdfinfo: %v", err)
			}
			if !bytes.Contains(info, []byte(paper.pdfinfo)) {
				t.Errorf("the PDF is not on %s paper:\n%s", paper.pdfinfo, info)
			}
			m := regexp.MustCompile(`(?m)^Pages:\s+(\d+)`).FindSubmatch(info)
			if m == nil {
				t.Fatalf("pdfinfo gave no page count:\n%s", info)
			}
			pages, _ := strconv.Atoi(string(m[1]))
			if pages < 1+len(p.Goals) {
				t.Errorf("the PDF has %d pages, want at least %d: the summary and a page for each goal", pages, 1+len(p.Goals))
			}
			// each goal's page begins with its "Goal i of n" line
			next := 2
			for i, g := range p.Goals {
				kicker := fmt.Sprintf("Goal %d of %d: %s", i+1, len(p.Goals), g.Name)
				found := false
				for ; next <= pages && !found; next++ {
					txt, err := exec.Command("pdftotext", "-q", "-f", strconv.Itoa(next), "-l", strconv.Itoa(next), pdf, "-").Output()
					if err != nil {
						t.Fatalf("pdftotext: %v", err)
					}
					found = strings.HasPrefix(strings.Join(strings.Fields(string(txt)), " "), kicker)
				}
				if !found {
					t.Errorf("no page begins with %q", kicker)
				}
			}
			txt, err := exec.Command("pdftotext", "-q", pdf, "-").Output()
			if err != nil {
				t.Fatalf("pdftotext: %v", err)
			}
			text := strings.Join(strings.Fields(string(txt)), " ")
			for _, want := range []string{"Note: " + noteText, "Caution: " + cautionText} {
				if !strings.Contains(text, want) {
					t.Errorf("the PDF lacks %q", want)
				}
			}
		})
	}
}

// TestReport_HandOver checks what makes the report fit to hand over (issue
// 17): the file is named by its base name only, page 1 holds the
// household's monthly saving and what to do next, a drawdown goal shows the
// income the balance sustains, what is left and the share of simulated
// paths that last, and no label is a vague "The money".
func TestReport_HandOver(t *testing.T) {
	dir := t.TempDir()
	abs := filepath.Join(dir, "nested", "household.yaml")
	if err := os.MkdirAll(filepath.Dir(abs), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(abs, examples.Household, 0o644); err != nil {
		t.Fatal(err)
	}
	var stdout, stderr bytes.Buffer
	if code := run([]string{"cairn", "report", abs, "--out", "-", "--as-of", "2026-12"}, strings.NewReader(""), &stdout, &stderr, fixedNow); code != 0 {
		t.Fatalf("report: exit %d\n%s", code, stderr.String())
	}
	data := stdout.String()
	if strings.Contains(data, dir) {
		t.Errorf("the report holds the absolute path %s", dir)
	}
	if !strings.Contains(data, `content: "Household plan: household.yaml · a planning estimate, not advice"`) {
		t.Errorf("the footer does not name household.yaml")
	}
	root := parseXHTML(t, stdout.Bytes())
	summary := root.find(func(n *node) bool { return n.attrs["id"] == "status" })
	if len(summary) != 1 {
		t.Fatalf("%d summary sections", len(summary))
	}
	p, err := plan.Parse("household.yaml", examples.Household, plan.MonthOf(2026, 12))
	if err != nil {
		t.Fatal(err)
	}
	st := plan.StatusOf(p)
	first := summary[0].allText()
	for _, want := range []string{
		"Saving each month", "Set aside now, all goals " + amt(p, st.MonthlyNow) + " a month",
		"The goals' own deposits needed to make every deadline " + amt(p, st.MonthlyNeeded) + " a month",
		// the goals short, by how much (issue 16: no total that reads as a surplus while a goal is short)
		"Short: Emergency fund 682.98 at 2029-06", "Short: Retirement 711,874.70 at 2051-12",
		"What to do next",
		// the status figures, worded: examples/household.yaml's status (cairn status)
		"Emergency fund: raise paycheck from 150.00 to 160.00 every 2 weeks to reach 15,000.00 by the end of 2029-06; as planned it is reached in 2029-08.",
		"Retirement: the planned withdrawals run out in 2071-02; the balance sustains income of 2,917.31 in today's money",
	} {
		if !strings.Contains(first, want) {
			t.Errorf("page 1 lacks %q:\n%s", want, first)
		}
	}
	retirement := root.find(func(n *node) bool { return n.attrs["id"] == "goal-4" })
	if len(retirement) != 1 {
		t.Fatal("no section for the fourth goal")
	}
	g := p.Goal("Retirement")
	income, err := plan.Solve(p, g, plan.Question{For: plan.ForWithdrawal})
	if err != nil {
		t.Fatal(err)
	}
	sim, err := plan.Simulate(p, g, plan.SimOptions{Paths: reportPaths, Seed: reportSeed})
	if err != nil {
		t.Fatal(err)
	}
	rt := retirement[0].allText()
	for _, want := range []string{
		"Sustainable income income of " + amt(p, income.Amount) + " in today's money",
		"Left after the last withdrawal nothing: the balance runs out first",
		"Planned withdrawals run out in 2071-02",
		fmt.Sprintf("Simulated paths that last %s of 2,000 pay every planned withdrawal through 2081-12", render.Share(sim.Lasts, 1)),
	} {
		if !strings.Contains(rt, want) {
			t.Errorf("the Retirement page lacks %q:\n%s", want, rt)
		}
	}
	for _, dt := range root.find(func(n *node) bool { return n.name == "dt" }) {
		if strings.HasPrefix(dt.allText(), "The money") {
			t.Errorf("label %q is not plain: say what it is", dt.allText())
		}
	}
}

// TestReport_Scenarios checks the report's page of scenarios side by side
// (issue 17): shown unasked when the file has scenarios, every scenario or
// those --scenario names, each row the status figures of its case as the
// plan package computes them; with one --scenario the report is of that
// scenario beside the plan as written; no page for a file without
// scenarios, and --scenarios refused there.
func TestReport_Scenarios(t *testing.T) {
	tests := []struct {
		name  string
		yaml  []byte
		args  []string
		cases []string // the cases on the page, the plan as written first; nil for no page
		under string   // the scenario the report is of, or ""
	}{
		{"every scenario unasked", examples.Household, nil, []string{"base", "bigger paycheck deposit", "lower returns"}, ""},
		{"--scenarios", examples.Household, []string{"--scenarios"}, []string{"base", "bigger paycheck deposit", "lower returns"}, ""},
		{"two named", examples.Household, []string{"--scenario", "lower returns", "--scenario", "bigger paycheck deposit"},
			[]string{"base", "lower returns", "bigger paycheck deposit"}, ""},
		{"one named", examples.Household, []string{"--scenario", "lower returns"}, []string{"base", "lower returns"}, "lower returns"},
		{"one goal", examples.Household, []string{"--goal", "Home deposit"}, []string{"base", "bigger paycheck deposit", "lower returns"}, ""},
		{"no scenarios", examples.Budget, nil, nil, ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			root := parseXHTML(t, reportOf(t, tt.yaml, tt.args...))
			meta := root.find(func(n *node) bool { return n.hasClass("meta") })[0].allText()
			if got := strings.Contains(meta, "Under the scenario"); got != (tt.under != "") {
				t.Errorf("the sentence under the title names a scenario: %v, want %v: %s", got, tt.under != "", meta)
			} else if tt.under != "" && !strings.Contains(meta, "Under the scenario “"+tt.under+"”") {
				t.Errorf("the sentence under the title does not name %q: %s", tt.under, meta)
			}
			page := root.find(func(n *node) bool { return n.name == "section" && n.attrs["id"] == "scenarios" })
			if tt.cases == nil {
				if len(page) != 0 {
					t.Fatal("a page of scenarios for a file without scenarios")
				}
				return
			}
			if len(page) != 1 {
				t.Fatalf("%d pages of scenarios, want 1", len(page))
			}
			base, err := plan.Parse("plan.yaml", tt.yaml, plan.MonthOf(2026, 12))
			if err != nil {
				t.Fatal(err)
			}
			goals := base.Goals
			if i := slices.Index(tt.args, "--goal"); i >= 0 {
				goals = []*plan.Goal{base.Goal(tt.args[i+1])}
			}
			// what each scenario changes, as --set writes it
			var terms []string
			for _, dt := range page[0].find(func(n *node) bool { return n.name == "dt" }) {
				terms = append(terms, dt.allText())
			}
			if !slices.Equal(terms, tt.cases) {
				t.Errorf("the page lists the cases %q, want %q", terms, tt.cases)
			}
			// a report of one goal names no other goal
			for _, g := range base.Goals {
				if !slices.Contains(goals, g) && strings.Contains(page[0].allText(), g.Name) {
					t.Errorf("the page of a report of %s names %s", goals[0].Name, g.Name)
				}
			}
			// one row a goal and case, the goals in file order, each row's
			// projected balance and status the plan's for that case
			rows := page[0].find(func(n *node) bool { return n.name == "tr" && n.parent.name == "tbody" })
			if len(rows) != len(goals)*len(tt.cases) {
				t.Fatalf("%d rows, want %d goals × %d cases", len(rows), len(goals), len(tt.cases))
			}
			for i, c := range tt.cases {
				p := base
				if c != "base" {
					if p, err = base.WithScenario(c); err != nil {
						t.Fatal(err)
					}
				}
				st := plan.StatusOf(p)
				for j, g := range goals {
					var gs plan.GoalStatus
					for _, s := range st.Goals {
						if s.Goal.Name == g.Name {
							gs = s
						}
					}
					cells := rows[j*len(tt.cases)+i].elems()
					got := []string{cells[0].allText(), cells[1].allText(), cells[3].allText()}
					want := []string{g.Name, c, amt(p, gs.Projected)}
					if !slices.Equal(got, want) {
						t.Errorf("row %d: %q, want %q (plan.StatusOf under %q)", j*len(tt.cases)+i+1, got, want, c)
					}
				}
			}
			if !strings.Contains(page[0].allText(), "Note: "+noteText) {
				t.Error("the page of scenarios has no note")
			}
		})
	}
	var stdout, stderr bytes.Buffer
	t.Chdir(t.TempDir())
	if err := os.WriteFile("budget.yaml", examples.Budget, 0o644); err != nil {
		t.Fatal(err)
	}
	argv := []string{"cairn", "report", "budget.yaml", "--scenarios", "--out", "-", "--as-of", "2026-12"}
	if code := run(argv, strings.NewReader(""), &stdout, &stderr, fixedNow); code != exitBadInput || !strings.Contains(stderr.String(), "--scenarios: no scenarios to show") {
		t.Errorf("%q: exit %d, %q; want exit %d, --scenarios: no scenarios to show", argv, code, stderr.String(), exitBadInput)
	}
	if stdout.Len() > 0 {
		t.Errorf("%q wrote a report:\n%.200s", argv, stdout.String())
	}
}

// TestReport_BandsShareOneBudget: the report's bands share one simulation
// budget (plan.MaxReportSimulationSteps), so a file of many volatile goals
// still prints: the goals simulated first get their band, a goal past what
// is left is shown without one and its page says why (issue 13's report
// bound, common practice, no source). Each goal here is 2,000 paths over
// about 3,600 events of 150 years of monthly deposits (an interest date
// and a deposit a month, the deposit carrying the month's end), about 7.2
// million steps, so 20 of 150 million fit and 24 goals do not.
func TestReport_BandsShareOneBudget(t *testing.T) {
	if testing.Short() {
		t.Skip("twenty simulations")
	}
	var b strings.Builder
	b.WriteString("cairn: 1\nstart: 2027-01\ngoals:\n")
	for i := range 24 {
		fmt.Fprintf(&b, "  - name: g%d\n    rate: 5%%\n    volatility: 10%%\n    target: 1M\n    by: 2176-12\n    deposits:\n      - {amount: 100, every: month}\n", i)
	}
	page := string(reportOf(t, []byte(b.String())))
	refused := strings.Count(page, "not simulated in this report")
	if refused == 0 || refused > 5 { // one line a goal: none here has withdrawals
		t.Errorf("%d goals' pages say they are not simulated in this report, want the last four or so of 24", refused)
	}
	if !strings.Contains(page, "5–95 % of simulated paths") {
		t.Errorf("no goal has its band")
	}
}
