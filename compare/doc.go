// Package compare matches a predicted 1H spectrum (package predict) against a
// measured one (package spectrum): it assigns predicted signals to measured
// multiplets, fits the integral scale, scores the agreement, explains every
// measured peak (compound, residual solvent, water, contaminants, given
// impurities, 13C satellites), estimates purity (molar composition and qNMR)
// and ranks candidate structures. It never prints; commands and reports
// present the Result.
//
// The result is advisory: release of material follows the lab's own
// procedures and qualified review (AdvisoryText).
//
// # Pipeline
//
// Check reads and processes the spectrum (spectrum.ReadFile,
// spectrum.Process), predicts the structure (smiles.Parse, predict.Predict;
// Options.Predictor replaces both), then for the intended structure and each
// candidate:
//
//  0. Solvent. The solvent is the user's (Options.Solvent) or the file's.
//     A file's solvent whose residual line is absent (no multiplet within
//     0.03 ppm of it) gives way to the one table solvent whose residual
//     line (±0.03 ppm, narrow) and water line (±0.10 ppm) are both present
//     (a template header or a dataset default naming CDCl3 for a DMSO-d6
//     tube); a warning says so, the prediction uses that solvent and its
//     residual line is claimed as solvent. Not for D2O (one line only) and
//     never against the user's choice.
//  1. Assignment. Predicted signals (rows) are matched to measured
//     multiplets (columns) by a global minimum-cost assignment (Hungarian).
//     A multiplet of about n H is offered as n columns, so several signals
//     can share it (overlap); each signal also has a private "missing"
//     column. The cost of signal i in multiplet j is z² (z = shift distance
//     — to the centre less 40 % of the width, that credit at most 0.25 ppm
//     — over the prediction's SD, floored at 0.08 ppm; linear beyond 3 SD),
//     plus 1.5 × a multiplicity term (0 same pattern, 0.3 unknown or same
//     line count, 0.4 unresolved small couplings, up to 3; +0.8 for a
//     further signal in a clean s, d, t or q, which only accidental
//     equivalence allows; a multiplet that is one broad line, ≥ 5 Hz and
//     at least 0.8 × as wide as the signal's predicted pattern span
//     Σ n·|J|, reads as that pattern unresolved, "m", not as a singlet),
//     a J term (beyond ±1.5 Hz), a log-ratio term for
//     NH against the multiplet's H, and 1.5 per extra signal already in the
//     multiplet (scaled by 4/H in an envelope of H ≥ 4 protons, where
//     overlap is expected). Missing costs 20 (about 5.7 SD);
//     exchangeable protons (OH, NH, COOH) have SD ≥ 1.2 ppm, a light
//     integral term and a missing cost of 2: broad, shifted or absent
//     exchangeables are noted, not punished. An exchangeable predicted with
//     a resolved splitting (OH/NH in DMSO-d6: slow exchange, a sharp d, t
//     or q coupled to its CH) is a sharp line: SD ≥ 0.5 ppm, the full
//     integral term, its multiplicity counted (a singlet, broad line or
//     "m" at 0.3: exchange can still collapse it) and a missing cost of 6.
//     The residual-solvent peak can
//     take a signal at a cost of 4 (a compound line hidden under CHCl3),
//     its integral counting only when short of the signal's H (a 2 H
//     signal does not hide in a 0.08 H line). A multiplet is the residual
//     peak only when shaped like it: no more peaks than its pattern's lines
//     plus two, one within 0.015 ppm of the tabulated shift (a compound
//     multiplet beside it is not); the same holds when the solvent is read
//     from the lines. A residual peak that holds 1.5 H or more of the
//     compound on a first estimate, with compound signals predicted in it,
//     is assigned like any multiplet (a 60 MHz phenyl line at 7.30 taken
//     for CHCl3).
//  2. Integral scale. H per unit area starts as the non-exchangeable H
//     over the area of the multiplets, the water line left out, and is
//     then the H-weighted median of
//     (assigned H)/(area) over the assigned multiplets, alternated with the
//     assignment until it settles (at most 3 rounds); never one peak alone.
//  3. Second parts. A free multiplet within 3 SD of a signal whose
//     multiplet is clearly short of H, and no larger than the shortfall, is
//     taken as a second part of it (amide rotamers, diastereotopic CH2).
//  4. Explanation. Peaks not given to the compound are, in order: 13C
//     satellites (55–110 Hz from a parent at least 20× larger, 0.15–1.5 %
//     of it) or mirrored spinning sidebands (5–50 Hz, < 3 %), and regions
//     wider than 1.5 ppm (baseline humps: no real multiplet is that wide),
//     besides the artifacts processing flags itself (a satellite without
//     its mirror line is not accepted at a tabulated contaminant singlet);
//     a free line of one or two peaks where the compound's predicted
//     lines, moved with their multiplets, hold half its H is the
//     compound's (an outer line of a wide 60 MHz pattern grouped apart);
//     the internal standard and the
//     --impurity structures (predicted, matched by a small assignment
//     within 2 SD of each predicted shift, never to the water line for a
//     signal predicted away from it; at least half their H found, or, when
//     the rest is predicted under compound multiplets, found signals within
//     1 SD and 0.3 ppm clear of the compound's multiplets (benzaldehyde's
//     CHO beside an aromatic compound at 60 MHz); the amount is the H-weighted (upper) median of the
//     per-proton amounts of the signals clear of the compound's lines —
//     predicted lines ± 3 Hz around the predicted shift and around the
//     assigned multiplet, and that multiplet — or, when all overlap, the
//     smallest, since an overlapped signal can only gain area); table
//     species for the solvent
//     (tables/impurities.toml: Gottlieb, Kotlyar & Nudelman 1997 and
//     Fulmer et al. 2010, values from memory; a sharp line's region at most
//     0.15 ppm, or 45 Hz below 300 MHz; ties between neighbouring table
//     lines go to the closer multiplet centre), whole sets first (a lone line that water
//     or a one-line contaminant could be is water, the other named as the
//     alternative), a signal
//     hidden under a compound multiplet counting towards the set, named
//     only at ≥ 0.1 mol % with a peak of S/N ≥ 10, a tabulated singlet
//     never matching a multiplet read as resolved d, t, q, dd … (an "m" or
//     broad line is accepted: overlap, low S/N) (a minor peak that
//     processing grouped into a compound multiplet but that lies outside
//     the signal's predicted lines, at a tabulated singlet, is split off
//     first); the rest is unknown. The
//     excess of a compound multiplet holding clearly more H than assigned is
//     listed as an unexplained part.
//
// # Scores and verdict
//
// Part scores, each 0–1: shifts (H-weighted mean of exp(−z²/8)), splitting
// (half the mean of 1 − cost/3 over the multiplicity labels, half the shape
// score: the Pearson correlation, floored at 0 and H-weighted, of each
// compound multiplet's trace with the Lorentzian rendering of the lines
// predicted for its signals, moved to its centre), integrals (1 − Σ|H measured − H expected|/Σ H
// expected over compound multiplets, excess counted at half) and explained
// (1 − unknown intensity/total intensity; residual solvent, TMS and
// artifacts are left out of the total). The score is
//
//	(0.35·shifts + 0.20·splitting + 0.25·integrals + 0.20·explained)·(1 − m)²
//
// with m the fraction of non-exchangeable H whose signals are missing.
//
// Verdict: inconsistent when m > 0.10, when more than 20 % of the H sit
// more than 4 SD from their multiplet, when the integral score is below
// 0.60, when the score is below 0.50, or when the structure is clearly
// another compound's:
//
//   - less than 60 % of the measured intensity is explained (the explained
//     part score: structure, residual solvent, water, given impurities and
//     table contaminants; residual solvent, TMS and artifacts left out of
//     the total): most of the tube holds something else;
//   - two or more non-exchangeable signals, or at least 30 % of the
//     non-exchangeable H, fit grossly badly: missing, more than 3 SD from
//     their multiplet, of a clearly different multiplicity (cost ≥ 1.5)
//     and more than 2 SD away, or given a multiplet that holds at most
//     60 % of their H in a region short of a proton (in a region that
//     integrates right, a short multiplet is an assignment slip, not a
//     missing proton). One such signal is a review, several a different
//     compound.
//
// Review when
//
//   - any signal is missing or more than 3 SD away;
//   - two or more signals (or over 20 % of the H) have a clearly different
//     multiplicity, or the splitting score is below 0.50;
//   - the shifts part score is below 0.80 (every signal within 3 SD, yet
//     together too far off: acetophenone checked as acetanilide), or the
//     splitting score is below 0.65 while the integral score is below
//     0.90 (2-butanol checked as isobutanol); true structures of the
//     reference sets and the real spectra score at least 0.83 on shifts;
//   - the integral score is below 0.80;
//   - a region (below 3, 3–6.3, 6.3–9, above 9 ppm, by predicted shift)
//     integrates at least 1 H (at 0.1 H) and 20 % short of the H expected
//     there while one of its multiplets holds at most 60 % of the H of its
//     signals (a proton missing there; a uniform shortfall of every
//     multiplet is a scale or relaxation effect, and an excess is usually
//     overlapped water, exchangeable or impurity, listed but not a reason);
//   - the integrals contradict each other by whole protons
//     (integralConflicts): the fitted scale is an H-weighted median, so a
//     long alkyl envelope can set it alone and hide a homolog's extra or
//     missing CH2 groups. Each multiplet then votes once (weight
//     min(H, 3)/signals in it: a clean OCH3 counts fully, an envelope
//     little; one holding the water line, the residual solvent or an
//     identified species does not vote); when that consensus, backed by two agreeing multiplets of
//     3 H or more (within 25 % of it; or, of two multiplets, one clean
//     one of at least 2 H), differs from the fitted scale by 25 %, the
//     multiplets it
//     contradicts, summed, short or long by 2 H and 20 %, are named ("on
//     the scale of the multiplets at 3.67, 2.30, which agree, the
//     multiplet at 1.34 holds 33.1 H where 21 are expected"). Without such
//     a conflict, a compound multiplet holding 2 H and 40 % more than its
//     signals is named unless water, the residual solvent or an identified
//     species has a line in it;
//   - unexplained peaks hold more than 10 % of the intensity, or more than
//     5 % with one unexplained multiplet of at least 0.5 H-equivalents (a
//     proton-sized signal rather than a scatter of traces); the reason names
//     the largest;
//   - the score is below 0.75;
//   - the molar purity by integrals, or the qNMR mass purity, is below
//     Options.MinPurityPct (the lab's specification; DefaultMinPurity, 80
//     %, when not given): the reason names the largest other species. A
//     sample that is mostly something else is no "consistent", whatever
//     the structure's fit;
//   - an internal standard was given but no qNMR result could be
//     computed (the standard, or its signal at Standard.SignalPPM within
//     0.1 ppm, not found; no clean compound multiplet): the reason says
//     so ("internal standard signal at 99.00 ppm not found; no qNMR
//     result") and the purity's qNMR fields are null;
//   - a candidate scores at least 0.03 higher. At 0.05 higher, while the
//     intended structure has a missing signal, a signal more than 3 SD
//     away or a region short of a proton, the verdict is inconsistent. The
//     reason names the candidate, both scores and the intended structure's
//     signals that fit worse.
//
// Consistent otherwise. The thresholds were set on the synthetic reference
// set (both directions: the true structure with the wrong one as
// candidate, and the wrong one as intended) and the real spectra of the
// tests (their measured rates are printed there).
//
// Every reason is a plain sentence ("signal C predicted at 4.12 q (2 H),
// nearest measured multiplet 3.67 s (5.1 SD away)", "integral of the
// aromatic region (6.3–9 ppm) is 4.0 H, 5 expected"). Cautions state the
// limits that apply: low-confidence predictions, strongly coupled
// (second-order) patterns below 400 MHz, positional isomers below 100 MHz
// (at 60–90 MHz ten of the 46 wrong isomers of the synthetic reference set
// pass as the intended structure, three at 300–600 MHz), exchangeables not
// seen, and the integral assumptions.
//
// One multiplet may take up to 32 signals, as many as its integral allows
// (an envelope of a long chain holds a dozen or more). Homologs are told
// apart by the integral rule above, not by shifts, when the envelope is
// off by about a quarter (methyl stearate checked as methyl myristate, 28
// against 20 H). Known limit: smaller differences are within integral
// error and pass: one CH2 (methyl stearate as methyl heptadecanoate,
// 1-octanol as 1-heptanol at 60 MHz, 1-hexanol as 1-pentanol) or two in a
// long chain (methyl stearate as methyl palmitate, 28 against 24 H)
// (synthetic spectra, measured 2026-12-02); mass spectrometry settles
// chain length.
//
// # Purity
//
// The molar composition counts the compound and the identified impurities
// per molecule (area × scale / H matched), assuming equal response per
// proton (full relaxation, flat baseline), and leaves out residual solvent,
// water and unidentified peaks (their share is stated). With an internal
// standard, QNMRPurity applies the qNMR equation and QNMRUncertainty
// propagates the integral, weighing and purity uncertainties (see qnmr.go).
// The analyte integral sums the compound multiplets that hold only
// compound signals and no other species' line (the standard's and the
// impurities' signals, matched or predicted, water and residual solvent,
// within the region ± 0.02 ppm); a result above 100 % by more than twice
// its uncertainty (and 2 points) is a reason for review.
// Check refuses a Standard outside the bounds of Standard.Validate (masses
// finite, 0.001–10,000 mg; purity in (0, 100] %), so that every term stays
// finite; no NaN or ±Inf ever reaches a Result (multiplets without a finite
// position or area are left out, a non-finite field is refused).
//
// # Candidates
//
// Each --candidate is scored against the same spectrum and ranked with the
// intended structure; the signals that tell a lower-ranked structure apart
// (missing, more than 3 SD away, clearly different multiplicity) are named.
//
// # Work cap
//
// At most 80 signals per structure and 20 candidates are scored; the
// assignment matrix is then at most 80 × (8·multiplets + 80).
package compare
