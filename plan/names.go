package plan

// Names and the text they may hold. A goals file is plain text: control
// characters and invisible formatting characters are refused where they
// stand (see hiddenRune); white space inside a name is read as one space;
// and two names are the same name when they differ only in case, in white
// space, or in the joiners some scripts and emoji need (sameName).

import (
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"

	"cairn/money"
)

// sameName reports whether a and b name the same goal or stream: equal
// after folding case, reading each run of white space as one space, trimming
// it from the ends, and dropping invisible characters.
func sameName(a, b string) bool { return strings.EqualFold(nameKey(a), nameKey(b)) }

// nameKey is s with each white-space run one space, the ends trimmed and
// invisible characters dropped.
func nameKey(s string) string {
	if plainName(s) {
		return s
	}
	return foldName(s)
}

// foldName is nameKey for any s.
func foldName(s string) string {
	var b strings.Builder
	space := false
	for _, r := range s {
		switch {
		case unicode.IsSpace(r):
			space = b.Len() > 0
			continue
		case unicode.Is(unicode.Cf, r) || unicode.IsControl(r):
			continue
		}
		if space {
			b.WriteByte(' ')
			space = false
		}
		b.WriteRune(r)
	}
	return b.String()
}

// plainName reports whether s is its own nameKey: printable ASCII with
// single spaces between words.
func plainName(s string) bool {
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c == ' ':
			if i == 0 || i == len(s)-1 || s[i-1] == ' ' {
				return false
			}
		case c < '!' || c > '~':
			return false
		}
	}
	return true
}

// cleanName is a name as written in the file, read as the user sees it:
// each run of white space (a tab, a no-break space, several spaces) becomes
// one space, and the ends are trimmed. Joiners are kept: they change how the
// name looks.
func cleanName(s string) string { return strings.Join(strings.FieldsFunc(s, unicode.IsSpace), " ") }

// hiddenRune reports whether r may not appear in a goals file outside a
// comment, nor in a name or value given on the command line: a control
// character other than tab, newline and carriage return (C0, DEL, C1), a
// line or paragraph separator, or an invisible formatting character
// (Unicode category Cf, such as U+202E, which reverses the text after it,
// or U+200B, a zero-width space), except the zero-width joiner and
// non-joiner that several scripts and emoji need.
func hiddenRune(r rune) bool {
	if r < utf8.RuneSelf { // ASCII has no formatting characters
		return r < ' ' && r != '\t' && r != '\n' && r != '\r' || r == 0x7f
	}
	switch r {
	case '\t', '\n', '\r', '\u200c', '\u200d':
		return false
	case '\u2028', '\u2029':
		return true
	}
	return unicode.IsControl(r) || unicode.Is(unicode.Cf, r)
}

// HiddenText returns a description of the first character of s that a
// goals file or a command-line value may not hold, with its place (a rune
// index from 0), or ok false when there is none.
func HiddenText(s string) (what string, at int, ok bool) {
	i := 0
	for _, r := range s {
		if hiddenRune(r) {
			return describeRune(r), i, true
		}
		i++
	}
	return "", 0, false
}

// describeRune names a refused character without writing it: "control
// character U+001B", "invisible character U+202E".
func describeRune(r rune) string {
	if unicode.IsControl(r) {
		return fmt.Sprintf("control character U+%04X", r)
	}
	return fmt.Sprintf("invisible character U+%04X", r)
}

// named is the names given so far in one list (the goals of a file, the
// streams of a goal), each as written and as nameKey has it, with the path
// that gave it.
type named []struct{ name, key, path string }

// add records name, given at path. If an earlier one is the same name (see
// sameName), it returns words for that one — its path, and the name as it
// was written there when that is written otherwise — and true.
func (ns *named) add(name, path string) (string, bool) {
	k := nameKey(name)
	for _, n := range *ns {
		if !strings.EqualFold(n.key, k) {
			continue
		}
		if n.name == name {
			return n.path + " has it too", true
		}
		return fmt.Sprintf("%s has %s, the same name: case, spacing and invisible characters do not tell names apart", n.path, money.Quote(n.name)), true
	}
	*ns = append(*ns, struct{ name, key, path string }{name, k, path})
	return "", false
}
