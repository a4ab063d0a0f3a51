// Command pqfab turns a solved planar-quad gridshell net into fabrication
// data. Run `pqfab help` for the commands.
package main

import (
	"fmt"
	"os"
)

func main() {
	if err := run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr); err != nil {
		fmt.Fprintln(os.Stderr, "pqfab:", err)
		printOthers(os.Stderr, err)
		os.Exit(exitCode(err))
	}
}
