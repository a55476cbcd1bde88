package jrules_test

import (
	"fmt"

	"shiftwise/graph"
	"shiftwise/jrules"
	"shiftwise/smiles"
)

// ExampleBetween estimates the vinyl couplings of trans-ethyl cinnamate.
func ExampleBetween() {
	m, err := smiles.Parse(`CCOC(=O)/C=C/c1ccccc1`)
	if err != nil {
		panic(err)
	}
	j, ok := jrules.Between(m, graph.Proton{Atom: 5}, graph.Proton{Atom: 6})
	fmt.Println(ok, j.Rule)
	fmt.Printf("%.1f Hz (%.1f–%.1f), %d bonds\n", j.Typical, j.Min, j.Max, j.NBonds)
	// Output:
	// true 3J vinyl trans, substituent-corrected
	// 15.9 Hz (14.4–17.4), 3 bonds
}

// ExampleKarplus evaluates the Karplus function at the chair dihedrals.
func ExampleKarplus() {
	for _, phi := range []float64{60, 180} {
		fmt.Printf("J(%3.0f°) = %.2f Hz\n", phi, jrules.Karplus(phi))
	}
	// Output:
	// J( 60°) = 2.79 Hz
	// J(180°) = 10.26 Hz
}
