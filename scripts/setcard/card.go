package main

import "io"

// cmdCard writes the site card. The card layout is its own issue; until it
// lands the command says so.
func cmdCard(args []string, stdout, stderr io.Writer) error {
	return usageError{"card is not available in this build"}
}
