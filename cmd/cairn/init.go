package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"

	"github.com/urfave/cli/v2"

	"cairn/cmd/cairn/internal/render"
	"cairn/examples"
)

func initCommand(e *env) *cli.Command {
	return &cli.Command{
		Name:      "init",
		Usage:     "write the example household file to start from",
		ArgsUsage: "[FILE]",
		Description: "Writes an invented household's goals (default: cairn.yaml) to edit into your own,\n" +
			"and beside it " + schemaFile + ", the JSON Schema that its first line names for editors.\n" +
			"It never overwrites an existing file unless --force is given; - writes the goals to\n" +
			"standard output.\n\n" +
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
			if filepath.Base(name) == schemaFile {
				return usagef("name the goals file otherwise, such as cairn.yaml", "%s is where init writes the schema beside the goals file", name)
			}
			if err := writeFileAtomic(name, examples.Household, c.Bool("force")); err != nil {
				return err
			}
			text := fmt.Sprintf("wrote %s: an invented household to edit into your own\n", name)
			// the schema an editor reads, beside the file; one already there
			// is kept unless it is this version's or --force is given
			schema := filepath.Join(filepath.Dir(name), schemaFile)
			old, err := os.ReadFile(schema)
			_, lerr := os.Lstat(schema)
			switch {
			case err == nil && bytes.Equal(old, goalsSchema()):
				text += fmt.Sprintf("%s is up to date\n", schema)
			case lerr == nil && !c.Bool("force"):
				text += fmt.Sprintf("kept %s, which differs from this version's (--force replaces it)\n", schema)
			default:
				if err := writeFileAtomic(schema, goalsSchema(), c.Bool("force")); err != nil {
					return err
				}
				text += fmt.Sprintf("wrote %s: the schema your editor checks and completes %s by\n", schema, filepath.Base(name))
			}
			text += fmt.Sprintf("next: cairn status %s\n", name)
			d := newDoc(nil, false)
			d.Blocks = []render.Block{render.Pre{Text: text}}
			return d.Write(e.stdout, e.stderr, render.FormatText)
		},
	}
}
