package jrules

// Unless a row says otherwise, values are the typical values and ranges of
// the 1H–1H coupling tables in E. Pretsch, P. Bühlmann, M. Badertscher,
// "Structure Determination of Organic Compounds", 4th ed., Springer 2009,
// chapter 5 (1H NMR), recalled from memory, and checked against the common
// ranges every practitioner uses.

// rule is one row: a named typical value with its range.
type rule struct {
	name          string
	typ, min, max float64
}

func (r rule) j(n int) J { return J{Typical: r.typ, Min: r.min, Max: r.max, NBonds: n, Rule: r.name} }

// Geminal ²J (Pretsch; value from memory).
var (
	gemSP3      = rule{"2J geminal sp3", -12.5, -15, -11}
	gemSP3Pi    = rule{"2J geminal sp3 next to pi system", -14.5, -16.5, -12.5}
	gemSP3Ring3 = rule{"2J geminal cyclopropane", -4.5, -9, -3}
	gemSP2      = rule{"2J geminal =CH2", 1.5, 0, 3}
)

// Vicinal ³J, open sp3 chains: J = vicEthane − vicSlope·Σ(χ − χH), after
// Abraham & Pachler, Mol. Phys. 7, 165 (1964) (coefficients value from
// memory; 8.0 Hz is the rotamer-averaged ³J of ethane).
const (
	vicEthane = 8.0
	vicSlope  = 0.7
	vicSpread = 1.0 // ± Hz around the corrected value
)

// Karplus coefficients, J(φ) = A cos²φ + B cos φ + C: the textbook set
// quoted in M. J. Minch, Concepts Magn. Reson. 6, 41 (1994) (value from
// memory).
const (
	KarplusA = 7.76
	KarplusB = -1.10
	KarplusC = 1.40
)

// Ring vicinal ³J for three- to five-membered saturated rings, cis/trans
// unknown (Pretsch; value from memory: cyclopropane cis 7–10 ~8.5,
// trans 4–7 ~5.5; cyclobutane cis 6–12, trans 2–10; cyclopentane 2–10).
var (
	vicRing3 = rule{"3J cyclopropane (cis ~8.5 / trans ~5.5, stereo not read)", 7.0, 4, 10}
	vicRing4 = rule{"3J cyclobutane (cis/trans not read)", 7.5, 2, 12}
	vicRing5 = rule{"3J cyclopentane (cis/trans not read)", 7.0, 2, 10}
)

// Other vicinal ³J (Pretsch; value from memory).
var (
	vicAllylic  = rule{"3J H-C(sp3)-C(sp2)-H", 6.8, 4, 8.5}
	vicAllylRng = rule{"3J H-C(sp3)-C(sp2)-H in ring", 4.0, 1.5, 7}
	vicDiene    = rule{"3J H-C(sp2)-C(sp2)-H across single bond", 10.5, 9, 12}
	vicCHOsp3   = rule{"3J aldehyde H-C(O)-C(sp3)-H", 2.0, 1, 3}
	vicCHOsp2   = rule{"3J aldehyde H-C(O)-C(sp2)-H", 7.7, 6, 8.5}
	vicOH       = rule{"3J H-C-O-H (slow exchange)", 5.0, 4, 7}
	vicNH       = rule{"3J H-C-N-H amine (slow exchange)", 6.0, 4, 8}
	vicNHamide  = rule{"3J H-C-N-H amide", 6.0, 4.5, 8}
	vicNHarom   = rule{"3J H-N-C(sp2)-H", 2.6, 1.5, 3.5}
	vicSH       = rule{"3J H-C-S-H", 7.5, 6, 9}
	vicOther    = rule{"3J other", 5, 0, 10}
	vicNH2NH    = rule{"3J through heteroatom, exchange-averaged", 0, 0, 1}
)

// Vinyl ³J across C=C. Ethylene values: cis 11.6, trans 19.1 Hz (Pretsch;
// value from memory). Ranges are the common practice ranges cis 6–12 Hz,
// trans 12–18 Hz (trans up to 19 for ethylene itself).
const (
	vinylCis0   = 11.6
	vinylTrans0 = 19.1
	vinylSpread = 1.5
)

// vinylIncrement holds the change of the vinyl cis and trans ³J caused by
// one substituent on either alkene carbon, derived from the monosubstituted
// ethylenes (Pretsch, value from memory): propene cis 10.0 / trans 16.8,
// styrene 10.9 / 17.6, methyl acrylate 10.4 / 17.4, acrylonitrile 11.8 /
// 17.9, vinyl chloride 7.3 / 14.6, vinyl bromide 7.1 / 15.1, ethyl vinyl
// ether 6.7 / 14.3, vinyl acetate 6.3 / 14.0, vinyl fluoride 4.7 / 12.8.
// The trend follows the substituent electronegativity (Banwell & Sheppard,
// Discuss. Faraday Soc. 34, 115 (1962)).
type vinylIncrement struct{ cis, trans float64 }

