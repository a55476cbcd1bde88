// Package predict turns a molecule into its expected 1H NMR spectrum:
// proton environments with shifts (package shiftinc), couplings (package
// jrules), multiplets from first-order splitting or exact spin simulation
// (package predict/spin), the trade's multiplicity names, and a rendered
// trace.
//
// # From molecule to signals
//
// Each proton environment of the graph (graph.Environment) becomes one
// Signal. Its shift is the mean of the increment estimates of its protons
// and its uncertainty combines their standard deviations with their spread.
// Couplings are estimated for every pair of protons two to five bonds apart
// and from every proton to each 19F and 31P atom.
//
// The J list of a signal (Signal.Couplings) is first-order: one entry per
// partner environment, with the number of partners taken as the protons of
// that environment that couple resolvably (|J| ≥ 0.5 Hz) with a
// representative member, and J their mean. Members coupling very
// differently (ortho 8 Hz and para 0.5 Hz partners of an AA'XX' proton)
// form separate entries, so a para-disubstituted benzene's ring protons
// read "d, 8 Hz" rather than a triplet. Coupling.JHz, JMin and JMax are
// magnitudes (|J|, in Hz, to 0.1 Hz); the signs (negative geminal ²J,
// allylic ⁴J) are kept for the exact simulation.
//
// # Modes
//
// FirstOrder splits each signal successively by its J list: n equivalent
// partners give n+1 lines with binomial intensities (Pascal's triangle).
// Exact and Auto hand a spin system to spin.Simulate: an environment whose
// protons are magnetically equivalent is one group; one whose protons are
// only chemically equivalent (the AA'BB' sets of a para-disubstituted
// benzene) is split into one group per proton with its own couplings, and
// the lines are merged back by signal. 19F and 31P are heteronuclear groups
// that couple but produce no 1H lines. Couplings below 0.7 Hz are left out
// of the simulation (they vanish in the line width and would join large
// clusters). In Auto mode a strongly coupled cluster (|Δν| < 10|J|) costing
// more than 9 distinct protons to diagonalise is simulated by fragments
// (spin.Fragment: each group with its most strongly coupled neighbours; the
// signal's mode is "fragment" and a warning says so), one of more than 32
// groups is computed first-order with a warning, and any failure of the
// simulation falls back to first-order for the whole molecule; in Exact
// mode a coupled cluster of more than 14 protons is refused with an error
// suggesting another mode.
//
// # Multiplicity names
//
// Names come from the first-order J list at the chosen field and line
// width: couplings smaller than the line width are unresolved; couplings
// within one line width of each other (or 10 %) merge into one equivalent
// set; sets are named d, t, q, p, sext, sept by their size and joined in
// descending J (dd, dt, td, ddd, ddt, dq, qd, tt, …). The name is "s" with
// no resolved coupling, "br s" for an exchangeable proton without resolved
// coupling, and "m" when more than three distinct couplings remain, when a
// set has more than six partners in a combination, or when a partner is
// strongly coupled (|Δν| < 2|J| at the field), where the lines no longer
// follow the first-order pattern.
//
// # Exchangeable protons
//
// In D2O and CD3OD the OH, NH and SH protons exchange for deuterium: their
// signals are left out of the prediction and a warning says so.
package predict
