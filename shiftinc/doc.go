// Package shiftinc estimates 1H chemical shifts with additive increment
// rules. The rules are data: TOML tables under tables/, embedded in the
// binary (Default) and extendable by a user file with the same schema
// (Load, Table.Merge), whose rows add new keys or replace rows with the
// same section and key.
//
// # Schemes
//
//   - sp3 C–H (tables/aliphatic.toml): δ = base(CH3 0.86 | CH2 1.37 |
//     CH 1.50) + Σ Zα + Σ Zβ + ring correction, the alkane-proton scheme of
//     Pretsch et al. with Shoolery-type α/β increments split by CH3/CH2/CH.
//     Alkyl neighbours add nothing themselves; the substituents on them
//     are the β increments. When a carbon carries several α substituents
//     the largest counts fully; each further one is multiplied by its
//     row's damping (default params.alpha_damping) when a larger one of
//     another group precedes it, and by its damping_like once per larger
//     one of its own group: halogens (CH2Cl2, CHCl3: diminishing), O- and
//     N-bound groups (acetals, orthoesters, aminals: params.
//     alpha_damping_donor unless the row sets damping_like) and aryl
//     (Ar2CH2, Ar3CH: slightly growing). β increments on a carbon with α
//     halogens are multiplied by params.beta_damping once per α halogen. Cyclooctatetraene ring C–H (tub-shaped,
//     not conjugated) takes the base row "cyclooctatetraene".
//   - alkene C–H (tables/alkene.toml): δ = 5.25 + Z(gem) + Z(cis) +
//     Z(trans), Pascual–Meier–Simon, with the substituent geometry taken
//     from graph.Mol.AlkeneView. Assumed (unwritten) geometry adds 0.15 ppm
//     of uncertainty.
//   - benzene C–H (tables/benzene.toml): 7.26 + Σ Z(ortho/meta/para).
//   - heteroaromatic and fused-ring C–H (tables/hetero.toml): the position
//     value of the parent ring, matched by a ring pattern, plus the benzene
//     increments of the ring's substituents scaled by params.hetero6_scale
//     or params.hetero5_scale. A six-membered ring with no pattern gets
//     7.26 plus the "aza" increments for each ring N.
//   - aldehyde, formyl, imine and alkyne C–H, fallbacks, exchangeable
//     protons and solvents (tables/misc.toml).
//
// A proton that no rule covers still gets a value (the fallback row for its
// kind) with a wide SD and Estimate.LowConfidence set; so does one whose
// substituent had to be looked up as "other".
//
// # Substituent keys
//
// A substituent is named from its first atom and that atom's surroundings
// as a chain of keys from specific to generic, and a section uses the first
// key it has: e.g. "OCH3" → "OR" → "other", "COAr" → "COR" → "other",
// "CH2O" → "CH3" → "alkyl" → "other". Keys: alkyl, CH3, CF3, CX3, CH2O,
// CH2N, CH2S, CH2Hal, CH2I, CH2C=O, CH2Ar, C=C, C≡C, aryl, heteroaryl,
// CHO, COR, COAr, COOH, COO-, COOR, CONR2, COCl, COSR, CN, C=N, C=S, F,
// Cl, Br, I, OH, O-, OR, OR-conj, OCH3, OAr, OC(=O)R, OC(=O)Ar, OSO2,
// amine, NH2, NHR, NR2, NAr, NHetAr, N-C=N, N-C=C, N-N, N-N=, N-O, N-P,
// NC(=O), NSO2, N-heteroaryl, N+, NO2, N3, N=C,
// N=N, SH, SR, SAr, S(=O)R, SO2R, SO2N, SO3R, SO2Cl, P, Si, B, Sn, other.
// Alkene rows may also use "<key>-conj" (the double bond carries a further
// conjugating group) and "alkyl-ring" (the substituent shares a ring with
// the double bond).
//
// # TOML schema
//
// Each file may hold [params] (alpha_damping, alpha_damping_donor,
// beta_damping, model_sd, hetero6_scale, hetero5_scale) and arrays of tables; every row needs a key and every new
// row a source (an override of an existing key keeps the old source unless
// it gives one), and has sd (1-sigma uncertainty of the rule) plus the value
// fields of its section:
//
//	[[base]]          key, ppm            CH3, CH2, CH, CH4, vinyl, allene, benzene, cyclooctatetraene
//	[[alpha]]         key, ch3, ch2, ch   α increments (sp3); optional damping, damping_like
//	[[beta]]          key, ch3, ch2, ch   β increments (sp3)
//	[[ring]]          key, ppm            ring3, ring3-hetero, ring4, ring5, ring6
//	[[alkene]]        key, gem, cis, trans
//	[[benzene]]       key, ortho, meta, para
//	[[hetero]]        key, ring, ppm      ring pattern, see tables/hetero.toml
//	[[peri]]          key, ppm            peri substituent on fused aromatics
//	[[special]]       key, ppm            CHO-*, HCOO, HCON, CH=N*, ≡CH-*, fallback-*
//	[[exchangeable]]  key, ppm, by_solvent = { "DMSO-d6" = { ppm = …, sd = … } }
//	[[solvent]]       key, offset, extra_sd, aliases
//
// A user file that adds a row:
//
//	[[alpha]]
//	key = "SeR"
//	ch3 = 0.9
//	ch2 = 0.9
//	ch = 1.0
//	sd = 0.2
//	source = "my measurements"
//
// A user row with the key of an existing row changes only the fields it
// gives (e.g. just ch3, or just sd); a row with a new key adds it, with
// missing value fields counting as 0. Keys the classifier never produces
// are accepted but have no effect. Malformed files give an
// *Error printed as "file:line: key: message".
//
// # Uncertainty
//
// Estimate.SD is the root sum of squares of the sd of every row used, of
// params.model_sd (not for exchangeable protons, whose rows are already
// wide) and of the solvent's extra_sd.
//
// # Accuracy
//
// TestAccuracyNMRShiftDB compares the estimates with about 21,000 assigned
// 1H shifts of about 3,000 NMRShiftDB2 molecules (../shared/data/shifts).
// At the time of writing: mean absolute error 0.19 ppm on the CDCl3
// records and 0.30 ppm on all records (most state no solvent), C–H only;
// about 69% of errors lie within the reported SD. Exchangeable protons are
// reported separately (MAE about 1.7 ppm). Run
//
//	go test ./shiftinc -run Accuracy -v
//
// to see the figures by proton class.
//
// # Solvents
//
// CDCl3 is the reference. Other solvents (NormalizeSolvent) add their
// offset and extra_sd to C–H estimates; exchangeable rows carry their own
// per-solvent values. In CD3OD and D2O exchangeable protons are given the
// HDO position and a rule saying they are usually not observed.
package shiftinc
