package graph

// Element data.
//
// Standard atomic weights: IUPAC Commission on Isotopic Abundances and Atomic
// Weights, "Standard atomic weights of the elements 2021" (Prohaska et al.,
// Pure Appl. Chem. 94, 573–600, 2022), abridged/conventional values (five
// significant figures where the table gives an interval). Elements without a
// standard atomic weight use the mass number of their longest-lived isotope,
// as the IUPAC periodic table does in square brackets. Values typed from
// memory of that table.
//
// Monoisotopic masses: the mass of the most abundant stable isotope, from the
// Atomic Mass Evaluation AME2020 (Wang et al., Chinese Phys. C 45, 030003,
// 2021) as tabulated by NIST ("Atomic Weights and Isotopic Compositions").
// Values typed from memory of that table; 0 means "not tabulated here" and
// the standard weight is used instead.

type element struct {
	sym  string
	std  float64 // standard atomic weight (IUPAC 2021, abridged/conventional)
	mono float64 // most abundant isotope mass, u (AME2020)
}

// elements is indexed by atomic number; index 0 is the wildcard '*'.
var elements = [...]element{
	{"*", 0, 0},
	{"H", 1.008, 1.00782503207},
	{"He", 4.0026, 4.00260325413},
	{"Li", 6.94, 7.0160034366},
	{"Be", 9.0122, 9.012183065},
	{"B", 10.81, 11.00930536},
	{"C", 12.011, 12.0},
	{"N", 14.007, 14.00307400443},
	{"O", 15.999, 15.99491461957},
	{"F", 18.998, 18.99840316273},
	{"Ne", 20.180, 19.9924401762},
	{"Na", 22.990, 22.9897692820},
	{"Mg", 24.305, 23.985041697},
	{"Al", 26.982, 26.98153853},
	{"Si", 28.085, 27.97692653465},
	{"P", 30.974, 30.97376199842},
	{"S", 32.06, 31.9720711744},
	{"Cl", 35.45, 34.968852682},
	{"Ar", 39.95, 39.9623831237},
	{"K", 39.098, 38.9637064864},
	{"Ca", 40.078, 39.962590863},
	{"Sc", 44.956, 44.95590828},
	{"Ti", 47.867, 47.94794198},
	{"V", 50.942, 50.94395704},
	{"Cr", 51.996, 51.94050623},
	{"Mn", 54.938, 54.93804391},
	{"Fe", 55.845, 55.93493633},
	{"Co", 58.933, 58.93319429},
	{"Ni", 58.693, 57.93534241},
	{"Cu", 63.546, 62.92959772},
	{"Zn", 65.38, 63.92914201},
	{"Ga", 69.723, 68.9255735},
	{"Ge", 72.630, 73.921177761},
	{"As", 74.922, 74.92159457},
	{"Se", 78.971, 79.9165218},
	{"Br", 79.904, 78.9183376},
	{"Kr", 83.798, 83.9114977282},
	{"Rb", 85.468, 84.9117897379},
	{"Sr", 87.62, 87.9056125},
	{"Y", 88.906, 88.9058403},
	{"Zr", 91.222, 89.9046977},
	{"Nb", 92.906, 92.906373},
	{"Mo", 95.95, 97.90540482},
	{"Tc", 97, 0},
	{"Ru", 101.07, 101.9043441},
	{"Rh", 102.91, 102.905498},
	{"Pd", 106.42, 105.9034804},
	{"Ag", 107.87, 106.9050916},
	{"Cd", 112.41, 113.90336509},
	{"In", 114.82, 114.903878776},
	{"Sn", 118.71, 119.90220163},
	{"Sb", 121.76, 120.903812},
	{"Te", 127.60, 129.906222748},
	{"I", 126.90, 126.9044719},
	{"Xe", 131.29, 131.9041550856},
	{"Cs", 132.91, 132.905451961},
	{"Ba", 137.33, 137.905247},
	{"La", 138.91, 138.9063563},
	{"Ce", 140.12, 139.9054431},
	{"Pr", 140.91, 140.9076576},
	{"Nd", 144.24, 141.907729},
	{"Pm", 145, 0},
	{"Sm", 150.36, 151.9197397},
	{"Eu", 151.96, 152.921238},
	{"Gd", 157.25, 157.9241123},
	{"Tb", 158.93, 158.9253547},
	{"Dy", 162.50, 163.9291819},
	{"Ho", 164.93, 164.9303288},
	{"Er", 167.26, 165.9302995},
	{"Tm", 168.93, 168.9342179},
	{"Yb", 173.05, 173.9388664},
	{"Lu", 174.97, 174.9407752},
	{"Hf", 178.49, 179.946557},
	{"Ta", 180.95, 180.9479958},
	{"W", 183.84, 183.95093092},
	{"Re", 186.21, 186.9557501},
	{"Os", 190.23, 191.961477},
	{"Ir", 192.22, 192.9629216},
	{"Pt", 195.08, 194.9647917},
	{"Au", 196.97, 196.96656879},
	{"Hg", 200.59, 201.9706434},
	{"Tl", 204.38, 204.9744278},
	{"Pb", 207.2, 207.9766525},
	{"Bi", 208.98, 208.9803991},
	{"Po", 209, 0},
	{"At", 210, 0},
	{"Rn", 222, 0},
	{"Fr", 223, 0},
	{"Ra", 226, 0},
	{"Ac", 227, 0},
	{"Th", 232.04, 232.0380558},
	{"Pa", 231.04, 231.0358842},
	{"U", 238.03, 238.0507884},
	{"Np", 237, 0},
	{"Pu", 244, 0},
	{"Am", 243, 0},
	{"Cm", 247, 0},
	{"Bk", 247, 0},
	{"Cf", 251, 0},
	{"Es", 252, 0},
	{"Fm", 257, 0},
	{"Md", 258, 0},
	{"No", 259, 0},
	{"Lr", 266, 0},
	{"Rf", 267, 0},
	{"Db", 268, 0},
	{"Sg", 269, 0},
	{"Bh", 270, 0},
	{"Hs", 269, 0},
	{"Mt", 278, 0},
	{"Ds", 281, 0},
	{"Rg", 282, 0},
	{"Cn", 285, 0},
	{"Nh", 286, 0},
	{"Fl", 289, 0},
	{"Mc", 290, 0},
	{"Lv", 293, 0},
	{"Ts", 294, 0},
	{"Og", 294, 0},
}

