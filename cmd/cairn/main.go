// Command cairn is a savings and retirement planner for households.
package main

import (
	"fmt"
	"os"
)

// Version is the release version; it can be set at link time.
var Version = "0.1.0-dev"

func main() {
	fmt.Fprintf(os.Stdout, "cairn %s\n", Version)
}
