package shiftinc

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"shiftwise/graph"
	"shiftwise/smiles"
)

// TestEmbeddedTables guards Default: the embedded TOML parses, every row
// has a source and a non-negative sd, and the rows the engine needs exist.
func TestEmbeddedTables(t *testing.T) {
	tab, err := parseEmbedded()
	if err != nil {
		t.Fatal(err)
	}
	total := 0
	for _, s := range sections {
		rows := tab.Rows(s)
		if len(rows) == 0 && s != "special" {
			t.Errorf("section %s is empty", s)
		}
		for _, r := range rows {
			total++
			if strings.TrimSpace(r.Source) == "" {
				t.Errorf("%s: %s.%s has no source", r.Where(), s, r.Key)
			}
			if r.SD < 0 || (r.SD == 0 && s != "solvent") {
				t.Errorf("%s: %s.%s has sd %g", r.Where(), s, r.Key, r.SD)
			}
		}
	}
	if total < 250 {
		t.Errorf("only %d rows", total)
	}
	if tab.Params.AlphaDamping <= 0 || tab.Params.ModelSD <= 0 || tab.Params.Hetero5Scale <= 0 || tab.Params.Hetero6Scale <= 0 {
		t.Errorf("params not set: %+v", tab.Params)
	}
	if err := tab.check(); err != nil {
		t.Error(err)
	}
}

func TestMergeErrors(t *testing.T) {
	tests := []struct {
		name, src string
		want      string // substring of the error, "" for success
	}{
		{"ok", "[[alpha]]\nkey = \"SeR\"\nch3 = 0.9\nch2 = 0.9\nch = 1.0\nsd = 0.2\nsource = \"mine\"\n", ""},
		{"syntax", "[[alpha]]\nkey = \"X\"\nch3 = \nsource = \"s\"\n", "user.toml:3:"},
		{"type", "[[alpha]]\nkey = \"X\"\nch3 = \"abc\"\nsource = \"s\"\n", "user.toml:3:"},
		{"unknown key", "[[alpha]]\nkey = \"X\"\nsource = \"s\"\nsd = 0.1\nfoo = 1\n", "user.toml:5: alpha.foo: unknown key"},
		{"unknown section", "[[gamma]]\nkey = \"X\"\n", "user.toml:1: gamma"},
		{"no source", "[[benzene]]\nkey = \"A\"\northo = 1\nsource = \"s\"\nsd = 0.1\n\n[[benzene]]\nkey = \"ZZ\"\northo = 1\n", "user.toml:7: benzene.ZZ: row without source"},
		{"no key", "[[beta]]\nsource = \"s\"\n", "user.toml:1: beta: row without key"},
		{"bad sd", "[[beta]]\nkey = \"Z\"\nsd = -1\nsource = \"s\"\n", "user.toml:1: beta.Z: uncertainty"},
		{"bad ring", "[[hetero]]\nkey = \"h\"\nring = \"c q c c c\"\nppm = 7\nsd = 0.1\nsource = \"s\"\n", "user.toml:1: hetero.h: ring:"},
		{"bad solvent", "[[exchangeable]]\nkey = \"OH-alcohol\"\nppm = 2\nsd = 1\nsource = \"s\"\nby_solvent = { \"mud\" = { ppm = 1, sd = 1 } }\n", "unknown solvent"},
		{"bad param", "[params]\nalpha_damping = 20\n", "user.toml:2: params.alpha_damping"},
		{"bad damping_like", "[[alpha]]\nkey = \"Cl\"\ndamping_like = 2\n", "user.toml:1: alpha.Cl: damping_like 2 out of range"},
		{"unknown param", "[params]\nwobble = 1\n", "user.toml:2: params.wobble: unknown parameter"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			tab := Default().Clone()
			before := len(tab.Rows("alpha"))
			err := tab.Merge(strings.NewReader(tc.src), "user.toml")
			switch {
			case tc.want == "" && err != nil:
				t.Fatalf("unexpected error %v", err)
			case tc.want != "" && err == nil:
				t.Fatalf("no error, want %q", tc.want)
			case tc.want != "" && !strings.Contains(err.Error(), tc.want):
				t.Fatalf("error %q, want it to contain %q", err, tc.want)
			}
			var te *Error
			if err != nil && !errors.As(err, &te) {
				t.Errorf("error %T is not *Error", err)
			}
			if err != nil && len(tab.Rows("alpha")) != before {
				t.Errorf("failed merge changed the table")
			}
		})
	}
}

