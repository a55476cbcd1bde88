package predict

import (
	"math"
	"testing"
)

// TestPascal: n equivalent spin-½ partners split a line into n+1 lines with
// the binomial intensities of Pascal's triangle (e.g. 1:5:10:10:5:1 for
// five partners, 1:6:15:20:15:6:1 for six).
func TestPascal(t *testing.T) {
	t.Parallel()
	rows := [][]float64{
		{1, 1}, {1, 2, 1}, {1, 3, 3, 1}, {1, 4, 6, 4, 1}, {1, 5, 10, 10, 5, 1}, {1, 6, 15, 20, 15, 6, 1},
	}
	for n, row := range rows {
		ls := split([]hzLine{{0, 1}}, 7, n+1)
		if len(ls) != len(row) {
			t.Fatalf("n=%d: %d lines, want %d", n+1, len(ls), len(row))
		}
		sum := 0.0
		for _, v := range row {
			sum += v
		}
		for k, l := range ls {
			if math.Abs(l.in-row[k]/sum) > 1e-12 || math.Abs(l.hz-(float64(k)-float64(n+1)/2)*7) > 1e-9 {
				t.Errorf("n=%d line %d: %+v, want %.4f at %.1f Hz", n+1, k, l, row[k]/sum, (float64(k)-float64(n+1)/2)*7)
			}
		}
	}
}

// TestDDT: a proton coupled to groups with 17, 10 and 7 (×2) Hz is a
// doublet of doublets of triplets of 2·2·3 = 12 components (issue 3;
// first-order splitting, common practice). With exactly 17 = 10 + 7 two
// pairs of components coincide (10 distinct lines, the coincident ones of
// double intensity); with 17, 10 and 6 Hz all 12 are distinct.
func TestDDT(t *testing.T) {
	t.Parallel()
	lines := func(js ...float64) []hzLine {
		ls := []hzLine{{0, 1}}
		ls = split(ls, js[0], 1)
		ls = split(ls, js[1], 1)
		return split(ls, js[2], 2)
	}
	if n := len(lines(17, 10, 6)); n != 12 {
		t.Errorf("17/10/6 Hz: %d lines, want 12", n)
	}
	ls := lines(17, 10, 7)
	if len(ls) != 10 {
		t.Errorf("17/10/7 Hz: %d distinct lines, want 10", len(ls))
	}
	// Components weigh 1/16 (outer lines of each triplet) or 2/16 (centre
	// lines); two centre+outer coincidences give 3/16.
	triple := 0
	for _, l := range ls {
		if math.Abs(l.in-3.0/16) < 1e-9 {
			triple++
		}
	}
	if triple != 2 {
		t.Errorf("%d lines of intensity 3/16, want 2: %+v", triple, ls)
	}
	sets := mergeSets([]partnerSet{{j: 17, n: 1}, {j: 10, n: 1}, {j: 7, n: 2}}, 1)
	if got := nameSets(sets); got != "ddt" {
		t.Errorf("name %q, want ddt", got)
	}
}

// TestNames: multiplicity names in the trade's notation (common practice,
// no source): sets named by size, larger J first; near-equal J merge.
func TestNames(t *testing.T) {
	t.Parallel()
	type ps = partnerSet
	tests := []struct {
		sets []partnerSet
		want string
	}{
		{[]ps{{j: 7, n: 1}}, "d"},
		{[]ps{{j: 7, n: 2}}, "t"},
		{[]ps{{j: 7, n: 3}}, "q"},
		{[]ps{{j: 7, n: 4}}, "p"},                      // four equal couplings: 1:4:6:4:1 pentet
		{[]ps{{j: 7.2, n: 3}, {j: 7.4, n: 2}}, "sext"}, // propyl CH2
		{[]ps{{j: 6.9, n: 6}}, "sept"},
		{[]ps{{j: 6.9, n: 7}}, "m"},
		{[]ps{{j: 7, n: 1}, {j: 2, n: 1}}, "dd"},
		{[]ps{{j: 2, n: 2}, {j: 7, n: 1}}, "dt"},
		{[]ps{{j: 7, n: 2}, {j: 2, n: 1}}, "td"},
		{[]ps{{j: 7, n: 1}, {j: 2, n: 3}}, "dq"},
		{[]ps{{j: 7, n: 3}, {j: 2, n: 1}}, "qd"},
		{[]ps{{j: 7, n: 2}, {j: 2, n: 2}}, "tt"},
		{[]ps{{j: 10, n: 1}, {j: 7, n: 1}, {j: 2, n: 1}}, "ddd"},
		{[]ps{{j: 16, n: 1}, {j: 10, n: 1}, {j: 5, n: 1}, {j: 2, n: 1}}, "m"},
		{[]ps{{j: 7, n: 4}, {j: 2, n: 1}}, "m"},
	}
	for _, tc := range tests {
		if got := nameSets(mergeSets(tc.sets, 1)); got != tc.want {
			t.Errorf("%+v: %q, want %q", tc.sets, got, tc.want)
		}
	}
}

// TestNamesFromCouplings: naming through the signal view, with the
// line-width and strong-coupling rules.
func TestNamesFromCouplings(t *testing.T) {
	t.Parallel()
	opt := Options{LineWidthHz: 1}
	mk := func(ex bool, sets ...partnerSet) *system {
		s := &system{envs: []envState{{partners: sets}}}
		s.envs[0].env.Exchangeable = ex
		return s
	}
	tests := []struct {
		name string
		s    *system
		want string
	}{
		{"no partners", mk(false), "s"},
		{"exchangeable", mk(true), "br s"},
		{"J within line width", mk(false, partnerSet{j: 0.6, n: 3, deltaHz: 500}), "s"},
		// Common practice, no source: Δν/J ≈ 1 gives a roofed AB-type
		// pattern, not a clean doublet.
		{"strong", mk(false, partnerSet{j: 8, n: 1, deltaHz: 8}), "m"},
		{"weak", mk(false, partnerSet{j: 8, n: 1, deltaHz: 200}), "d"},
	}
	for _, tc := range tests {
		if got := tc.s.multiplicity(0, opt); got != tc.want {
			t.Errorf("%s: %q, want %q", tc.name, got, tc.want)
		}
	}
}
