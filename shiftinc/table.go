package shiftinc

import (
	"bytes"
	"embed"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"sync"

	"github.com/BurntSushi/toml"

	"shiftwise/internal/fileerr"
)

//go:embed tables/*.toml
var embedded embed.FS

// Row is one additive rule: a base value, a substituent increment or a
// ring-position value. Which value fields are used depends on the section
// (see doc.go); unused ones stay zero.
type Row struct {
	Key   string  `toml:"key"`
	PPM   float64 `toml:"ppm"`   // base, ring, special, hetero rows
	CH3   float64 `toml:"ch3"`   // alpha, beta rows
	CH2   float64 `toml:"ch2"`   //
	CH    float64 `toml:"ch"`    //
	Gem   float64 `toml:"gem"`   // alkene rows (Pascual–Meier–Simon)
	Cis   float64 `toml:"cis"`   //
	Trans float64 `toml:"trans"` //
	Ortho float64 `toml:"ortho"` // benzene rows
	Meta  float64 `toml:"meta"`  //
	Para  float64 `toml:"para"`  //
	Ring  string  `toml:"ring"`  // hetero rows: ring pattern
	SD    float64 `toml:"sd"`    // 1-sigma uncertainty of the rule

	// Damping, in alpha rows, replaces params.alpha_damping for this
	// substituent when it is not the largest α increment on the carbon.
	Damping *float64 `toml:"damping"`
	// DampingLike, in alpha rows, is the factor for each larger α
	// substituent of the same group (halogen, O/N-bound, aryl) on the
	// carbon (CH2X2, CHX3, Ar2CH2); it may exceed 1 (aryl). Unset: Damping.
	DampingLike *float64 `toml:"damping_like"`
	Source      string   `toml:"source"`

	// BySolvent gives solvent-specific values (exchangeable rows), keyed by
	// normalised solvent name.
	BySolvent map[string]SolventValue `toml:"by_solvent"`

	// Solvent rows.
	Aliases []string `toml:"aliases"`
	ExtraSD float64  `toml:"extra_sd"`
	Offset  float64  `toml:"offset"`

	ring  []string // parsed Ring pattern
	file  string   // where the row was defined
	line  int
	order int // insertion order, for stable listing
}

// SolventValue is a shift and its uncertainty in one solvent.
type SolventValue struct {
	PPM float64 `toml:"ppm"`
	SD  float64 `toml:"sd"`
}

// Params are the global parameters of the scheme.
type Params struct {
	AlphaDamping float64 `toml:"alpha_damping"`       // factor on the 2nd, 3rd … α increment
	DonorDamping float64 `toml:"alpha_damping_donor"` // … of an O/N substituent per larger O/N one (acetals)
	BetaDamping  float64 `toml:"beta_damping"`        // factor on β increments per α halogen on the carbon
	ModelSD      float64 `toml:"model_sd"`            // added in quadrature to every estimate
	Hetero6Scale float64 `toml:"hetero6_scale"`       // benzene increments on 6-membered heteroaromatics
	Hetero5Scale float64 `toml:"hetero5_scale"`       // … on 5-membered heteroaromatics
}

// rawFile is the TOML schema of one table file.
type rawFile struct {
	Params       map[string]float64 `toml:"params"`
	Base         []Row              `toml:"base"`
	Alpha        []Row              `toml:"alpha"`
	Beta         []Row              `toml:"beta"`
	Ring         []Row              `toml:"ring"`
	Alkene       []Row              `toml:"alkene"`
	Benzene      []Row              `toml:"benzene"`
	Hetero       []Row              `toml:"hetero"`
	Special      []Row              `toml:"special"`
	Exchangeable []Row              `toml:"exchangeable"`
	Solvent      []Row              `toml:"solvent"`
	Peri         []Row              `toml:"peri"`
}

// sections lists the array-of-table sections in file order.
var sections = []string{"solvent", "base", "alpha", "beta", "ring", "alkene",
	"benzene", "hetero", "peri", "special", "exchangeable"}

func (f *rawFile) section(name string) []Row {
	switch name {
	case "base":
		return f.Base
	case "alpha":
		return f.Alpha
	case "beta":
		return f.Beta
	case "ring":
		return f.Ring
	case "alkene":
		return f.Alkene
	case "benzene":
		return f.Benzene
	case "hetero":
		return f.Hetero
	case "special":
		return f.Special
	case "exchangeable":
		return f.Exchangeable
	case "solvent":
		return f.Solvent
	case "peri":
		return f.Peri
	}
	return nil
}

