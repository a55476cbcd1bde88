package spectrum_test

import (
	"bytes"
	"fmt"
	"strings"

	"shiftwise/spectrum"
)

func ExampleReadJCAMP() {
	src := `##TITLE=demo
##JCAMP-DX=5.01
##DATA TYPE=NMR SPECTRUM
##.OBSERVE FREQUENCY=100
##XUNITS=HZ
##FIRSTX=500
##LASTX=100
##NPOINTS=5
##XYDATA=(X++(Y..Y)) $$ DIFDUP: 10 11 12 13 12
500 A0JT
300 A2J
200 A3j
100 A2
##END=
`
	s, err := spectrum.ReadJCAMP(strings.NewReader(src), "demo.jdx")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(s.FieldMHz, s.PPM, s.Y)

	_, err = spectrum.ReadJCAMP(strings.NewReader(strings.Replace(src, "200 A3j", "200 A4j", 1)), "demo.jdx")
	fmt.Println(err)
	// Output:
	// 100 [1 2 3 4 5] [12 13 12 11 10]
	// demo.jdx:12: Y-check value 14 does not match the last value 13 of the previous line
}

func ExampleWriteJCAMP() {
	s := &spectrum.Spectrum{PPM: []float64{1, 2, 3, 4}, Y: []float64{0, 5, 5, 5}, FieldMHz: 100}
	var buf bytes.Buffer
	if err := spectrum.WriteJCAMP(&buf, s, true); err != nil {
		fmt.Println(err)
		return
	}
	// Y is scaled so that max |Y| becomes 10^9; the file runs from high to
	// low frequency, and the last line repeats the last value as its Y-check.
	data := buf.String()
	fmt.Print(data[strings.Index(data, "##XYDATA"):])
	// Output:
	// ##XYDATA=(X++(Y..Y))
	// 400A000000000%Tj000000000
	// 100@
	// ##END=
}
