// Command termwright builds, checks, explains and publishes term timetables.
package main

import (
	"os"
)

func main() {
	os.Exit(run(os.Args[1:], newEnv()))
}