// Table holds parsed increment tables: rows by section and key. A Table is
// safe for concurrent use by Proton once built; Merge must not run
// concurrently with lookups.
type Table struct {
	Params Params
	rows   map[string]map[string]*Row // section → key → row
	hetero []*Row                     // hetero rows in definition order
	n      int

	solventAlias map[string]string // folded alias → normalised name
}

// Error is a problem in a table file: the file, the line (0 when unknown),
// the key involved and a message. It prints as "file:line: key: msg".
type Error = fileerr.Error

var (
	defaultOnce  sync.Once
	defaultTable *Table
)

// Default returns the embedded tables, parsed once. It panics only if the
// embedded data is broken, which TestEmbeddedTables guards against. The
// returned Table must not be modified; use Load or Clone then Merge.
func Default() *Table {
	defaultOnce.Do(func() {
		t, err := parseEmbedded()
		if err != nil {
			panic("shiftinc: embedded tables: " + err.Error())
		}
		defaultTable = t
	})
	return defaultTable
}

func parseEmbedded() (*Table, error) {
	t := newTable()
	names, err := embedded.ReadDir("tables")
	if err != nil {
		return nil, err
	}
	for _, e := range names {
		data, err := embedded.ReadFile("tables/" + e.Name())
		if err != nil {
			return nil, err
		}
		if err := t.Merge(bytes.NewReader(data), "tables/"+e.Name()); err != nil {
			return nil, err
		}
	}
	if err := t.check(); err != nil {
		return nil, err
	}
	return t, nil
}

func newTable() *Table {
	return &Table{rows: map[string]map[string]*Row{}, solventAlias: map[string]string{}}
}

// Clone returns a deep-enough copy of t that Merge on it leaves t intact.
func (t *Table) Clone() *Table {
	c := newTable()
	c.Params = t.Params
	c.n = t.n
	for s, m := range t.rows {
		cm := make(map[string]*Row, len(m))
		for k, r := range m {
			cm[k] = r
		}
		c.rows[s] = cm
	}
	c.hetero = slices.Clone(t.hetero)
	for k, v := range t.solventAlias {
		c.solventAlias[k] = v
	}
	return c
}

// Load returns the default tables plus the rows of the user file at path,
// which add new keys or replace rows with the same section and key. Errors
// name the file, the line and the key.
func Load(path string) (*Table, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	t := Default().Clone()
	if err := t.Merge(f, path); err != nil {
		return nil, err
	}
	return t, nil
}

// Merge reads one table file from r (name is used in errors) and adds its
// rows to t, replacing rows of the same section and key. On error t is left
// unchanged.
func (t *Table) Merge(r io.Reader, name string) error {
	data, err := io.ReadAll(r)
	if err != nil {
		return &Error{File: name, Msg: err.Error()}
	}
	var f rawFile
	md, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&f)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return &Error{File: name, Line: pe.Position.Line, Key: pe.LastKey, Msg: pe.Message}
		}
		// Type mismatches come as plain errors:
		// `toml: line 3 (last key "alpha.ch3"): incompatible types: …`.
		if m := decodeErrRE.FindStringSubmatch(err.Error()); m != nil {
			line, _ := strconv.Atoi(m[1])
			return &Error{File: name, Line: line, Key: m[2], Msg: m[3]}
		}
		return &Error{File: name, Msg: strings.TrimPrefix(err.Error(), "toml: ")}
	}
	lines := indexLines(data)
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0]
		return &Error{File: name, Line: lines.keyLine(k), Key: k.String(), Msg: "unknown key"}
	}
	next := t.Clone()
	if err := next.addParams(f.Params, name, lines); err != nil {
		return err
	}
	// Which fields each row sets, so that a row overriding an existing key
	// changes only the values it gives.
	var present map[string]any
	if _, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&present); err != nil {
		return &Error{File: name, Msg: err.Error()}
	}
	for _, s := range sections {
		given, _ := present[s].([]map[string]any)
		for i := range f.section(s) {
			row := f.section(s)[i]
			if old := next.row(s, row.Key); old != nil && i < len(given) {
				row = overlay(*old, row, given[i])
			}
			row.file, row.line = name, lines.rowLine(s, i)
			if err := next.addRow(s, row); err != nil {
				return err
			}
		}
	}
	*t = *next
	return nil
}

