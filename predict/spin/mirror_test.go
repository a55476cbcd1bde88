package spin

import (
	"math"
	"testing"
)

// TestMirror checks the mirror-symmetry shortcut against the plain
// computation of every block (the same Hamiltonian, so the same lines up to
// rounding), and that it is taken only when the symmetry holds.
func TestMirror(t *testing.T) {
	a2b2 := System{
		Groups:    []Group{{Name: "a", ShiftPPM: 1.0, Count: 2}, {Name: "b", ShiftPPM: 1.05, Count: 2}},
		Couplings: []Coupling{{0, 1, 7}},
	}
	// Odd chain: the middle spin maps to itself.
	odd := chain(7, 0.02)
	// Asymmetric couplings: no symmetry.
	asym := chain(6, 0.05)
	asym.Couplings[0].JHz = 6
	for _, tc := range []struct {
		name string
		sys  System
		sym  bool
	}{
		{"chain8", chain(8, 0.05), true},
		{"chain7 odd", odd, true},
		{"A2B2 composite", a2b2, true},
		{"asymmetric J", asym, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			opt := Options{FieldMHz: 400, Mode: Exact}
			es := reduce(tc.sys, opt.FieldMHz)
			var spins []cspin
			for i, g := range es.g {
				spins = append(spins, cspin{twoF: g.n, nu: g.nu, grp: i})
			}
			if _, _, ok := mirror(spins, es.j); ok != tc.sym {
				t.Fatalf("mirror symmetry found = %v, want %v", ok, tc.sym)
			}
			got, err := Simulate(tc.sys, opt)
			if err != nil {
				t.Fatal(err)
			}
			useMirror = false
			want, err := Simulate(tc.sys, opt)
			useMirror = true
			if err != nil {
				t.Fatal(err)
			}
			if len(got.Lines) != len(want.Lines) {
				t.Fatalf("%d lines, plain computation %d", len(got.Lines), len(want.Lines))
			}
			// Tolerances far below the package's 0.01 Hz / 1% checks.
			for i, l := range got.Lines {
				w := want.Lines[i]
				if l.Group != w.Group || math.Abs(l.Hz-w.Hz) > 1e-6 || math.Abs(l.Intensity-w.Intensity) > 1e-9 {
					t.Fatalf("line %d: %+v, plain computation %+v", i, l, w)
				}
			}
			if math.Abs(got.Dropped-want.Dropped) > 1e-12 {
				t.Errorf("dropped %g, plain computation %g", got.Dropped, want.Dropped)
			}
		})
	}
}
