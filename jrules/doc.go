// Package jrules estimates 1H–1H, 1H–19F and 1H–31P scalar coupling
// constants from the molecular graph alone: every estimate is a J with a
// typical value, a plausible range, the number of bonds and the name of the
// rule that produced it.
//
// # Scope
//
// Between covers every pair of protons two to five bonds apart; ToHetero
// covers a proton and a fluorine or phosphorus atom (spin-½, 100 % natural
// abundance) one to five bonds apart. Other nuclei (13C at 1.1 %, the
// quadrupolar 14N, 35/37Cl, 79/81Br) leave no resolved splitting in a
// routine 1H spectrum and are ignored.
//
// # Rules
//
// The rules are Go data in tables.go, each row with its source. In outline:
//
//   - geminal ²J: sp3 CH2 about −12.5 Hz (−15 to −11), more negative next to
//     a π system, small in cyclopropane; =CH2 0 to 3 Hz;
//   - vicinal ³J on freely rotating sp3 chains: 8.0 Hz for ethane lowered
//     by 0.7 Hz per unit of substituent electronegativity (Pauling scale,
//     relative to H), summed over the substituents of the H–C–C–H
//     fragment, after the linear relation of Abraham & Pachler
//     (Mol. Phys. 7, 165 (1964));
//   - ring vicinal ³J: cyclopropane, cyclobutane and cyclopentane from
//     tabulated cis/trans ranges; cyclohexane from the Karplus function
//     J(φ) = A cos²φ + B cos φ + C with A = 7.76, B = −1.10, C = 1.40 Hz
//     (the textbook coefficients quoted by Minch, Concepts Magn. Reson. 6,
//     41 (1994); value from memory), averaged over the chair flip;
//   - vinyl cis and trans ³J: ethylene (11.6 and 19.1 Hz) plus one
//     increment per substituent on the two carbons (tables.go), clamped to
//     4–12.5 Hz (cis) and 11–19.1 Hz (trans), range ±1.5 Hz; cis across a ring
//     double bond by ring size; when the SMILES does not write the geometry
//     (the graph assumes E), the range spans both the cis and the trans
//     value;
//   - aromatic ortho/meta/para, with ring-specific values for pyridine-like
//     six-membered rings and furan, thiophene and pyrrole;
//   - aldehyde H–C–C–H, diene single-bond ³J, allylic, propargylic,
//     homoallylic, homopropargylic and W-type (1,3 across a four-membered
//     ring) long-range couplings; other four- and five-bond pairs get a
//     typical value of 0 Hz with a small range ("unresolved");
//   - 1H–19F ²J, ³J (sp3 by number of fluorines, vinyl cis/trans, aromatic
//     ortho), ⁴J, ⁵J (aromatic meta and para) and 1H–31P ¹J to ⁵J with
//     P(III)/P(V) distinguished.
//
// # What is done without 3D coordinates
//
// The molecule has no coordinates, so dihedral angles are assumed from the
// ring alone: open chains are treated as freely rotating (rotamer average),
// six-membered saturated rings as rapidly flipping chairs with unknown
// relative configuration, J = (J(180°) + 3·J(60°))/4 from the Karplus
// function, with the range spanning J(60°) − 0.5 to J(180°) + 2 Hz; three- to
// five-membered rings use the mean of their tabulated cis and trans values
// with a range covering both, because ring stereo marks are not read. The
// range, not the typical value, is the honest answer in rings.
//
// # Exchangeable protons
//
// Couplings to OH and amine NH protons are reported only in DMSO-d6, where
// exchange is slow enough for them to be resolved; in CDCl3 and other
// solvents they are averaged away (common practice, no source). Amide NH
// and thiol SH couplings are usually resolved in CDCl3 too and are reported
// except in D2O and CD3OD, where those protons exchange for deuterium.
// Carboxylic acid OH never couples.
//
// # How to add a coupling rule
//
// Add a row rule{name, typical, min, max} (Hz, sign kept) to tables.go with
// its source in the comment above it, select it in hh.go (H–H) or hetero.go
// (H–F, H–P) from the topology by returning row.j(nBonds), and add a case
// naming the source of the value to TestHandbookValues, TestCommonRanges or
// TestRulesByTopology. Then run go test ./jrules ./predict (DEVELOPERS.md,
// "How to add a coupling rule", has the details).
package jrules
