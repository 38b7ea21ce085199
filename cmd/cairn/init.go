package main

import (
	"fmt"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/examples"
)

func initCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "init",
		Usage:     "write the example household file to start from",
		ArgsUsage: "[FILE]",
		Description: "Writes an invented household's goals (default: cairn.yaml) to edit into your own.\n" +
			"It never overwrites an existing file unless --force is given; - writes to standard output.\n\n" +
			"Example:\n   cairn init\n   cairn init our-plan.yaml",
		Flags: []cli.Flag{
			&cli.BoolFlag{Name: "force", Usage: "overwrite an existing file"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() > 1 {
				return usagef("", "init takes at most one FILE")
			}
			name := c.Args().First()
			if name == "" {
				name = "cairn.yaml"
			}
			if name == "-" {
				return writeStdout(e, examples.Household)
			}
			if err := writeFileAtomic(name, examples.Household, c.Bool("force"), ""); err != nil {
				return err
			}
			d := newDoc(nil, false)
			d.Blocks = []render.Block{render.Pre{Text: fmt.Sprintf("wrote %s: an invented household to edit into your own\nnext: cairn status %s\n", name, name)}}
			return d.Write(e.stdout, e.stderr, render.FormatText)
		},
	}
}
