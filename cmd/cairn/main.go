// Command cairn is a savings and retirement planner for households: it reads
// a household's goals from one YAML file and answers whichever quantity is
// unknown — how long, how much to deposit, what rate, what starting sum,
// what withdrawal, how long the money lasts — with the equation of value
// behind every answer. It is a planning aid, not financial advice.
//
// Run `cairn --help` for the commands and `cairn help file` for the goals
// file.
package main

import (
	"os"
	"time"
)

// Version is the release version; it can be set at link time with
// -ldflags "-X main.Version=…".
var Version = "0.1.0"

func main() {
	os.Exit(run(os.Args, os.Stdin, os.Stdout, os.Stderr, time.Now))
}
