package plan

// Reading the goals file's YAML, and saying in cairn's words where it goes
// wrong. yaml.v3 reports a syntax error at the line where the enclosing block
// began, with no column and in the parser's terms ("did not find expected '-'
// indicator" for a slip forty lines further down). When it fails, the text is
// re-read here: a line-by-line pass over the block structure (indentation,
// list items, keys, quotes, brackets) finds the first line that does not fit
// and says why. The pass only words an error the library found; it never
// refuses a file the library accepts.

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"regexp"
	"strings"
	"sync"
	"unicode"
	"unicode/utf8"

	"gopkg.in/yaml.v3"

	"cairn/money"
)

// decodeDocument decodes data into root. data must hold one YAML document
// of plain text (no control or invisible characters outside comments);
// a YAML feature cairn does not read (merge keys) and a number cut in two by
// a comma inside [ ] or { } are refused with their position.
func decodeDocument(file string, data []byte, root *yaml.Node) *Error {
	if line, col, r, ok := hiddenChar(data); ok {
		return &Error{Pos: Position{file, line, col}, Msg: describeRune(r) + " here: a goals file holds plain text " +
			"(delete the character; it may have come with pasted text)"}
	}
	if line, ok := secondDocument(data); ok {
		return &Error{Pos: Position{file, line, 1}, Msg: "a goals file is one YAML document, but a second one starts here " +
			"(remove this line, or move what follows it into the first document)"}
	}
	dec := yaml.NewDecoder(bytes.NewReader(data))
	if err := dec.Decode(root); err != nil {
		if errors.Is(err, io.EOF) {
			*root = yaml.Node{}
			return nil
		}
		return syntaxError(file, data, err)
	}
	var rest yaml.Node
	if err := dec.Decode(&rest); err != nil && !errors.Is(err, io.EOF) {
		return syntaxError(file, data, err)
	} else if err == nil && !emptyDocument(&rest) {
		return &Error{Pos: Position{file, rest.Line, rest.Column}, Msg: "a goals file is one YAML document, but a second one starts here"}
	}
	return checkNodes(file, root)
}

var docMarker = sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(`^(---|\.\.\.)([ \t]|$)`) })

// secondDocument returns the line of a document marker (--- or ...) that
// follows content and is itself followed by content. A marker before the
// first content, and markers with only comments after them, are allowed.
func secondDocument(data []byte) (int, bool) {
	if !hasMarkerLine(data) {
		return 0, false
	}
	content, marker := false, 0
	for i, ln := range strings.Split(string(data), "\n") {
		ln = strings.TrimRight(ln, "\r")
		if m := docMarker().FindString(ln); m != "" {
			if content && marker == 0 {
				marker = i + 1
			}
			ln = ln[len(m):]
		} else if !content && strings.HasPrefix(ln, "%") {
			continue // a directive before the document
		}
		if significant(ln) {
			if marker != 0 {
				return marker, true
			}
			content = true
		}
	}
	return 0, false
}

// hasMarkerLine reports whether a line of data starts with --- or ...,
// as every document marker does.
func hasMarkerLine(data []byte) bool {
	for len(data) > 0 {
		if bytes.HasPrefix(data, []byte("---")) || bytes.HasPrefix(data, []byte("...")) {
			return true
		}
		i := bytes.IndexByte(data, '\n')
		if i < 0 {
			break
		}
		data = data[i+1:]
	}
	return false
}

func significant(ln string) bool {
	t := strings.TrimLeft(ln, " \t")
	return t != "" && t[0] != '#'
}

func emptyDocument(n *yaml.Node) bool {
	if n.Kind != yaml.DocumentNode {
		return n.Kind == 0
	}
	for _, c := range n.Content {
		if c.Kind != yaml.ScalarNode || c.Tag != "!!null" || c.Value != "" {
			return false
		}
	}
	return true
}

