package plan

import (
	"strings"
	"testing"
)

// TestParse_YAMLSlips checks that a slip in the file's YAML is reported
// where it is, in cairn's words. Lines and columns are counted by hand in
// each input (1-based, in characters); the library itself names only the
// line where the enclosing block began, with column 1.
func TestParse_YAMLSlips(t *testing.T) {
	const head = "cairn: 1\nstart: 2027-01\ngoals:\n"
	tests := []struct {
		name, text string
		pos        string // line:col
		msg        string // must appear within the message
	}{
		{"key indented less than the key above", "  - name: x\n   balance: 5\n", "5:4", `indented less than the key above it ("name" on line 4 starts at column 5)`},
		{"key indented more than the key above", "  - name: a\n    balance: 5\n      rate: 4%\n", "6:7", `indented more than the key above it ("balance" on line 5 starts at column 5)`},
		{"list item without its dash", "  - name: a\n    balance: 5\n  name: b\n", "6:3", "a list item needs '- '"},
		{"list items not lined up", "  - name: a\n    balance: 5\n   - name: b\n", "6:4", "list item is not lined up with the one above it ('- ' on line 4 starts at column 3)"},
		{"items at the key's column", "- name: a\n  balance: 5\n - name: b\n", "6:2", "not lined up"},
		{"key under a list item", "  - name: a\n    deposits:\n     - amount: 5\n      every: month\n", "7:7", `indented less than the key above it ("amount" on line 6 starts at column 8)`},
		{"unclosed double quote", "  - name: \"abc\n    balance: 5\n", "4:11", "this quote is never closed"},
		{"unclosed single quote", "  - name: 'abc\n    balance: 5\n", "4:11", "this quote is never closed"},
		{"unclosed bracket", "  - name: a\n    balance: [1, 2\n    rate: 5\n", "5:14", "this '[' is never closed"},
		{"unclosed brace", "  - name: a\n    rate: {4%\n", "5:11", "this '{' is never closed"},
		{"block list inside brackets", "  [\n  - name: x\n", "4:3", "this '[' is never closed"},
		{"key without colon", "  - name: a\n    balance 5\n    rate: 4%\n", "5:5", "needs a key and ':'"},
		{"key without colon after blank lines", "  - name: a\n    balance: 5\n\n\n\n    rate 4%\n", "9:5", "needs a key and ':'"},
		{"colon in a plain value", "  - name: a: b\n", "4:12", "a value with ': ' in it must be put in quotes"},
		{"text after a quoted value", "  - name: a\n    balance: \"5\" x\n", "5:18", "text after the closing quote"},
		{"at sign starts a value", "  - name: a\n    name: @x\n", "5:11", `"@" cannot start a value`},
		{"backquote starts a value", "  - name: a\n    rate: `x`\n", "5:11", "\"`\" cannot start a value"},
		{"unknown escape", "  - name: \"a\\q\"\n", "4:13", `\q is not an escape`},
		{"alias to no anchor", "  - name: *nope\n", "4:11", "*nope refers to no anchor"},
		{"comments do not count", "  - name: a # c\n    balance: 5 # c: d\n   rate: 4%\n", "6:4", "indented less than the key above it"},
		{"slip far below its block", strings.Repeat("  - name: g\n    balance: 5\n", 50) + "  - name: last\n     balance: 5\n", "105:6", `indented more than the key above it ("name" on line 104`},
		// Issue 13 item 14: YAML features cairn does not read, in its own words.
		{"merge key", "  - name: a\n    b: &x {c: 1}\n    <<: *x\n", "6:5", "merge keys (<<) are not supported"},
		{"thousands comma in braces", "  - name: a\n    deposits: [{amount: 1,000, every: month}]\n", "5:25", `"1,000" reads as two values`},
		{"thousands comma in brackets", "  - name: a\n    deposits:\n      - amount: [1,500]\n", "6:18", `"1,500" reads as two values`},
		// Issue 13 item 6: one document.
		{"second document", "  - name: a\n---\ngoals: []\n", "5:1", "a goals file is one YAML document"},
		{"document end then more", "  - name: a\n...\ngoals: [\n", "5:1", "a goals file is one YAML document"},
		// Issue 13 item 13: control and invisible characters, where they stand.
		{"escape in a plain name", "  - name: ab\x1b[2Jc\n", "4:13", "control character U+001B here"},
		{"bidi override after wide text", "  - name: 日本\u202efund\n", "4:13", "invisible character U+202E here"},
		{"zero-width space in a key", "  - na\u200bme: a\n", "4:7", "invisible character U+200B here"},
		{"bell inside a quoted value", "  - name: \"a # b\x07\"\n", "4:17", "control character U+0007 here"},
		{"control character in a comment", "  - name: a # \x1b]0;x\x07\n", "4:15", "control character U+001B here"},
		{"escape written as an escape", "  - name: \"a\\x1bb\"\n", "4:11", "this value holds control character U+001B (written as an escape)"},
		{"bidi written as an escape", "  - name: x\n    target: \"1\\u202e0\"\n", "5:13", "this value holds invisible character U+202E"},
		{"invisible character in a multi-line quoted value", "  - name: \"a\n     #\u200b\"\n", "5:7", "invisible character U+200B here"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Parse("f.yaml", []byte(head+tt.text), MonthOf(2026, 12))
			el, ok := err.(ErrorList)
			if !ok || len(el) == 0 {
				t.Fatalf("Parse(%q) = %v, want a positioned error", tt.text, err)
			}
			got := el[0].Error()
			if want := "f.yaml:" + tt.pos + ": "; !strings.HasPrefix(got, want) || !strings.Contains(got, tt.msg) {
				t.Errorf("Parse(%q):\n got %s\nwant %s…%s", tt.text, got, want, tt.msg)
			}
		})
	}
}

