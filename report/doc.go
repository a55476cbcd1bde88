// Package report renders self-contained HTML reports of checks: one page per
// sample (verdict with reasons, spectrum plot with the prediction mirrored
// below the measurement, enlarged multiplets, assignment and impurity
// tables, purity, candidate ranking, a sign-off block) and an index page for
// a batch.
//
// # Self-contained
//
// Pages carry their styles inline and their plots as inline SVG (drawn with
// gonum/plot), so a page opens from disk with no network.
//
// # Advisory
//
// Every page states that the automated result is advisory and that release of
// material follows the lab's own procedures and qualified review.
package report