var vinylIncrements = map[string]vinylIncrement{
	"alkyl":    {-1.6, -2.3},
	"aryl":     {-0.7, -1.5},
	"vinyl":    {-0.9, -1.9}, // butadiene 10.2 / 17.1
	"carbonyl": {-1.2, -1.7},
	"nitrile":  {0.2, -1.2},
	"O":        {-5.1, -5.0},
	"OC(=O)":   {-5.3, -5.1},
	"N":        {-3.6, -4.0}, // N-vinyl amides and amines (~8.5–9 / ~15)
	"S":        {-1.3, -2.6}, // vinyl sulfides (~10.3 / ~16.5)
	"F":        {-6.9, -6.3},
	"Cl":       {-4.3, -4.5},
	"Br":       {-4.5, -4.0},
	"I":        {-3.7, -3.2}, // vinyl iodide 7.9 / 15.9
	"other":    {-1.5, -2.0},
}

// Cis ³J across a double bond inside a small ring (Pretsch; value from
// memory: cyclopropene 0.5–2.0, cyclobutene 2.5–4.0, cyclopentene 5.1–7.0,
// cyclohexene 8.8–11.0, cycloheptene 10–13).
var vinylRingCis = map[int]rule{
	3: {"3J cis vinyl in cyclopropene", 1.3, 0.5, 2},
	4: {"3J cis vinyl in cyclobutene", 3.0, 2.5, 4},
	5: {"3J cis vinyl in cyclopentene", 5.6, 5, 7},
	6: {"3J cis vinyl in cyclohexene", 10.0, 8.8, 11},
	7: {"3J cis vinyl in cycloheptene", 11.0, 10, 13},
}

var vinylUnknown = rule{"3J vinyl, cis/trans unknown", 13, 6, 18}

// Aromatic couplings, benzene-type rings. Benzene itself: ortho 7.54,
// meta 1.37, para 0.69 Hz; substituted benzenes ortho 7–9, meta 1–3,
// para 0–1 (Pretsch; value from memory).
var (
	arOrtho = rule{"3J aromatic ortho", 7.7, 6.5, 9.0}
	arMeta  = rule{"4J aromatic meta", 1.8, 1.0, 3.0}
	arPara  = rule{"5J aromatic para", 0.5, 0, 1.0}
	// Seven-membered aromatic rings (azulene J45 9.5, J56 9.9 Hz; Pretsch,
	// value from memory).
	ar7Ortho = rule{"3J aromatic ortho, seven-membered ring", 9.8, 9.0, 11.0}
)

// Pyridine-type six-membered rings (Pretsch; value from memory: pyridine
// J23 4.9, J34 7.7, J24 1.8, J35 1.4, J25 0.9, J26 −0.1).
var (
	pyJ23 = rule{"3J pyridine J23", 4.9, 4.0, 6.0}
	pyJ34 = rule{"3J pyridine J34", 7.7, 7.0, 8.5}
	pyJ24 = rule{"4J pyridine J24", 1.8, 1.0, 2.5}
	pyJ35 = rule{"4J pyridine J35", 1.4, 1.0, 2.0}
	pyJ26 = rule{"4J pyridine J26", -0.1, -0.5, 0.5}
	pyJ25 = rule{"5J pyridine J25", 0.9, 0, 1.5}
)

// fiveRing holds J23, J34, J24, J25 of a five-membered aromatic ring with
// one heteroatom (Pretsch; value from memory).
type fiveRing struct{ j23, j34, j24, j25 rule }

var fiveRings = map[string]fiveRing{
	"O": { // furan
		rule{"3J furan J23", 1.8, 1.5, 2.0}, rule{"3J furan J34", 3.4, 3.1, 3.8},
		rule{"4J furan J24", 0.8, 0.5, 1.0}, rule{"4J furan J25", 1.5, 1.3, 1.8}},
	"S": { // thiophene
		rule{"3J thiophene J23", 4.9, 4.7, 5.5}, rule{"3J thiophene J34", 3.5, 3.3, 4.1},
		rule{"4J thiophene J24", 1.2, 1.0, 1.5}, rule{"4J thiophene J25", 2.8, 2.6, 3.3}},
	"N": { // pyrrole
		rule{"3J pyrrole J23", 2.6, 2.4, 3.1}, rule{"3J pyrrole J34", 3.4, 3.3, 3.8},
		rule{"4J pyrrole J24", 1.4, 1.2, 1.6}, rule{"4J pyrrole J25", 2.0, 1.9, 2.2}},
}

