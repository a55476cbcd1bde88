package spectrum_test

import (
	"fmt"

	"shiftwise/spectrum"
)

// An ethyl group given as a peak list at 400 MHz: a 1:2:1 triplet and a
// 1:3:3:1 quartet 7.1 Hz apart line to line, intensities summing to 3 and 2.
// The integrals come out as whole numbers of H (the smallest of 1–4 for the
// smaller multiplet that makes both whole).
func ExampleProcess() {
	const field, j = 400.0, 7.1
	var pk []spectrum.Peak
	for k, w := range []float64{1, 2, 1} {
		pk = append(pk, spectrum.Peak{PPM: 1.20 + float64(k-1)*j/field, Intensity: w * 3 / 4})
	}
	for k, w := range []float64{1, 3, 3, 1} {
		pk = append(pk, spectrum.Peak{PPM: 4.10 + (float64(k)-1.5)*j/field, Intensity: w * 2 / 8})
	}
	pl, err := spectrum.Process(&spectrum.Spectrum{PeakTable: pk, FieldMHz: field, Solvent: "CDCl3"}, spectrum.ProcessOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, m := range pl.Multiplets {
		fmt.Printf("%.2f ppm  %s  J %.1f Hz  %.0f H\n", m.PPM, m.Multiplicity, m.JHz[0], m.Integral)
	}
	// Output:
	// 1.20 ppm  t  J 7.1 Hz  3 H
	// 4.10 ppm  q  J 7.1 Hz  2 H
}
