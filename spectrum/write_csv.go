package spectrum

import (
	"bufio"
	"errors"
	"io"
	"strconv"
)

// WriteCSV writes s as comma-separated text with a header line: a trace as
// "ppm,intensity" rows in ascending ppm, or, when s has no trace, its peak
// table as "ppm,intensity,width_hz" rows. ReadCSV reads both back.
func WriteCSV(w io.Writer, s *Spectrum) error {
	if s == nil {
		return errors.New("spectrum: WriteCSV of a nil spectrum")
	}
	bw := bufio.NewWriter(w)
	var b []byte
	if len(s.PPM) > 0 {
		if len(s.Y) != len(s.PPM) {
			return errors.New("spectrum: WriteCSV: ppm and intensity lengths differ")
		}
		bw.WriteString("ppm,intensity\n")
		for i, p := range s.PPM {
			b = strconv.AppendFloat(b[:0], p, 'g', -1, 64)
			b = append(b, ',')
			b = strconv.AppendFloat(b, s.Y[i], 'g', -1, 64)
			b = append(b, '\n')
			bw.Write(b)
		}
		return bw.Flush()
	}
	bw.WriteString("ppm,intensity,width_hz\n")
	for _, p := range s.PeakTable {
		b = strconv.AppendFloat(b[:0], p.PPM, 'g', -1, 64)
		b = append(b, ',')
		b = strconv.AppendFloat(b, p.Intensity, 'g', -1, 64)
		b = append(b, ',')
		b = strconv.AppendFloat(b, p.WidthHz, 'g', -1, 64)
		b = append(b, '\n')
		bw.Write(b)
	}
	return bw.Flush()
}