var paramNames = map[string]func(*Params) *float64{
	"alpha_damping":       func(p *Params) *float64 { return &p.AlphaDamping },
	"alpha_damping_donor": func(p *Params) *float64 { return &p.DonorDamping },
	"beta_damping":        func(p *Params) *float64 { return &p.BetaDamping },
	"model_sd":            func(p *Params) *float64 { return &p.ModelSD },
	"hetero6_scale":       func(p *Params) *float64 { return &p.Hetero6Scale },
	"hetero5_scale":       func(p *Params) *float64 { return &p.Hetero5Scale },
}

func (t *Table) addParams(ps map[string]float64, name string, lines lineIndex) error {
	keys := make([]string, 0, len(ps))
	for k := range ps {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	for _, k := range keys {
		f, ok := paramNames[k]
		line := lines.keyLine(toml.Key{"params", k})
		if !ok {
			return &Error{File: name, Line: line, Key: "params." + k, Msg: "unknown parameter"}
		}
		v := ps[k]
		if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 || v > 10 {
			return &Error{File: name, Line: line, Key: "params." + k, Msg: fmt.Sprintf("value %g out of range [0, 10]", v)}
		}
		*f(&t.Params) = v
	}
	return nil
}

// addRow validates one row and stores it.
func (t *Table) addRow(section string, row Row) error {
	fail := func(msg string, a ...any) error {
		return &Error{File: row.file, Line: row.line, Key: section + "." + row.Key, Msg: fmt.Sprintf(msg, a...)}
	}
	if row.Key == "" {
		return &Error{File: row.file, Line: row.line, Key: section, Msg: "row without key"}
	}
	if strings.TrimSpace(row.Source) == "" {
		return fail("row without source")
	}
	for _, v := range []float64{row.PPM, row.CH3, row.CH2, row.CH, row.Gem, row.Cis,
		row.Trans, row.Ortho, row.Meta, row.Para, row.Offset} {
		if math.IsNaN(v) || math.IsInf(v, 0) || math.Abs(v) > 30 {
			return fail("value %g out of range", v)
		}
	}
	if d := row.Damping; d != nil && (math.IsNaN(*d) || *d < 0 || *d > 1) {
		return fail("damping %g out of range [0, 1]", *d)
	}
	if d := row.DampingLike; d != nil && (math.IsNaN(*d) || *d < 0 || *d > 1.5) {
		return fail("damping_like %g out of range [0, 1.5]", *d)
	}
	if math.IsNaN(row.SD) || row.SD < 0 || row.SD > 10 || math.IsNaN(row.ExtraSD) || row.ExtraSD < 0 || row.ExtraSD > 10 {
		return fail("uncertainty out of range [0, 10]")
	}
	for s, v := range row.BySolvent {
		if _, ok := t.NormalizeSolvent(s); !ok && section != "solvent" {
			return fail("unknown solvent %q in by_solvent", s)
		}
		if math.IsNaN(v.PPM) || math.Abs(v.PPM) > 30 || math.IsNaN(v.SD) || v.SD < 0 || v.SD > 10 {
			return fail("by_solvent %s: value out of range", s)
		}
	}
	switch section {
	case "hetero":
		toks, err := parseRing(row.Ring)
		if err != nil {
			return fail("ring: %v", err)
		}
		row.ring = toks
	case "solvent":
		for _, a := range append([]string{row.Key}, row.Aliases...) {
			t.solventAlias[foldSolvent(a)] = row.Key
		}
	}
	m := t.rows[section]
	if m == nil {
		m = map[string]*Row{}
		t.rows[section] = m
	}
	if old, ok := m[row.Key]; ok {
		row.order = old.order
	} else {
		t.n++
		row.order = t.n
	}
	r := row
	m[row.Key] = &r
	if section == "hetero" {
		t.hetero = slices.DeleteFunc(t.hetero, func(h *Row) bool { return h.Key == r.Key })
		t.hetero = append(t.hetero, &r)
	}
	return nil
}

// check verifies that the rows the engine relies on exist.
func (t *Table) check() error {
	need := map[string][]string{
		"base":    {"CH3", "CH2", "CH", "vinyl", "benzene"},
		"alpha":   {"alkyl", "other"},
		"beta":    {"alkyl", "other"},
		"alkene":  {"other"},
		"benzene": {"other", "aza"},
		"special": {"fallback-sp3", "fallback-sp2", "fallback-aromatic", "fallback-other"},
		"solvent": {"CDCl3"},
	}
	for s, keys := range need {
		for _, k := range keys {
			if t.row(s, k) == nil {
				return &Error{File: "tables", Key: s + "." + k, Msg: "required row missing"}
			}
		}
	}
	return nil
}

// row returns the row of section with key, or nil.
func (t *Table) row(section, key string) *Row { return t.rows[section][key] }

// lookup returns the first row of section whose key is in keys.
func (t *Table) lookup(section string, keys []string) *Row {
	m := t.rows[section]
	for _, k := range keys {
		if r, ok := m[k]; ok {
			return r
		}
	}
	return nil
}

// Rows returns the rows of a section ordered by first definition, for
// listing and tests. Sections are those of the TOML schema (doc.go).
func (t *Table) Rows(section string) []Row {
	m := t.rows[section]
	out := make([]Row, 0, len(m))
	for _, r := range m {
		out = append(out, *r)
	}
	slices.SortFunc(out, func(a, b Row) int { return a.order - b.order })
	return out
}

// Where returns "file:line" of the definition of a row.
func (r Row) Where() string { return fmt.Sprintf("%s:%d", r.file, r.line) }

// lineIndex locates rows and keys in the raw TOML text, since the decoder
// reports positions only for syntax and type errors.
type lineIndex struct {
	lines   []string
	headers map[string][]int // section → 1-based lines of its [[section]] headers
}

var decodeErrRE = regexp.MustCompile(`^toml: line (\d+) \(last key "([^"]*)"\): (.*)$`)

var headerRE = regexp.MustCompile(`^\s*\[\[\s*([A-Za-z0-9_.-]+)\s*\]\]`)

func indexLines(data []byte) lineIndex {
	li := lineIndex{lines: strings.Split(string(data), "\n"), headers: map[string][]int{}}
	for i, l := range li.lines {
		if m := headerRE.FindStringSubmatch(l); m != nil {
			li.headers[m[1]] = append(li.headers[m[1]], i+1)
		}
	}
	return li
}

func (li lineIndex) rowLine(section string, i int) int {
	if h := li.headers[section]; i < len(h) {
		return h[i]
	}
	return 0
}

// keyLine finds the line where the last element of k is assigned, after the
// header of its first element when there is one.
func (li lineIndex) keyLine(k toml.Key) int {
	if len(k) == 0 {
		return 0
	}
	start, found := 0, false
	if h := li.headers[k[0]]; len(h) > 0 {
		start, found = h[0]-1, true
	} else {
		tre := regexp.MustCompile(`^\s*\[\s*` + regexp.QuoteMeta(k[0]) + `\s*\]`)
		for i, l := range li.lines {
			if tre.MatchString(l) {
				start, found = i, true
				break
			}
		}
	}
	if len(k) == 1 && found {
		return start + 1
	}
	last := k[len(k)-1]
	re := regexp.MustCompile(`^\s*"?` + regexp.QuoteMeta(last) + `"?\s*=`)
	for i := start; i < len(li.lines); i++ {
		if re.MatchString(li.lines[i]) {
			return i + 1
		}
	}
	return 0
}

// overlay returns base with the fields of upd that the file gave (set)
// copied over. Keys match without regard to case, as the decoder matches
// them to the Row fields ("CH3 = …" fills CH3 like "ch3 = …").
func overlay(base, upd Row, set map[string]any) Row {
	out := base
	for k := range set {
		switch strings.ToLower(k) {
		case "ppm":
			out.PPM = upd.PPM
		case "ch3":
			out.CH3 = upd.CH3
		case "ch2":
			out.CH2 = upd.CH2
		case "ch":
			out.CH = upd.CH
		case "gem":
			out.Gem = upd.Gem
		case "cis":
			out.Cis = upd.Cis
		case "trans":
			out.Trans = upd.Trans
		case "ortho":
			out.Ortho = upd.Ortho
		case "meta":
			out.Meta = upd.Meta
		case "para":
			out.Para = upd.Para
		case "ring":
			out.Ring = upd.Ring
		case "sd":
			out.SD = upd.SD
		case "source":
			out.Source = upd.Source
		case "damping":
			out.Damping = upd.Damping
		case "damping_like":
			out.DampingLike = upd.DampingLike
		case "by_solvent":
			out.BySolvent = upd.BySolvent
		case "aliases":
			out.Aliases = upd.Aliases
		case "extra_sd":
			out.ExtraSD = upd.ExtraSD
		case "offset":
			out.Offset = upd.Offset
		}
	}
	return out
}
