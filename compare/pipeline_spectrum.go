package compare

import "shiftwise/spectrum"

func init() {
	defaultReader = spectrum.ReadFile
	defaultProcessor = func(s *spectrum.Spectrum, solvent string, opt Options) (*spectrum.PeakList, error) {
		return spectrum.Process(s, spectrum.ProcessOptions{Solvent: solvent, MinSNR: opt.MinSNR, FieldMHz: opt.FieldMHz})
	}
}

// peakArtifacts lists the peaks processing flagged as 13C satellites or
// spinning sidebands (they belong to no multiplet), each with the nearest
// multiplet at least 20 times its height... by area, as parent.
func peakArtifacts(pl *spectrum.PeakList) []Artifact {
	var out []Artifact
	for _, p := range pl.Peaks {
		if p.Artifact == "" {
			continue
		}
		a := Artifact{PPM: p.PPM, Kind: p.Artifact, Multiplet: -1}
		best := -1.0
		for _, m := range pl.Multiplets {
			d := abs(m.PPM - p.PPM)
			if best < 0 || d < best {
				// parent: the nearest multiplet, a satellite's is within ~0.3 ppm
				best, a.ParentPPM = d, m.PPM
			}
		}
		out = append(out, a)
	}
	return out
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
