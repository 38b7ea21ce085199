package main

import (
	"fmt"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/plan"
)

// This file makes `cairn rebase`: a new goals file starting from the latest
// actual balances (plan.Rebase), written beside the old one, never over it.

func rebaseCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "rebase",
		Usage:     "write a new goals file that starts from the latest actual balances",
		ArgsUsage: "FILE",
		Description: "Writes a copy of the goals file that starts the month after the latest actual balance of\n" +
			"any goal, each goal's balance its own at the end of the month before (re-planned from its\n" +
			"latest actual). What the balances already hold leaves the file: the actuals and\n" +
			"actuals_file, one-time amounts and streams that ended, rate steps replaced by a later one.\n" +
			"A stream that began earlier begins at the new start, at the amount then in force; amounts\n" +
			"in today's money are restated in money of the new start. Comments and scenarios are kept.\n" +
			"It never writes over a file it reads (the goals file, the actuals file), nor over another\n" +
			"file unless --force is given; --out - writes to standard output.\n\n" +
			"Example:\n   cairn rebase examples/actuals.yaml --out plan-2026.yaml",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "out", Aliases: []string{"o"}, Usage: "write the new goals file to `FILE` (- for standard output)"},
			&cli.BoolFlag{Name: "force", Usage: "overwrite an existing file (never the goals file read)"},
			&cli.StringFlag{Name: "as-of", Usage: "today's `MONTH` (YYYY-MM); no actual may be after it"},
		},
		Action: func(c *cli.Context) error {
			in := c.Args().First()
			if in == "" || in == "-" {
				return usagef("for example: cairn rebase cairn.yaml --out cairn-rebased.yaml", "rebase reads a goals file by name")
			}
			name := c.String("out")
			if name == "" {
				return usagef("for example: --out cairn-rebased.yaml", "--out needs a file name for the new goals file")
			}
			p, err := parsePlan(c, e)
			if err != nil {
				return err
			}
			data, err := readFile(in)
			if err != nil {
				return &inputError{err: err}
			}
			out, start, err := plan.Rebase(p, data)
			if err != nil {
				return &inputError{err: fmt.Errorf("%s: %v", in, err)}
			}
			if name == "-" {
				return writeStdout(e, out)
			}
			if err := writeFileAtomic(name, out, c.Bool("force"), inputsOf(p, in)...); err != nil {
				return err
			}
			d := newDoc(p, false)
			d.Lead = []string{fmt.Sprintf("Wrote %s: the plan of %s re-based to start %s, each goal's balance its balance at the end of %s.", name, in, start, start-1)}
			var ks []string
			for _, g := range p.Goals {
				if a, ok := g.Latest(); ok {
					ks = append(ks, fmt.Sprintf("%s: the actual %s of %s", g.Name, amt(p, a.Balance), a.Month))
				} else {
					ks = append(ks, g.Name+": as planned (no actual balance)")
				}
			}
			d.After = ks
			return d.Write(e.stdout, e.stderr, render.FormatText)
		},
	}
}
