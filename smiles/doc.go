// Package smiles reads OpenSMILES strings (the open specification at
// opensmiles.org) into a graph.Mol.
//
// # Overview
//
// Parse reads one SMILES string and returns a perceived molecule: implicit
// hydrogens assigned, atoms written aromatic kekulized, rings and
// aromaticity perceived (see graph.Mol.Perceive):
//
//	m, err := smiles.Parse("c1cc[nH]c1")
//	if err != nil {
//		fmt.Fprintln(os.Stderr, err)
//		fmt.Fprintln(os.Stderr, smiles.Caret(src, err.(smiles.ErrorList)[0].Pos))
//	}
//
// Supported: the organic subset (B C N O P S F Cl Br I * and aromatic
// b c n o p s), bracket atoms [isotope symbol chiral hcount charge class]
// with every element symbol and aromatic se, as, te; bonds - = # $ : / \;
// branches; ring bonds 0–9, %nn and %(nnn) with ring-bond orders; '.'
// components; '@' and '@@' (also @TH1/@TH2; other extended classes are
// accepted and ignored with a Warning).
//
// Hydrogens written as [H] (isotope 0 or 1, uncharged) and bonded to one
// heavy atom are folded into that atom's ExplicitH, so atom indices count
// the heavy atoms in written order. [2H], [H+] and [H][H] stay atoms.
//
// # Errors
//
// Errors are an ErrorList of *Error, each with a 0-based byte offset and a
// message of the form "expected X, found Y" or a problem plus its likely
// cause ("unclosed ring bond 1 (SMILES may be truncated)"). The parser goes
// on after an error and reports up to 10 per string, one per position.
// Chemistry problems found by graph.Mol.Perceive (impossible valence,
// aromatic atom outside a ring, failed kekulization) come back the same
// way, positioned at the atom. Caret draws the input with a caret under a
// position; the package itself never prints.
//
// The scanner (scanner.go) turns the string into tokens, treating a whole
// bracket atom as one token that bracket.go parses; parser.go builds the
// molecule in one pass and build.go folds the hydrogens.
package smiles