// TestOverride: a user row replaces the embedded one and the change shows
// in the estimate; Default stays untouched.
func TestOverride(t *testing.T) {
	path := filepath.Join(t.TempDir(), "rules.toml")
	src := "[[alpha]]\nkey = \"Cl\"\nch3 = 3.00\nch2 = 2.2\nch = 2.6\nsd = 0.1\nsource = \"test override\"\n"
	if err := os.WriteFile(path, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	tab, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	m, err := smiles.Parse("CCl")
	if err != nil {
		t.Fatal(err)
	}
	p := graph.Proton{Atom: 0}
	if got := tab.Proton(m, p, "").PPM; got != 0.86+3.00 {
		t.Errorf("override: CH3Cl %.3f, want 3.86 (0.86 + 3.00)", got)
	}
	if got := Default().Proton(m, p, "").PPM; got != 0.86+2.19 {
		t.Errorf("default changed: CH3Cl %.3f, want 3.05", got)
	}
	if r := tab.row("alpha", "Cl"); r.Where() != path+":1" {
		t.Errorf("Where() = %q", r.Where())
	}
	// A partial row changes only the fields it gives.
	part := Default().Clone()
	if err := part.Merge(strings.NewReader("[[alpha]]\nkey = \"Cl\"\nch3 = 2.50\n"), "part.toml"); err != nil {
		t.Fatal(err)
	}
	r := part.row("alpha", "Cl")
	def := Default().row("alpha", "Cl")
	if r.CH3 != 2.50 || r.CH2 != def.CH2 || r.CH != def.CH || r.SD != def.SD || r.Source != def.Source {
		t.Errorf("partial override: %+v", *r)
	}
	if _, err := Load(filepath.Join(t.TempDir(), "missing.toml")); err == nil {
		t.Error("Load of a missing file: no error")
	}
}

// FuzzMerge: any input gives a table or an error, never a panic.
func FuzzMerge(f *testing.F) {
	f.Add("[[alpha]]\nkey = \"X\"\nch3 = 1\nsd = 0.1\nsource = \"s\"\n")
	f.Add("[params]\nalpha_damping = 0.5\n")
	f.Add("[[hetero]]\nkey = \"h\"\nring = \"c n C:* *\"\nppm = 7\nsd = 0.1\nsource = \"s\"\n")
	f.Add("[[exchangeable]]\nkey = \"OH-alcohol\"\nppm = 2\nsd = 1\nsource = \"s\"\nby_solvent = { DMSO-d6 = { ppm = 4, sd = 1 } }\n")
	f.Add("[[alpha]]\nkey = \"X\"\ndamping = 2\n")
	f.Fuzz(func(t *testing.T, src string) {
		tab := Default().Clone()
		if err := tab.Merge(strings.NewReader(src), "fuzz.toml"); err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.toml") {
				t.Errorf("error without file name: %v", err)
			}
			return
		}
		m, err := smiles.Parse("CC(Cl)c1ccncc1C=CC(=O)O")
		if err != nil {
			t.Fatal(err)
		}
		tab.Protons(m, "")
	})
}

// TestConcurrentUse: Default and Proton are safe for concurrent use (run
// with -race).
func TestConcurrentUse(t *testing.T) {
	done := make(chan map[graph.Proton]Estimate)
	for _, smi := range []string{"CCOC(=O)/C=C/c1ccccc1", "c1ccncc1C", "CC(C)O", "C=CC#N"} {
		go func() {
			m, err := smiles.Parse(smi)
			if err != nil {
				done <- nil
				return
			}
			done <- Default().Protons(m, "DMSO-d6")
		}()
	}
	for range 4 {
		if r := <-done; len(r) == 0 {
			t.Error("no estimates")
		}
	}
}

// TestDampingLikeOverride: a user row that sets only damping_like changes
// the CH2X2/CHX3 estimates and nothing else of the row. With damping_like
// = 1 chlorines are additive, so CHCl3 = CH base + 3 × the CH column
// (arithmetic of the scheme, doc.go).
func TestDampingLikeOverride(t *testing.T) {
	tab := Default().Clone()
	if err := tab.Merge(strings.NewReader("[[alpha]]\nkey = \"Cl\"\ndamping_like = 1\n"), "user.toml"); err != nil {
		t.Fatal(err)
	}
	m, err := smiles.Parse("ClC(Cl)Cl")
	if err != nil {
		t.Fatal(err)
	}
	cl, base := tab.row("alpha", "Cl"), tab.row("base", "CH")
	if cl.Source != Default().row("alpha", "Cl").Source || cl.CH != Default().row("alpha", "Cl").CH {
		t.Errorf("override changed other fields: %+v", cl)
	}
	got := tab.Proton(m, graph.Proton{Atom: 1}, "CDCl3").PPM
	if want := base.PPM + 3*cl.CH; math.Abs(got-want) > 1e-6 {
		t.Errorf("CHCl3 with damping_like 1: %.3f, want %.3f", got, want)
	}
	if def := Default().Proton(m, graph.Proton{Atom: 1}, "CDCl3").PPM; def >= got {
		t.Errorf("default %.3f should be below the additive %.3f", def, got)
	}
}