// TestParse_OneDocumentMarkers checks the document markers that stay
// allowed: one before the content, and a trailing one with nothing after it
// but comments.
func TestParse_OneDocumentMarkers(t *testing.T) {
	const body = "cairn: 1\nstart: 2027-01\ngoals:\n  - name: a\n    balance: 5\n    target: 10\n    by: 2030-01\n"
	for _, text := range []string{
		"---\n" + body,
		"%YAML 1.1\n---\n" + body,
		body + "---\n",
		body + "...\n# the end\n",
		strings.Replace(body, "    balance: 5\n", "    balance: 5\n    rate: [{from: 2027-01,rate: 4%}]\n", 1), // dates are not a split number
		"# \u202e invisible characters in comments are allowed \u200b\n" + body + "# \u200b\n",
		strings.Replace(body, "name: a", "name: \"a # \u200d\" # \u202e", 1), // a joiner in a name
	} {
		if _, err := Parse("f.yaml", []byte(text), MonthOf(2026, 12)); err != nil {
			t.Errorf("Parse(%q) = %v, want no error", text, err)
		}
	}
}

// TestPrechecks holds the quick whole-file checks to the passes they let
// skip: anyHidden is true exactly when some character is one hiddenRune
// refuses, and hasMarkerLine whenever secondDocument could find a marker.
// Common practice, no source: each input names the character or line at
// stake.
func TestPrechecks(t *testing.T) {
	tests := []struct {
		name, text     string
		hidden, marker bool
	}{
		{"plain text", "cairn: 1\ngoals:\n  - name: a # note\n", false, false},
		{"tab, carriage return and line feed", "a:\tb\r\nc: d\n", false, false},
		{"letters beyond ASCII", "name: Épargne — 家\n", false, false},
		{"joiners", "name: a\u200db\u200cc\n", false, false},
		{"escape character", "name: a\x1bb\n", true, false},
		{"delete character", "name: a\x7fb\n", true, false},
		{"right-to-left override", "name: a\u202eb\n", true, false},
		{"line separator", "name: a\u2028b\n", true, false},
		{"no-break space", "name: a\u00a0b\n", false, false},
		{"soft hyphen", "name: a\u00adb\n", true, false},
		{"C1 control", "name: a\u0085b\n", true, false},
		{"marker on the first line", "---\ncairn: 1\n", false, true},
		{"end marker after content", "cairn: 1\n...\n", false, true},
		{"dashes inside a line", "name: a---b\n", false, false},
		{"dashes after indentation", "a:\n  --- b\n", false, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			data := []byte(tt.text)
			slow := false
			for _, r := range tt.text {
				slow = slow || hiddenRune(r)
			}
			if got := anyHidden(data); got != tt.hidden || got != slow {
				t.Errorf("anyHidden(%q) = %v, want %v (hiddenRune on each character: %v)", tt.text, got, tt.hidden, slow)
			}
			if got := hasMarkerLine(data); got != tt.marker {
				t.Errorf("hasMarkerLine(%q) = %v, want %v", tt.text, got, tt.marker)
			}
			if _, ok := secondDocument(data); ok && !tt.marker {
				t.Errorf("secondDocument(%q) found a marker that hasMarkerLine missed", tt.text)
			}
		})
	}
}
