// Package spin simulates the 1H NMR line spectrum of an isotropic spin
// system: groups of magnetically equivalent nuclei with chemical shifts and
// scalar couplings.
//
// # Conventions
//
// Frequencies are in Hz from 0 ppm at the 1H observe frequency: a group at
// δ ppm sits at ν = δ·FieldMHz Hz, so a higher shift gives a higher
// frequency. The Hamiltonian, in Hz, is
//
//	H = Σ ν_i Iz_i + Σ_{i<j} J_ij I_i·I_j
//
// and a transition from an eigenstate |a> of total Mz = M to an eigenstate |b>
// of Mz = M−1 appears at E_a − E_b with intensity |<b|F−|a>|², F− = Σ I−_i.
// With this sign choice a single spin appears at +ν, as in the first-order
// picture. Intensities are scaled so that the lines of a group sum to the
// group's Count (the sum rule: the whole spectrum sums to the number of 1H
// nuclei).
//
// # Modes
//
// FirstOrder splits each 1H group successively by all its partners: k
// equivalent spin-1/2 partners with coupling J give k+1 lines J apart with
// binomial intensities (Pascal's triangle).
//
// Exact diagonalises the Hamiltonian of each coupled cluster. The product
// basis is block-diagonal in total Mz; each block is built directly and
// diagonalised (Householder tridiagonalisation with gonum's LAPACK, then
// implicit QL with the plane rotations applied row by row, which is
// cache-friendly for row-major storage), so the full 2^n matrix is never
// formed. When the spins' frequencies are symmetric about a centre and the
// couplings symmetric under the matching exchange of spins (a mirror
// symmetry, see mirror.go), only half of the blocks are diagonalised, the
// middle block in two halves, and the other lines are mirror images. A group of n magnetically equivalent spin-1/2 nuclei is replaced by
// composite particles of total spin F (n=3: F=3/2 once and F=1/2 twice) and
// the sub-spectra are weighted by the multiplicities, which keeps clusters
// with several CH3 and CH2 groups small. Groups whose members are given
// separately but are magnetically equivalent (same shift, same couplings to
// every other nucleus) are merged first; couplings inside such a set leave no
// trace in the spectrum.
//
// Auto forms clusters from strong couplings (|Δν| < StrongRatio·|J|, default
// ratio 10, common practice) and simulates each cluster of two or more groups
// exactly; single groups are treated first-order. Exact forms clusters from
// all non-zero 1H–1H couplings.
//
// Couplings from a cluster to spins outside it (19F and 31P, which are always
// weakly coupled to 1H, and in Auto mode the 1H groups of other clusters) are
// treated in the X approximation: each spin-state configuration of the outside
// partners shifts the cluster's frequencies by Σ J·m, and the sub-spectra are
// weighted by the binomial populations. To bound the cost, the partners with
// the largest |J| are treated so (up to 16 configurations) and the remaining
// ones split the cluster's lines first-order afterwards, line by line, by the
// coupling of the group the line is attributed to.
//
// # Attribution
//
// The intensity of a transition is |<b|F−|a>|² = Σ_g Re(<b|F−_g|a>*<b|F−|a>),
// where F−_g is the lowering operator of group g; each term is reported as a
// Line of group g. The terms of one group sum to its Count (to about 0.1%:
// shares below 1e-4 of a line are given to the line's largest share, which
// keeps the line's total exact).
//
// # Limits
//
// Exact simulation refuses a cluster larger than Options.MaxSpins allows
// (default 12 distinct spin-1/2 nuclei: largest Mz block 924 states; the
// work, Σ d³ over all blocks and spin combinations, is bounded the same way)
// with an error wrapping ErrTooLarge that suggests first-order mode, rather
// than exhausting memory. Auto mode instead simulates such a cluster by
// fragments (fragment.go): each group with its most strongly coupled
// neighbours, up to Options.FragmentSpins (default 9) spins, keeping only
// that group's lines; Result.ModeUsed reports Fragment for its groups. On a
// 14-spin chain with Δν/J ≈ 3 this is within about 0.7% of the exact
// spectrum's height at a small fraction of the cost (TestFragment14Accuracy);
// clusters of nearly coincident shifts need larger fragments (see
// DefaultFragmentSpins). Composite particles make clusters of CH3 and CH2
// groups much cheaper than their number of nuclei suggests.
//
// Blocks are diagonalised on GOMAXPROCS goroutines, the costliest first,
// and the lines between adjacent blocks computed as soon as both are known
// (schedule in hamiltonian.go); a block's eigenvectors are dropped once the
// lines on both its sides are done, and no new block is started while
// GOMAXPROCS+2 are held (for 12 spins on two cores, four matrices of at
// most 924² values, about 27 MB). Large eigenproblems also share their
// rotation work among the goroutines. Large matrices and line slices are
// reused through buffer pools (pool.go) rather than left to the garbage
// collector. The line list
// itself, tens to hundreds of thousands of lines for 10–12 strongly coupled
// spins, is usually the larger part of the memory.
//
// Exact transitions weaker than MinLine (1e-6 of one nucleus) are not
// listed; their total is Result.Dropped, so that the lines plus Dropped obey
// the sum rule. Lines closer than 0.001 Hz are merged.
package spin