// Five-membered rings with two or more heteroatoms (azoles; Pretsch, value
// from memory: thiazole J45 3.2, imidazole J45 ~1, pyrazole J34 ~2).
var (
	azoleOrtho = rule{"3J azole", 2.0, 0.5, 3.5}
	azoleMeta  = rule{"4J azole", 1.0, 0, 1.5}
)

// Long-range couplings (Pretsch; value from memory).
var (
	lrAllylic    = rule{"4J allylic", -1.5, -3.0, -0.5}
	lrPropargyl  = rule{"4J propargylic", -2.6, -3.5, -2.0}
	lrW          = rule{"4J W-type (1,3 across four-membered ring)", 1.0, 0, 3}
	lrBenzylic   = rule{"4J benzylic", -0.6, -1.0, 0}
	lrHomoallyl  = rule{"5J homoallylic", 1.5, 0.5, 3}
	lrHomoprop   = rule{"5J homopropargylic", 2.7, 2.0, 3.2}
	lr4Unres     = rule{"4J unresolved", 0, -1, 1}
	lr5Unres     = rule{"5J unresolved", 0, 0, 1}
	lrCHOAllylic = rule{"4J aldehyde H-C(O)-C=C-H", 0.5, 0, 1.5}
)

// 1H–19F couplings (Pretsch; value from memory: CH2F ²J 47, CHF2 ²J 50–57,
// CHF3 ²J 79.7, vinyl fluoride ²J 85, ³J trans 52 / cis 20, fluoroethane
// ³J 25, CF3CH2 ³J 8–9, fluorobenzene ortho 9.1, meta 5.7, para 0.2).
var (
	hf2sp3     = rule{"2J H-C-F", 47, 44, 58}
	hf2CF2     = rule{"2J H-CF2", 56, 49, 60} // CH2F2 50, ArCHF2 56, RCHF2 56–57
	hf2CF3     = rule{"2J H-CF3", 79, 76, 82} // fluoroform 79.7
	hf2sp2     = rule{"2J H-C(sp2)-F", 81, 70, 90}
	hf3CF      = rule{"3J H-C-C-F (CHF, CH2F)", 22, 12, 30}
	hf3CF2     = rule{"3J H-C-C-F2", 15, 10, 22}
	hf3CF3     = rule{"3J H-C-C-F3", 10, 6, 14}
	hf3Trans   = rule{"3J H-C=C-F trans", 50, 40, 55}
	hf3Cis     = rule{"3J H-C=C-F cis", 20, 12, 25}
	hf3Vinyl   = rule{"3J H-C=C-F cis/trans unknown", 35, 12, 55}
	hf3Ortho   = rule{"3J aromatic H-F ortho", 9.0, 7.5, 11}
	hf3Other   = rule{"3J H-F other", 10, 0, 30}
	hf4Meta    = rule{"4J aromatic H-F meta", 5.5, 4, 8}
	hf4        = rule{"4J H-F", 1.0, 0, 3}
	hf5Para    = rule{"5J aromatic H-F para", 0.3, 0, 2}
	hf5        = rule{"5J H-F", 0, 0, 2}
	hfExchange = rule{"H-F to exchangeable H", 0, 0, 1}
)

// 1H–31P couplings (Pretsch; value from memory: dimethyl methylphosphonate
// ²J 17.6, trimethylphosphine ²J 2.7, triethyl phosphate ³J(POCH) 8,
// diethyl ethylphosphonate ³J(PCCH) 20, triphenylphosphine oxide ortho 12,
// meta 3, para 1.5; ¹J(P–H) of H-phosphonates 630–720).
var (
	hp1V      = rule{"1J P(V)-H", 650, 500, 750}
	hp1III    = rule{"1J P(III)-H", 200, 150, 250}
	hp2V      = rule{"2J H-C-P(V)", 17, 10, 25}
	hp2III    = rule{"2J H-C-P(III)", 3, 0, 10}
	hp3O      = rule{"3J H-C-O-P", 7.5, 5, 10}
	hp3V      = rule{"3J H-C-C-P(V)", 18, 12, 25}
	hp3III    = rule{"3J H-C-C-P(III)", 14, 8, 20}
	hp3OrthoV = rule{"3J aromatic H-P(V) ortho", 12, 7, 14}
	hp3OrthoI = rule{"3J aromatic H-P(III) ortho", 7, 5, 10}
	hp3Vinyl  = rule{"3J H-C=C-P", 25, 10, 50}
	hp4Meta   = rule{"4J aromatic H-P meta", 3, 1.5, 4}
	hp4       = rule{"4J H-P", 1, 0, 3}
	hp5Para   = rule{"5J aromatic H-P para", 1.5, 0, 3}
	hp5       = rule{"5J H-P", 0, 0, 1}
)