// checkNodes refuses control and invisible characters written as escapes
// ("\e", "\u202e"), merge keys, tags (!!binary, !anything: a goals file's
// values are read as written) and numbers split by a comma in a flow
// collection ({amount: 1,000} reads as amount 1 and a key 000).
func checkNodes(file string, n *yaml.Node) *Error {
	if n == nil {
		return nil
	}
	if n.Style&yaml.TaggedStyle != 0 {
		return &Error{Pos: Position{file, n.Line, n.Column}, Msg: fmt.Sprintf("the tag %s is not part of a goals file: write the value alone", money.Quote(n.Tag))}
	}
	if n.Kind == yaml.ScalarNode {
		if what, _, ok := HiddenText(n.Value); ok {
			return &Error{Pos: Position{file, n.Line, n.Column}, Msg: "this value holds " + what +
				" (written as an escape): a goals file holds plain text"}
		}
	}
	if n.Kind == yaml.MappingNode {
		for i := 0; i+1 < len(n.Content); i += 2 {
			if k := n.Content[i]; k.Kind == yaml.ScalarNode && k.Tag == "!!merge" {
				return &Error{Pos: Position{file, k.Line, k.Column}, Msg: "merge keys (<<) are not supported in a goals file: write the keys out in full"}
			}
		}
	}
	if n.Style&yaml.FlowStyle != 0 {
		var prev *yaml.Node
		for _, c := range n.Content {
			if split(prev, c) {
				return &Error{Pos: Position{file, prev.Line, prev.Column}, Msg: fmt.Sprintf(
					"%s reads as two values: inside [ ] or { } a comma separates values (write %s, or put it in quotes)",
					money.Quote(prev.Value+","+c.Value), prev.Value+c.Value)}
			}
			prev = c
		}
	}
	for _, c := range n.Content {
		if e := checkNodes(file, c); e != nil {
			return e
		}
	}
	return nil
}

// split reports whether a and b are "1,000" cut in two by a flow
// collection: up to three digits, a comma with no space, three digits.
func split(a, b *yaml.Node) bool {
	if a == nil || a.Kind != yaml.ScalarNode || b.Kind != yaml.ScalarNode || a.Style != 0 || b.Style != 0 {
		return false
	}
	if a.Line != b.Line || b.Column != a.Column+utf8.RuneCountInString(a.Value)+1 {
		return false
	}
	return thousandsHead().MatchString(a.Value) && thousandsTail().MatchString(b.Value)
}

var (
	thousandsHead = sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(`^[-+]?[0-9]{1,3}$`) })
	thousandsTail = sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(`^[0-9]{3}(\.[0-9]*)?[kM]?$`) })
)

// syntaxError turns a yaml.v3 error into a positioned error in cairn's
// words, falling back to the library's own line and message.
func syntaxError(file string, data []byte, err error) *Error {
	fallback := yamlError(file, err)
	msg := strings.TrimPrefix(err.Error(), "yaml: ")
	if name, ok := strings.CutPrefix(msg, "unknown anchor '"); ok {
		name, _, _ = strings.Cut(name, "'")
		if line, col, ok := find(data, "*"+name); ok {
			return &Error{Pos: Position{file, line, col}, Msg: fmt.Sprintf("*%s refers to no anchor: define &%s before it, or write the value out", name, name)}
		}
		return fallback
	}
	if s, ok := findSlip(data, fallback.Pos.Line); ok {
		return &Error{Pos: Position{file, s.line, s.col}, Msg: s.msg}
	}
	return fallback
}

func find(data []byte, s string) (line, col int, ok bool) {
	for i, ln := range strings.Split(string(data), "\n") {
		if j := strings.Index(ln, s); j >= 0 {
			return i + 1, utf8.RuneCountInString(ln[:j]) + 1, true
		}
	}
	return 0, 0, false
}

// A slip is the first place where the text does not fit YAML's block
// structure, with the reason in cairn's words.
type slip struct {
	line, col int
	msg       string
}

// A level is one open block: the keys of a mapping, or the '- ' of a list,
// all at one column.
type level struct {
	col  int // 0-based
	item bool
	line int
	name string
}

