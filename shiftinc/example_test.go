package shiftinc_test

import (
	"fmt"
	"strings"

	"shiftwise/graph"
	"shiftwise/shiftinc"
	"shiftwise/smiles"
)

// The OCH2 protons of ethyl acetate (atom 1): the CH2 base value plus the
// α increment of an acyloxy group.
func ExampleTable_Proton() {
	m, err := smiles.Parse("CCOC(C)=O")
	if err != nil {
		panic(err)
	}
	e := shiftinc.Default().Proton(m, graph.Proton{Atom: 1}, "CDCl3")
	fmt.Printf("%.2f ppm, rules: %s\n", e.PPM, strings.Join(e.Rules, "; "))
	// Output: 4.12 ppm, rules: CH2 base 1.37; α-OC(=O)R +2.75
}

// A user file adds a substituent the classifier names but the embedded
// tables lack, or overrides an embedded row.
func ExampleTable_Merge() {
	t := shiftinc.Default().Clone()
	err := t.Merge(strings.NewReader(`
[[alpha]]
key = "Cl"
ch3 = 2.20
ch2 = 2.20
ch = 2.60
sd = 0.1
source = "my own measurements"
`), "rules.toml")
	fmt.Println(err)
	err = t.Merge(strings.NewReader("[[alpha]]\nkey = \"Cl\"\nch3 = high\n"), "bad.toml")
	fmt.Println(err != nil && strings.HasPrefix(err.Error(), "bad.toml:3:"))
	// Output:
	// <nil>
	// true
}
