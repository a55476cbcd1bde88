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
package compare
