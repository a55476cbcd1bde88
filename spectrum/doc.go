// Package spectrum holds measured 1H NMR data: reading and writing
// JCAMP-DX and CSV files, and (in the processing files) referencing,
// baseline correction, noise, peak picking, multiplets, integrals and J.
//
// # Reading
//
// [ReadFile] detects the format from the content: a file whose first
// non-blank line starts with "##" is JCAMP-DX, anything else CSV. Every
// reader returns the trace on an ascending ppm axis and reports errors as
// [*ParseError] values that print as "file:line: message".
//
// # JCAMP-DX
//
// The reader follows JCAMP-DX 4.24 (McDonald & Wilks 1988) with the NMR
// conventions of version 5 (Davies & Lancashire 1993), which JCAMP-DX 6
// files also use:
//
//   - labelled data records "##NAME= value", names compared without case,
//     spaces, dashes, slashes or underscores; "$$" comments; values that
//     continue over several lines;
//   - ##XYDATA=(X++(Y..Y)) in AFFN and every ASDF form (SQZ, DIF, DUP,
//     PAC) with the DIF Y-check verified line by line, the X at the start
//     of each line checked against FIRSTX and DELTAX, and NPOINTS checked;
//   - ##XYPOINTS=(XY..XY) traces and ##PEAK TABLE=(XY..XY) or (XYW..XYW)
//     peak lists (into Spectrum.PeakTable);
//   - ##NTUPLES= NMR SPECTRUM: the page holding the real part, scaled by
//     the FACTOR, FIRST, LAST, VAR_DIM and UNITS of its variables;
//   - X in HZ (converted with ##.OBSERVE FREQUENCY=, or
//     ReadOptions.FieldMHz when the file gives none) or PPM, and
//     ##.SHIFT REFERENCE= (the ppm of one data point) when present;
//   - several blocks and LINK files: [ReadJCAMPAll] returns every spectrum,
//     [ReadJCAMP] picks the 1H trace.
//
// Time-domain (FID) and multidimensional data are refused with an error
// ("time-domain data is not supported yet"). A file in HZ without an
// observe frequency (e.g. a bare export) is refused unless the caller gives
// the field with [ReadFileWith] and ReadOptions.FieldMHz. No reader
// allocates from what a header claims: slices grow with the data actually
// read (preallocation is capped by the data size and at 2^20 points, a
// table at 4,194,304 points),
// so a file claiming 10^12 points costs nothing.
//
// Tolerated inconsistencies (a line whose X disagrees with FIRSTX and
// DELTAX by more than one point spacing, a DELTAX that disagrees with
// FIRSTX, LASTX and NPOINTS) are listed in Spectrum.Warnings; a wrong point
// count, a failed DIF Y-check or a bad character is an error. A file whose
// last block lacks ##END= is read (with a warning) only when that block is
// an XYDATA trace whose ##NPOINTS= the data match; otherwise the missing
// ##END= is reported as a truncated file. Files with CR-only line ends are
// read as if they had LF.
//
// # CSV
//
// [ReadCSV] reads a trace (ppm, intensity) or a peak list (ppm[,
// intensity][, width in Hz]). Comment lines start with '#'; the separator
// is tab, ';' (which allows a decimal comma), ',' or blanks; an optional
// header may name and reorder the columns. Two columns with at least 32
// rows of (nearly) equal ppm steps are a trace, a row that breaks such a
// spacing is an error with its line, and anything else is a peak list;
// ReadOptions.CSV forces either reading.
//
// # Writing
//
// [WriteJCAMP] writes JCAMP-DX 5.01 NMR SPECTRUM files, XYDATA in AFFN or
// DIFDUP with Y-checks (X in HZ when the field is known, else PPM; Y as
// integers scaled so that the largest magnitude is 10^9), or a PEAK TABLE
// for a peak list. [WriteCSV] writes the forms ReadCSV reads. Both round-trip
// through the readers.
//
// # Processing
//
// [Process] turns a trace into a [PeakList]; the input is not modified.
// The observe frequency comes from ProcessOptions.FieldMHz, else the file,
// else 400 MHz is assumed with a warning; the solvent from the options, else
// the file, else CDCl3 with a warning. The steps, in order:
//
//   - Baseline (baseline.go): a Whittaker smoother (Eilers 2003), the z
//     minimising Σ wᵢ(yᵢ − zᵢ)² + λ Σ (Δ²zᵢ)², solved with a banded LDLᵀ
//     factorisation in O(n) on block means of at most 4,096 points. As in
//     asymmetric least squares (Eilers & Boelens 2005) the weights are
//     re-estimated from the residuals, but with a hard noise-scaled rule:
//     a point rising more than 2.5σ above the baseline gets weight 0, with
//     two blocks on each side, points below keep weight 1, so the baseline
//     runs through the middle of the noise. λ is set so that the baseline
//     cannot follow features shorter than about 1 ppm.
//   - Noise (noise.go): σ = 1.4826 · MAD (median absolute deviation) of the
//     corrected trace over the points the baseline step found signal-free.
//     [EstimateNoise] gives the MAD of the first differences over √2, for a
//     trace that is not baseline-corrected.
//   - Peak picking (peaks.go): local maxima at least MinSNR·σ high (default
//     [DefaultMinSNR], 5), with a topographic prominence of at least 3σ and
//     at least half the median width of the strong lines unless they reach
//     5 % of the tallest line; position, height and width from the parabola
//     through the reciprocal of the three top points (exact for a
//     Lorentzian).
//   - Artifact flags (peaks_artifacts.go): 13C satellites (a pair of lines of
//     0.1–2 % of a parent at ±½·¹J(CH), 55–130 Hz on each side, or one whose
//     mirror is hidden under a taller signal), spinning sidebands (a
//     symmetric pair below 2 % of the parent, 5–60 Hz away) and line-shape
//     skirts (lines below 0.5 % of a line within 50 Hz) get
//     Peak.Artifact = [Artifact13C], [ArtifactSideband] or [ArtifactSkirt] and
//     join no multiplet.
//   - Multiplets (multiplet.go): neighbouring peaks join one multiplet when
//     they are at most JMaxHz apart (default [DefaultJMaxHz], 20 Hz) or the
//     trace between them stays above a quarter of the smaller of the new
//     peak and the tallest peak of the multiplet so far (and 3σ; a weak
//     broad hump between two multiplets does not chain them),
//     in both cases only when the new peak and the tallest peak of the
//     multiplet so far differ by less than a factor of 30. Across a gap
//     wider than 10 Hz where the trace returns to the baseline (3σ), the
//     distance joins only peaks within a factor of 3 (the two halves of a
//     d or dd; Pascal ratios up to 1:7 sit a small J apart): at 60–90 MHz
//     neighbouring multiplets lie within 20 Hz and would chain into one
//     region of several ppm. When the solvent
//     is known, the residual quintet of a CD3 solvent (1:2:3:2:1, J(HD)
//     about 2 Hz) or the 1:1:1 triplet of CD2Cl2 is found among the lines
//     grouped with it and given a multiplet of its own (residual.go); a
//     singlet residual (CHCl3) at the edge of a compound multiplet leaves
//     it when the rest is first-order only without it. Each multiplet gets
//     a first-order analysis after Hoye, Hanson & Vyvyan 1994:
//     symmetric positions and intensities (within roofing), intensities in
//     whole units of an outer line summing to a power of two, couplings
//     peeled one at a time; retried without the weakest lines and on
//     Lorentzian-unmixed amplitudes. Equal couplings merge into t, q, p, …;
//     Multiplet.Multiplicity reads like "dt" (largest coupling first, J in
//     Multiplet.JHz, largest first), or "m" when the pattern is not
//     first-order.
//   - Integrals (integrate.go): the trapezoid rule over each multiplet's
//     region on the corrected trace (its lines widened by five line widths,
//     at least 3 Hz, never past the midpoint to the next multiplet), with
//     the Lorentzian tails of its own lines outside the region added and
//     those of other lines inside it removed (correction capped at 15 %).
//   - Referencing (reference.go): the axis is moved so that TMS lands on 0
//     or the solvent residual on its tabulated shift (Fulmer et al. 2010),
//     only when the signal is found within 0.15 ppm. ProcessOptions.Reference
//     [RefAuto] prefers a TMS line within 0.05 ppm of 0 with S/N ≥ 20, else
//     a residual with the expected pattern (or within 0.02 ppm), which
//     confirms the file's axis when within 0.05 ppm and moves it when
//     further off; [RefTMS] and [RefSolvent] move the axis onto that signal
//     whenever it is found; [RefNone] keeps the axis. The TMS and solvent
//     multiplets are labelled ([LabelTMS], [LabelSolvent]) in every mode;
//     PeakList.ReferencePPM is the shift applied.
//
// Relative integrals: with no ProcessOptions.IntegralRef, the unlabelled
// first-order multiplets of at least 1/16 of the largest area, except a
// singlet within 0.1 ppm of the solvent's water shift (all
// unlabelled ones of that size when none is first-order) are scaled so
// that the smallest is n protons, n being the smallest of 1…4 for which
// all of them come out within a mean 0.12 of whole numbers. When no n
// does, the unit is the largest area/n (n = 1…4, from a first-order
// multiplet) under which at least half of the unlabelled multiplets of that
// size come out within 0.15 of a whole number ≥ 1 (else n = 1 on the
// smallest). An [IntegralRef] instead fixes the multiplet at a ppm (or with an
// index) to a given number of protons.
//
// A spectrum with only a peak table skips baseline, noise and picking: its
// peaks are flagged, grouped and analysed the same way, and a multiplet's
// integral is the sum of its intensities (times the widths when every line
// has one). Problems that do not stop processing (field or solvent assumed,
// reference signal not found) are listed in PeakList.Warnings.
package spectrum
