package spin

import (
	"errors"
	"strings"
	"testing"
)

const goodFile = `field_mhz = 400
line_width_hz = 0.8
[[group]]
name = "a"
shift_ppm = 5.80
[[group]]
name = "b"
shift_ppm = 5.20
count = 2
nucleus = "1H"
[[group]]
name = "F"
shift_ppm = -120
nucleus = "19F"
[[coupling]]
between = ["a", "b"]
j_hz = 17.0
[[coupling]]
between = ["F", "a"]
j_hz = 47
`

func TestParseFile(t *testing.T) {
	t.Parallel()
	f, err := ParseFile([]byte(goodFile), "good.toml")
	if err != nil {
		t.Fatal(err)
	}
	if f.FieldMHz != 400 || f.LineWidthHz != 0.8 || len(f.System.Groups) != 3 || len(f.System.Couplings) != 2 {
		t.Fatalf("parsed %+v", f)
	}
	if g := f.System.Groups[1]; g.Count != 2 || g.ShiftPPM != 5.2 || g.Nucleus != "1H" {
		t.Errorf("group b = %+v", g)
	}
	if c := f.System.Couplings[1]; c.A != 2 || c.B != 0 || c.JHz != 47 {
		t.Errorf("coupling 2 = %+v", c)
	}
	if g := f.System.Groups[0]; g.Count != 1 {
		t.Errorf("default count = %d, want 1", g.Count)
	}
}

// TestParseFileErrors pins the message and the line of each error.
func TestParseFileErrors(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name, src string
		line      int
		want      string
	}{
		{"syntax", "field_mhz = \n", 1, "x.toml:1"},
		{"no groups", "field_mhz = 400\n", 0, "no [[group]] tables"},
		{"unknown group", "[[group]]\nname = \"a\"\nshift_ppm = 1\n[[coupling]]\nbetween = [\"a\", \"q\"]\nj_hz = 7\n", 5, `coupling[1].between: unknown group "q"`},
		{"negative count", "[[group]]\nname = \"a\"\nshift_ppm = 1\ncount = -2\n", 4, "group[1].count: count must be between 1 and 64, found -2"},
		{"zero count", "[[group]]\nname = \"a\"\nshift_ppm = 1\ncount = 0\n", 4, "count must be between"},
		{"missing shift", "[[group]]\nname = \"a\"\n\n[[group]]\nname = \"b\"\n", 1, "group[1].shift_ppm: missing shift"},
		{"duplicate", "[[group]]\nname = \"a\"\nshift_ppm = 1\n[[group]]\nname = \"a\"\nshift_ppm = 2\n", 5, `duplicate group name "a"`},
		{"nucleus", "[[group]]\nname = \"a\"\nshift_ppm = 1\nnucleus = \"13C\"\n", 4, `unknown nucleus "13C"`},
		{"unknown key", "[[group]]\nname = \"a\"\nshift_ppm = 1\nshfit = 2\n", 4, `group.shfit: unknown key`},
		{"unknown top key", "fieldmhz = 400\n[[group]]\nname = \"a\"\nshift_ppm = 1\n", 1, `fieldmhz: unknown key`},
		{"missing J", "[[group]]\nname = \"a\"\nshift_ppm = 1\n[[group]]\nname = \"b\"\nshift_ppm = 2\n[[coupling]]\nbetween = [\"a\", \"b\"]\n", 7, "missing coupling constant"},
		{"self coupling", "[[group]]\nname = \"a\"\nshift_ppm = 1\n[[coupling]]\nbetween = [\"a\", \"a\"]\nj_hz = 7\n", 5, "to itself"},
		{"three names", "[[group]]\nname = \"a\"\nshift_ppm = 1\n[[coupling]]\nbetween = [\"a\"]\nj_hz = 7\n", 5, "expected two group names, found 1"},
		{"bad field", "field_mhz = -1\n[[group]]\nname = \"a\"\nshift_ppm = 1\n", 1, "field_mhz: must be a positive"},
		// Bounds (spinfile.go): a shift in Hz, a J or field in the wrong
		// unit is refused with its line and key (common practice, no source).
		{"huge shift", "[[group]]\nname = \"a\"\nshift_ppm = 1e300\n", 3, "group[1].shift_ppm: shift must be within ±1000 ppm, found 1e+300"},
		{"shift in Hz", "[[group]]\nname = \"a\"\nshift_ppm = -2320\n", 3, "shift must be within ±1000 ppm"},
		{"huge J", "[[group]]\nname = \"a\"\nshift_ppm = 1\n[[group]]\nname = \"b\"\nshift_ppm = 2\n[[coupling]]\nbetween = [\"a\", \"b\"]\nj_hz = 1e300\n", 9, "coupling[1].j_hz: J must be within ±1000 Hz, found 1e+300"},
		{"field in Hz", "field_mhz = 4e8\n[[group]]\nname = \"a\"\nshift_ppm = 1\n", 1, "field_mhz: must be the 1H observe frequency in MHz, between 1 and 10000"},
		{"field below 1", "\n\nfield_mhz = 0.4\n[[group]]\nname = \"a\"\nshift_ppm = 1\n", 3, "field_mhz: must be the 1H observe frequency"},
		{"huge width", "line_width_hz = 1e9\n[[group]]\nname = \"a\"\nshift_ppm = 1\n", 1, "line_width_hz: must be a positive number of Hz up to 1000"},
		{"wrong type", "[[group]]\nname = \"a\"\nshift_ppm = \"high\"\n", 0, "x.toml"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := ParseFile([]byte(tc.src), "x.toml")
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Fatalf("error %v, want it to contain %q", err, tc.want)
			}
			var fe FileErrors
			if !errors.As(err, &fe) {
				t.Fatalf("error %T is not FileErrors", err)
			}
			if tc.line > 0 && fe[0].Line != tc.line {
				t.Errorf("line %d, want %d (%v)", fe[0].Line, tc.line, err)
			}
		})
	}
}

// FuzzParseFile: any input parses or fails with FileErrors, never panics,
// and a parsed file simulates (or is refused) without panicking.
func FuzzParseFile(f *testing.F) {
	f.Add([]byte(goodFile))
	f.Add([]byte("[[group]]\nname = \"a\"\nshift_ppm = 1\ncount = 64\n"))
	f.Add([]byte("[[coupling]]\nbetween = [\"a\", \"b\"]\n"))
	f.Add([]byte("[[group]]\nname = \"a\"\nshift_ppm = 1e300\n[[group]]\nname = \"b\"\nshift_ppm = 2\n[[coupling]]\nbetween = [\"a\", \"b\"]\nj_hz = 1e300\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		file, err := ParseFile(data, "fuzz.toml")
		if err != nil {
			var fe FileErrors
			if !errors.As(err, &fe) || len(fe) == 0 {
				t.Fatalf("error %v is not a FileErrors list", err)
			}
			return
		}
		// Keep each input fast: splitting by many large groups is bounded
		// by MaxLines (TestRefuseManyLines) but can take seconds.
		nuclei := 0
		for _, g := range file.System.Groups {
			nuclei += g.Count
		}
		if nuclei > 40 {
			return
		}
		opt := Options{FieldMHz: 400, Mode: FirstOrder, MaxSpins: 8}
		if _, err := Simulate(file.System, opt); err != nil && !errors.Is(err, ErrTooLarge) {
			t.Fatalf("valid file fails to simulate: %v", err)
		}
	})
}
