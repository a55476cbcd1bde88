package spin_test

import (
	"fmt"

	"shiftwise/predict/spin"
)

// An AB pair 0.05 ppm apart with J = 17 Hz at 400 MHz: the roofed quartet
// (lines at ν0 ± D/2 ± J/2, D = √(Δν² + J²)).
func ExampleSimulate() {
	sys := spin.System{
		Groups:    []spin.Group{{Name: "a", ShiftPPM: 5.80, Count: 1}, {Name: "b", ShiftPPM: 5.75, Count: 1}},
		Couplings: []spin.Coupling{{A: 0, B: 1, JHz: 17}},
	}
	res, err := spin.Simulate(sys, spin.Options{FieldMHz: 400, Mode: spin.Auto})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, l := range res.Spectrum() {
		fmt.Printf("%.4f ppm  %8.3f Hz  %.4f  %s %v\n", l.PPM, l.Hz, l.Intensity, sys.Groups[l.Group].Name, res.ModeUsed[l.Group])
	}
	// Output:
	// 5.7209 ppm  2288.376 Hz  0.1762  b exact
	// 5.7634 ppm  2305.376 Hz  0.8238  b exact
	// 5.7866 ppm  2314.624 Hz  0.8238  a exact
	// 5.8291 ppm  2331.624 Hz  0.1762  a exact
}
