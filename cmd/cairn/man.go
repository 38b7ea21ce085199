package main

import (
	"fmt"
	"strings"

	"github.com/urfave/cli/v2"
)

// manPage returns the manual page in roff for man(1), written from the same
// text as --help and `cairn help file`: the app's description, each
// command's usage, description and flags, and the goals file's help.
func manPage(app *cli.App) []byte {
	var b strings.Builder
	fmt.Fprintf(&b, ".TH CAIRN 1 \"\" \"cairn %s\" \"User Commands\"\n", roff(app.Version))
	b.WriteString(".SH NAME\ncairn \\- " + roff(app.Usage) + "\n")
	b.WriteString(".SH SYNOPSIS\n.B cairn\n.I COMMAND\n[\\fIOPTIONS\\fR] [\\fIFILE\\fR]\n")
	b.WriteString(".SH DESCRIPTION\n" + preformatted(app.Description))
	b.WriteString(".SH COMMANDS\n")
	for _, c := range app.Commands {
		if c.Hidden {
			continue
		}
		fmt.Fprintf(&b, ".SS \"%s %s\"\n%s\n", roff(c.Name), roff(c.ArgsUsage), roff(c.Usage))
		if c.Description != "" {
			b.WriteString(".PP\n" + preformatted(c.Description))
		}
		for _, f := range c.Flags {
			b.WriteString(manFlag(f))
		}
	}
	b.WriteString(".SH \"THE GOALS FILE\"\n" + preformatted(fileHelp()))
	b.WriteString(".SH \"EXIT STATUS\"\n.TP\n0\nanswered\n.TP\n1\nthe question has no answer; the reason is printed\n" +
		".TP\n2\nbad input or usage\n")
	b.WriteString(".SH \"SEE ALSO\"\n" +
		"cairn help file \\-\\-format schema writes the goals file's JSON Schema; cairn completion bash|zsh|fish " +
		"writes shell completion.\n")
	return []byte(b.String())
}

// manFlag is flag f as a tagged paragraph: its names, its value's
// placeholder, its usage and default.
func manFlag(f cli.Flag) string {
	usage, takes, def := "", false, ""
	if d, ok := f.(cli.DocGenerationFlag); ok {
		usage, takes, def = d.GetUsage(), d.TakesValue(), d.GetDefaultText()
		if def == "" {
			def = d.GetValue()
		}
	}
	placeholder := "VALUE"
	if i := strings.Index(usage, "`"); i >= 0 {
		if j := strings.Index(usage[i+1:], "`"); j >= 0 {
			placeholder = usage[i+1 : i+1+j]
			usage = usage[:i] + placeholder + usage[i+2+j:]
		}
	}
	var names []string
	for _, n := range f.Names() {
		dash := "\\-\\-"
		if len(n) == 1 {
			dash = "\\-"
		}
		names = append(names, "\\fB"+dash+roff(n)+"\\fR")
	}
	head := strings.Join(names, ", ")
	if takes {
		head += " \\fI" + roff(placeholder) + "\\fR"
	}
	text := roff(usage)
	if takes && def != "" && def != `""` && def != "false" {
		text += " (default: " + roff(strings.Trim(def, `"`)) + ")"
	}
	return ".TP\n" + head + "\n" + text + "\n"
}

// preformatted is text as written, line for line, not filled.
func preformatted(text string) string {
	var b strings.Builder
	b.WriteString(".nf\n")
	for _, line := range strings.Split(strings.TrimRight(text, "\n"), "\n") {
		if line == "" {
			b.WriteString("\n")
			continue
		}
		b.WriteString(roff(line) + "\n")
	}
	b.WriteString(".fi\n")
	return b.String()
}

// roff escapes text for roff: backslashes, hyphens as minus signs where
// they start an option, a line that would begin with a control character,
// and every character outside ASCII by its code point.
func roff(s string) string {
	s = strings.ReplaceAll(s, `\`, `\e`)
	s = strings.ReplaceAll(s, "--", `\-\-`)
	if strings.HasPrefix(s, ".") || strings.HasPrefix(s, "'") {
		s = `\&` + s
	}
	var b strings.Builder
	for _, r := range s {
		if r > 126 {
			fmt.Fprintf(&b, `\[u%04X]`, r) // roff's input is ASCII
			continue
		}
		b.WriteRune(r)
	}
	return b.String()
}