func (l level) describe() string {
	if l.item {
		return fmt.Sprintf("the list item above it ('- ' on line %d starts at column %d)", l.line, l.col+1)
	}
	return fmt.Sprintf("the key above it (%s on line %d starts at column %d)", money.Quote(l.name), l.line, l.col+1)
}

// scan is the state of findSlip's pass over the lines.
type scan struct {
	from   int // report only slips on or after this line
	stack  []level
	open   bool // the line above ends in "key:" or "-": a deeper block may follow
	openAt level
	block  int    // >= 0: inside a block scalar (| or >) indented more than this
	flow   []slip // open [ and {, with where they opened
	quote  *slip  // an open multi-line quoted value
	dquote bool
	found  *slip
}

// findSlip reads data line by line and returns the first slip on or after
// line from, or, at the end, a quote or bracket never closed.
func findSlip(data []byte, from int) (slip, bool) {
	s := &scan{from: from, block: -1}
	lines := strings.Split(string(data), "\n")
	for i, ln := range lines {
		s.line(i+1, strings.TrimRight(ln, "\r"))
		if s.found != nil {
			return *s.found, true
		}
	}
	if s.quote != nil {
		return slip{s.quote.line, s.quote.col, "this quote is never closed (a value that starts with a quote must end with the same quote)"}, true
	}
	if len(s.flow) > 0 {
		o := s.flow[0]
		return slip{o.line, o.col, o.msg}, true
	}
	return slip{}, false
}

func (s *scan) slipf(line, off int, text, format string, args ...any) {
	if s.found == nil && line >= s.from {
		s.found = &slip{line, utf8.RuneCountInString(text[:off]) + 1, fmt.Sprintf(format, args...)}
	}
}

func (s *scan) line(n int, text string) {
	if s.quote != nil || len(s.flow) > 0 {
		s.inline(n, text, 0)
		return
	}
	ind := len(text) - len(strings.TrimLeft(text, " "))
	if s.block >= 0 {
		if !significant(text) || ind > s.block {
			return
		}
		s.block = -1
	}
	if !significant(text) {
		return
	}
	if docMarker().MatchString(text) || len(s.stack) == 0 && text[0] == '%' { // a directive
		s.stack, s.open = nil, false
		return
	}
	s.place(n, text, ind)
	if s.found == nil {
		s.rest(n, text, ind)
	}
}

// place finds the block that a line starting at column ind belongs to.
func (s *scan) place(n int, text string, ind int) {
	item := isItem(text[ind:])
	if len(s.stack) == 0 || s.open && (ind > s.top().col || item && ind == s.openAt.col && !s.openAt.item) {
		s.open = false
		s.stack = append(s.stack, level{col: ind, item: item, line: n, name: keyName(text[ind:])})
		return
	}
	s.open = false
	var popped *level
	for len(s.stack) > 0 && s.top().col > ind {
		l := s.top()
		popped = &l
		s.stack = s.stack[:len(s.stack)-1]
	}
	if len(s.stack) == 0 {
		s.slipf(n, ind, text, "this line is indented less than the first line of the file (column %d)", popped.col+1)
		return
	}
	top := s.top()
	switch {
	case top.col < ind && popped != nil && item && top.item:
		s.slipf(n, ind, text, "this list item is not lined up with the one above it ('- ' on line %d starts at column %d)", top.line, top.col+1)
	case top.col < ind && popped != nil:
		s.slipf(n, ind, text, "this line is indented less than %s; line it up with the key it belongs beside", popped.describe())
	case top.col < ind:
		if item || keyName(text[ind:]) != "" {
			s.slipf(n, ind, text, "this line is indented more than %s", top.describe())
		}
	case top.item && !item:
		if len(s.stack) > 1 && s.stack[len(s.stack)-2].col == ind {
			s.stack = s.stack[:len(s.stack)-1] // the list sat at its key's column
			s.place(n, text, ind)
			return
		}
		s.slipf(n, ind, text, "a list item needs '- ': this line is in the list that starts on line %d (column %d)", top.line, top.col+1)
	case !top.item && item:
		s.slipf(n, ind, text, "a list item ('- ') where a key was expected: the keys here start at column %d (%s on line %d); a list goes under a key ending in ':'",
			top.col+1, money.Quote(top.name), top.line)
	case !top.item && keyName(text[ind:]) == "":
		s.slipf(n, ind, text, "this line needs a key and ':' (key: value), like the lines above it")
	case !top.item:
		s.stack[len(s.stack)-1].line, s.stack[len(s.stack)-1].name = n, keyName(text[ind:]) // the key above the next line
	}
}

