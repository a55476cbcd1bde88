// Package screen checks a batch of samples described by a manifest: it runs
// compare.Check on every sample in parallel, writes one report per sample,
// an index page and a summary (CSV and JSON), and never lets one bad sample
// stop or spoil the others.
//
// # Manifest
//
// A manifest is a TOML file of our own design:
//
//	title = "Week 48 release batch"   # optional
//	solvent = "CDCl3"                 # default for every sample
//	field_mhz = 400                   # optional; default from each file
//
//	[[sample]]
//	id = "LOT-0412"
//	spectrum = "spectra/lot0412.jdx"  # relative to the manifest
//	smiles = "CCOC(=O)c1ccc(OC)cc1"   # intended product
//	candidates = ["CCOC(=O)c1cccc(OC)c1"]
//	impurities = ["OC(=O)c1ccc(OC)cc1"]
//	solvent = "DMSO-d6"               # optional per-sample override
//	[sample.standard]                 # optional qNMR data
//	smiles = "COc1cc(OC)cc(OC)c1"
//	mass_mg = 5.02
//	purity_percent = 99.9
//	sample_mass_mg = 12.1
//
// # Outputs
//
// Every file is written atomically (temporary file, then rename), so an
// interrupted run never leaves a half-written report or summary.
//
// # Exit status
//
// Status maps a batch to the command's exit status: 0 all consistent,
// 3 any inconsistent, 4 any review and none inconsistent, 1 any input error
// (an input error outranks the verdicts, so a script never mistakes a batch
// with unreadable samples for a clean one).
package screen
