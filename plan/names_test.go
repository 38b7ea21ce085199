package plan

import (
	"fmt"
	"testing"
	"unicode"
)

// The rules here are cairn's own (common practice, no source); the
// character categories are Unicode's, as Go's unicode package has them.
func TestSameName(t *testing.T) {
	tests := []struct {
		a, b string
		want bool
	}{
		{"Emergency fund", "emergency FUND", true},
		{"Emergency fund", "Emergency  fund", true},
		{"Emergency fund", "Emergency\tfund", true},
		{"Emergency fund", "Emergency\u00a0fund", true}, // no-break space
		{"Emergency fund", " Emergency fund ", true},
		{"Emergency fund", "Emergency \u200dfund", true}, // zero-width joiner
		{"Emergency fund", "Emergency\u200b fund", true}, // zero-width space
		{"Emergency fund", "Emergencyfund", false},
		{"Car", "Car 2", false},
		{"", "", true},
	}
	for _, tt := range tests {
		if got := sameName(tt.a, tt.b); got != tt.want {
			t.Errorf("sameName(%q, %q) = %v, want %v", tt.a, tt.b, got, tt.want)
		}
	}
}

// TestHiddenRune_ASCII holds the ASCII shortcut of hiddenRune to its rule
// (Unicode's control and formatting categories, as Go's unicode package
// has them, less tab and line breaks).
func TestHiddenRune_ASCII(t *testing.T) {
	for r := rune(0); r < 0x80; r++ {
		want := (unicode.IsControl(r) || unicode.Is(unicode.Cf, r)) && r != '\t' && r != '\n' && r != '\r'
		if got := hiddenRune(r); got != want {
			t.Errorf("hiddenRune(%U) = %v, want %v", r, got, want)
		}
	}
}

// TestPlainName holds the shortcut of nameKey to the rule: a name that
// plainName passes is unchanged by foldName.
func TestPlainName(t *testing.T) {
	tests := []struct {
		in   string
		want bool
	}{
		{"Emergency fund", true},
		{"Car 2 (used)", true},
		{"", true},
		{"Emergency  fund", false},
		{" Emergency", false},
		{"Emergency ", false},
		{"Emergency\tfund", false},
		{"a\x7fb", false},
		{"Épargne", false},
		{"a\u200db", false},
	}
	for _, tt := range tests {
		if got := plainName(tt.in); got != tt.want {
			t.Errorf("plainName(%q) = %v, want %v", tt.in, got, tt.want)
		}
		if plainName(tt.in) && foldName(tt.in) != tt.in {
			t.Errorf("foldName(%q) = %q, but plainName passes it", tt.in, foldName(tt.in))
		}
	}
	for c := 0; c < 0x80; c++ {
		s := "a" + string(rune(c)) + "b"
		if plainName(s) && foldName(s) != s {
			t.Errorf("foldName(%q) = %q, but plainName passes it", s, foldName(s))
		}
	}
}

func TestCleanName(t *testing.T) {
	for in, want := range map[string]string{
		"  Car  fund ":     "Car fund",
		"Car\t\u00a0fund":  "Car fund",
		"Car\u3000fund":    "Car fund", // ideographic space
		"👩\u200d👧 college": "👩\u200d👧 college",
	} {
		if got := cleanName(in); got != want {
			t.Errorf("cleanName(%q) = %q, want %q", in, got, want)
		}
	}
}

func TestHiddenText(t *testing.T) {
	tests := []struct {
		s    string
		want string // "" for none, else what and the place
	}{
		{"Car fund", ""},
		{"Car\tfund", ""},
		{"日本 fund", ""},
		{"👩\u200d👧", ""},
		{"Car\x1b[31m", "control character U+001B at 3"},
		{"Car\x7f", "control character U+007F at 3"},
		{"Car\u009b", "control character U+009B at 3"},
		{"é\u202efund", "invisible character U+202E at 1"},
		{"a\u200bb", "invisible character U+200B at 1"},
		{"a\ufeffb", "invisible character U+FEFF at 1"},
		{"a\u2028b", "invisible character U+2028 at 1"},
		{"a\nb", ""},
	}
	for _, tt := range tests {
		what, at, ok := HiddenText(tt.s)
		got := ""
		if ok {
			got = fmt.Sprintf("%s at %d", what, at)
		}
		if got != tt.want {
			t.Errorf("HiddenText(%q) = %q, want %q", tt.s, got, tt.want)
		}
	}
}