// isotopeMass holds exact masses (u, AME2020 via NIST, typed from memory) of
// isotopes that chemists label with; other isotopes fall back to the mass
// number, which is within 0.1 u for every light nuclide.
var isotopeMass = map[[2]int]float64{
	{1, 1}: 1.00782503207, {1, 2}: 2.01410177812, {1, 3}: 3.0160492779,
	{5, 10}: 10.01293695, {5, 11}: 11.00930536,
	{6, 11}: 11.0114336, {6, 12}: 12.0, {6, 13}: 13.00335483507, {6, 14}: 14.0032419884,
	{7, 13}: 13.00573861, {7, 14}: 14.00307400443, {7, 15}: 15.00010889888,
	{8, 15}: 15.0030656, {8, 16}: 15.99491461957, {8, 17}: 16.99913175650, {8, 18}: 17.99915961286,
	{9, 18}: 18.0009373, {9, 19}: 18.99840316273,
	{15, 31}: 30.97376199842, {15, 32}: 31.97390764,
	{16, 32}: 31.9720711744, {16, 33}: 32.9714589098, {16, 34}: 33.967867004, {16, 35}: 34.96903231, {16, 36}: 35.96708071,
	{17, 35}: 34.968852682, {17, 37}: 36.965902602,
	{35, 79}: 78.9183376, {35, 81}: 80.9162897,
	{53, 123}: 122.9055898, {53, 125}: 124.9046294, {53, 127}: 126.9044719, {53, 131}: 130.9061263,
}

var elementIndex = func() map[string]int {
	m := make(map[string]int, len(elements))
	for z, e := range elements {
		m[e.sym] = z
	}
	return m
}()

// AtomicNumber returns the atomic number of a capitalised element symbol
// ("C", "Cl"), 0 for the wildcard "*", and -1 for an unknown symbol.
func AtomicNumber(sym string) int {
	if z, ok := elementIndex[sym]; ok {
		return z
	}
	return -1
}

// IsElement reports whether sym is a known element symbol (or "*").
func IsElement(sym string) bool { return AtomicNumber(sym) >= 0 }

// StandardWeight returns the IUPAC 2021 standard atomic weight of the element
// (abridged/conventional value), or 0 for an unknown symbol or the wildcard.
func StandardWeight(sym string) float64 {
	z := AtomicNumber(sym)
	if z <= 0 {
		return 0
	}
	return elements[z].std
}

// IsotopeMass returns the mass in u of the given isotope of the element, or
// of its most abundant isotope when isotope is 0. Isotopes not tabulated
// return the mass number.
func IsotopeMass(sym string, isotope int) float64 {
	z := AtomicNumber(sym)
	if z <= 0 {
		return 0
	}
	if isotope == 0 {
		if m := elements[z].mono; m != 0 {
			return m
		}
		return elements[z].std
	}
	if m, ok := isotopeMass[[2]int{z, isotope}]; ok {
		return m
	}
	return float64(isotope)
}
