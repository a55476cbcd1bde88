// Package graph holds the molecule that every other part of shiftwise works
// on: atoms, bonds, hydrogens, rings, aromaticity, formula and masses, and,
// built on them, the topological symmetry of the atoms and the proton
// environments that an 1H NMR spectrum shows.
//
// # Molecule
//
// A Mol is an int-indexed graph of heavy atoms. Hydrogens are counts on
// their atoms (Atom.ImplicitH plus Atom.ExplicitH); a hydrogen is named by a
// Proton{Atom, Index}. The smiles package builds a Mol and calls Perceive;
// code and tests may also build one with AddAtom and AddBond.
//
// # Symmetry classes
//
// SymmetryClasses ranks atoms by iterative refinement of local invariants
// (element, isotope, charge, H count, degree, aromaticity, ring membership,
// bond codes), in the manner of Morgan's algorithm and Weininger's canonical
// ranking, without breaking ties: equal class means topologically
// equivalent. Written stereo is not used, so enantiotopic atoms (the two
// CH of meso-tartaric acid) share a class, as they share a signal. The
// partition is cross-checked against RDKit's Chem.CanonicalRankAtoms with
// breakTies=False on a hand-assembled corpus of 667 molecules
// (graph/rdkit_test.go, testdata/smiles_corpus.tsv).
//
// # Proton environments
//
// Environments groups hydrogens into chemically distinct sets. It starts
// from the symmetry class of each proton's heavy atom, refines it by the
// geometry of C=C bonds and by pairs of like groups that NMR tells apart
// (the two N-CH3 of DMF, the isopropyl CH3 of valine, the two CH3 of a
// prenyl group), and splits the two H of =CH2 and of diastereotopic CH2
// groups and primary amide NH2 (see Environments for the exact,
// deliberately conservative rules). Each set records its kind (CH3, CH2, CH,
// CH4, =CH2, =CH, ArH, CHO, ≡CH, OH, COOH, H2O, NH, NH2, NH3+, NH+, SH,
// HCl, and element+H such as SiH3 for the rest), whether it exchanges (H on
// O, N, S and hydrogen halides), and whether its members are magnetically
// equivalent: each has the same coupling to every spin outside the set, as
// judged from the bond path (see envMagnetic). The ring H of
// 4-chloroanisole form two sets of two that are chemically but not
// magnetically equivalent (an AA'BB' system); benzene's six H, a CH3 or
// the CH2 of an ethyl group are magnetically equivalent.
//
// Aromatic C–H of carbocycles and of heteroaromatic rings are both "ArH".
//
// The rules are checked on textbook cases, for invariance under atom
// renumbering over the corpus, and against assigned experimental shifts of
// NMRShiftDB2 records (graph/nmrshiftdb_test.go): how many CH2 whose two H
// are listed at different shifts are split, and whether atoms of one set
// carry one shift.
//
// # Alkene geometry
//
// AlkeneView tells, for a proton on a C=C carbon, which atoms are geminal,
// cis and trans to it; ProtonRelation tells whether two vinyl protons are
// geminal, cis or trans. Geometry comes from ring constraints (rings of up
// to 7 atoms), from the / \ marks as read by OpenSMILES, or, when neither
// applies, is assumed E for the larger groups and flagged Known = false.
// It is cross-checked against RDKit's E/Z labels on the corpus.
package graph