// top returns the innermost open block: the document itself, at column 0,
// when none is (every line so far slipped out of the blocks above it).
func (s *scan) top() level {
	if len(s.stack) == 0 {
		return level{}
	}
	return s.stack[len(s.stack)-1]
}

// rest reads what follows the indentation: list dashes, a key, a value.
func (s *scan) rest(n int, text string, off int) {
	for isItem(text[off:]) {
		col := off
		off++
		for off < len(text) && text[off] == ' ' {
			off++
		}
		if off >= len(text) || text[off] == '#' {
			s.open, s.openAt = true, level{col: col, item: true, line: n}
			return
		}
		if isItem(text[off:]) || keyName(text[off:]) != "" {
			s.stack = append(s.stack, level{col: off, item: isItem(text[off:]), line: n, name: keyName(text[off:])})
		}
	}
	if k := keyName(text[off:]); k != "" {
		col := off
		off += strings.Index(text[off:], ":") + 1
		for off < len(text) && text[off] == ' ' {
			off++
		}
		if off >= len(text) || text[off] == '#' {
			s.open, s.openAt = true, level{col: col, line: n, name: k}
			return
		}
	}
	s.value(n, text, off)
}

// value reads a value that starts at off.
func (s *scan) value(n int, text string, off int) {
	for off < len(text) && (text[off] == '&' || text[off] == '!') { // anchor or tag
		sp := strings.IndexByte(text[off:], ' ')
		if sp < 0 { // its value on the lines below, in the block the line is in
			s.open, s.openAt = true, s.top()
			return
		}
		off += sp + 1
		for off < len(text) && text[off] == ' ' {
			off++
		}
	}
	if off >= len(text) {
		return
	}
	switch c := text[off]; c {
	case '|', '>':
		s.block = s.top().col
	case '"', '\'', '[', '{':
		s.inline(n, text, off)
	case '@', '`', '%':
		s.slipf(n, off, text, "%q cannot start a value: put the value in quotes", string(c))
	default:
		v := stripComment(text[off:])
		if i := strings.Index(v, ": "); i >= 0 || strings.HasSuffix(v, ":") {
			if i < 0 {
				i = len(v) - 1
			}
			s.slipf(n, off+i, text, "a value with ': ' in it must be put in quotes")
		}
	}
}

// inline reads quoted values and [ ] { } collections, which may span lines,
// from off to the end of the line.
func (s *scan) inline(n int, text string, off int) {
	// col returns the column of byte i, counted on from the last one asked
	// for: a line of many brackets or quotes is read in one pass, not one
	// count from its start each
	at, runes := 0, 0
	col := func(i int) int {
		runes += utf8.RuneCountInString(text[at:i])
		at = i
		return runes + 1
	}
	for i := off; i < len(text); i++ {
		c := text[i]
		if s.quote != nil {
			switch {
			case s.dquote && c == '\\':
				if i+1 < len(text) && !strings.ContainsRune("0abtnvfre \t\"/\\N_LPxuU", rune(text[i+1])) {
					s.slipf(n, i, text, "\\%c is not an escape in a double-quoted value: use single quotes, or write \\\\ for a backslash", text[i+1])
					return
				}
				i++
				continue
			case s.dquote && c == '"', !s.dquote && c == '\'' && !(i+1 < len(text) && text[i+1] == '\''):
				s.quote = nil
			case !s.dquote && c == '\'':
				i++ // '' is a quote inside single quotes
				continue
			default:
				continue
			}
		} else {
			switch c {
			case '"', '\'':
				s.quote, s.dquote = &slip{line: n, col: col(i)}, c == '"'
			case '[':
				s.flow = append(s.flow, slip{n, col(i), "this '[' is never closed (a list written on one line needs its ']')"})
			case '{':
				s.flow = append(s.flow, slip{n, col(i), "this '{' is never closed (a mapping written on one line needs its '}')"})
			case ']', '}':
				if len(s.flow) == 0 {
					s.slipf(n, i, text, "this '%c' closes nothing", c)
					return
				}
				s.flow = s.flow[:len(s.flow)-1]
			case '#':
				if i > 0 && text[i-1] == ' ' {
					return
				}
			}
		}
		if s.quote == nil && len(s.flow) == 0 {
			if t := strings.TrimSpace(stripComment(text[i+1:])); t != "" {
				j := i + 1 + strings.Index(text[i+1:], t)
				if c == '"' || c == '\'' {
					s.slipf(n, j, text, "text after the closing quote: put the whole value inside the quotes")
				} else {
					s.slipf(n, j, text, "text after the closing '%c'", c)
				}
			}
			return
		}
	}
}

