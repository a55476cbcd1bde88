package smiles_test

import (
	"fmt"

	"shiftwise/smiles"
)

// Aspirin: formula and molecular weight as listed for acetylsalicylic acid
// (C9H8O4, 180.16 g/mol; common fact of the trade).
func ExampleParse() {
	m, err := smiles.Parse("CC(=O)Oc1ccccc1C(=O)O")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s %.2f %d rings\n", m.Formula(), m.AverageMass(), len(m.Rings()))
	// Output: C9H8O4 180.16 1 rings
}

func ExampleCaret() {
	src := "C1CCC"
	_, err := smiles.Parse(src)
	l, _ := smiles.AsList(err)
	fmt.Println(l[0])
	fmt.Println(smiles.Caret(src, l[0].Pos))
	// Output:
	// smiles: col 2: unclosed ring bond 1 (SMILES may be truncated)
	// C1CCC
	//  ^
}
