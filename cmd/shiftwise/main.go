// Command shiftwise checks a measured 1H NMR spectrum against the structure
// a chemist meant to make. See README.md.
package main

import "os"

func main() { os.Exit(Main(os.Args[1:], newFactory())) }
