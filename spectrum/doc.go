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
// count, a failed DIF Y-check or a bad character is an error.
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
package spectrum