func isItem(t string) bool { return t == "-" || strings.HasPrefix(t, "- ") }

// keyName returns the key of a "key: value" or "key:" line, or "".
func keyName(t string) string {
	if t == "" || strings.ContainsRune("-[{\"'&*!|>#", rune(t[0])) && !isQuotedKey(t) {
		return ""
	}
	t = stripComment(t)
	if i := strings.Index(t, ": "); i > 0 {
		return t[:i]
	}
	if strings.HasSuffix(t, ":") && len(t) > 1 {
		return t[:len(t)-1]
	}
	return ""
}

func isQuotedKey(t string) bool {
	q := t[0]
	if q != '"' && q != '\'' {
		return false
	}
	j := strings.IndexByte(t[1:], q)
	return j >= 0 && strings.HasPrefix(t[j+2:], ":")
}

func stripComment(t string) string {
	if i := strings.Index(t, " #"); i >= 0 {
		t = t[:i]
	}
	return strings.TrimRight(t, " ")
}

// hiddenChar finds the first character that hiddenRune refuses, with its
// line and column (in characters). In a comment, invisible characters are
// allowed but control characters are not (YAML forbids them anywhere; the
// position and the words are better here). A '#' starts a comment
// at the start of a line or after a space or tab, outside quotes; a quote
// opens where a value starts. A character the pass takes for a comment by
// mistake (a '#' inside a multi-line value) is still refused when the value
// is decoded, by checkNodes.
func hiddenChar(data []byte) (line, col int, r rune, ok bool) {
	if !anyHidden(data) {
		return 0, 0, 0, false // the pass below finds only what hiddenRune refuses
	}
	var quote rune // the open quote, or 0
	for i, ln := range strings.Split(string(data), "\n") {
		prev := ' ' // the character before, as if a space began the line
		lead := ' ' // the last non-space character before, ' ' at the start
		c := 0
		escaped, comment := false, false
		for _, r := range ln {
			c++
			if hiddenRune(r) && (!comment || unicode.IsControl(r)) {
				return i + 1, c, r, true
			}
			switch {
			case comment:
			case quote == '"' && escaped:
				escaped = false
			case quote == '"' && r == '\\':
				escaped = true
			case quote != 0 && r == quote:
				quote = 0 // '' inside single quotes closes and reopens
			case quote != 0:
			case (r == '"' || r == '\'') && strings.ContainsRune(" :-[{,?", lead):
				quote = r
			case r == '#' && (prev == ' ' || prev == '\t'):
				comment = true
			}
			prev = r
			if r != ' ' && r != '\t' {
				lead = r
			}
		}
	}
	return 0, 0, 0, false
}

// anyHidden reports whether data holds any character that hiddenRune
// refuses.
func anyHidden(data []byte) bool {
	for i := 0; i < len(data); {
		r, size := rune(data[i]), 1
		if r >= utf8.RuneSelf {
			r, size = utf8.DecodeRune(data[i:])
		}
		if hiddenRune(r) {
			return true
		}
		i += size
	}
	return false
}
