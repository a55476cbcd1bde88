package spin

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"math"
	"os"
	"regexp"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"shiftwise/internal/fileerr"
)

// File is a spin-system file: a small TOML description of groups and
// couplings, e.g.
//
//	field_mhz = 400          # optional
//	line_width_hz = 0.8      # optional
//	[[group]]
//	name = "a"
//	shift_ppm = 5.80
//	count = 1                # optional, default 1
//	nucleus = "1H"           # optional: 1H (default), 19F or 31P
//	[[coupling]]
//	between = ["a", "b"]
//	j_hz = 17.0
//
// Values are bounded so that a typo (a shift in Hz, a field in Hz or GHz)
// is refused with its file:line:key instead of simulated: shift_ppm within
// ±MaxFileShiftPPM, j_hz within ±MaxFileJHz, field_mhz in
// [MinFileFieldMHz, MaxFileFieldMHz] and line_width_hz in (0,
// MaxFileLineWidthHz].
type File struct {
	Name        string  // file name used in messages
	FieldMHz    float64 // 0 when the file does not say
	LineWidthHz float64 // 0 when the file does not say
	System      System
}

// FileError is an error at a line of a spin-system file (file, line, key,
// message), printed as "file:line: key: msg".
type FileError = fileerr.Error

// FileErrors is a list of errors in one file, sorted by line.
type FileErrors []*FileError

// Error reads like the first error, with the number of further ones.
func (l FileErrors) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

// Err returns nil for an empty list, else the list.
func (l FileErrors) Err() error {
	if len(l) == 0 {
		return nil
	}
	sort.SliceStable(l, func(i, k int) bool { return l[i].Line < l[k].Line })
	return l
}

type rawFile struct {
	FieldMHz    *float64      `toml:"field_mhz"`
	LineWidthHz *float64      `toml:"line_width_hz"`
	Group       []rawGroup    `toml:"group"`
	Coupling    []rawCoupling `toml:"coupling"`
}

type rawGroup struct {
	Name     *string  `toml:"name"`
	ShiftPPM *float64 `toml:"shift_ppm"`
	Count    *int64   `toml:"count"`
	Nucleus  *string  `toml:"nucleus"`
}

type rawCoupling struct {
	Between []string `toml:"between"`
	JHz     *float64 `toml:"j_hz"`
}

// ReadFile reads and parses the spin-system file at path.
func ReadFile(path string) (*File, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return ParseFile(data, path)
}

// ParseFile parses a spin-system file; name is used in messages. Errors are
// FileErrors naming the file, line and key.
func ParseFile(data []byte, name string) (*File, error) {
	var raw rawFile
	md, err := toml.NewDecoder(bytes.NewReader(data)).Decode(&raw)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, FileErrors{{File: name, Line: pe.Position.Line, Key: pe.LastKey, Msg: pe.Message}}
		}
		return nil, FileErrors{{File: name, Msg: strings.TrimPrefix(err.Error(), "toml: ")}}
	}
	p := &fileParser{name: name, loc: locate(data)}
	for _, k := range md.Undecoded() {
		p.errorf(p.loc.find(k), k.String(), "unknown key")
	}
	f := p.build(&raw)
	if err := p.errs.Err(); err != nil {
		return nil, err
	}
	return f, nil
}

type fileParser struct {
	name string
	loc  locator
	errs FileErrors
}

func (p *fileParser) errorf(line int, key, format string, args ...any) {
	p.errs = append(p.errs, &FileError{File: p.name, Line: line, Key: key, Msg: fmt.Sprintf(format, args...)})
}

// Bounds of the values of a spin-system file. The largest 1H, 19F and 31P
// shifts lie within a few hundred ppm and the largest H–P couplings (1J, in
// phosphines and phosphonates) below about 700 Hz (common practice, no
// source); 1H observe frequencies run from about 40 to 1200 MHz.
const (
	MaxFileShiftPPM    = 1000.0
	MaxFileJHz         = 1000.0
	MinFileFieldMHz    = 1.0
	MaxFileFieldMHz    = 10000.0
	MaxFileLineWidthHz = 1000.0
)

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

func (p *fileParser) build(raw *rawFile) *File {
	f := &File{Name: p.name}
	if raw.FieldMHz != nil {
		if f.FieldMHz = *raw.FieldMHz; !(f.FieldMHz > 0) || !finite(f.FieldMHz) {
			p.errorf(p.loc.line("", 0, "field_mhz"), "field_mhz", "must be a positive number of MHz, found %v", f.FieldMHz)
		} else if f.FieldMHz < MinFileFieldMHz || f.FieldMHz > MaxFileFieldMHz {
			p.errorf(p.loc.line("", 0, "field_mhz"), "field_mhz", "must be the 1H observe frequency in MHz, between %g and %g (e.g. 400), found %v",
				MinFileFieldMHz, MaxFileFieldMHz, f.FieldMHz)
		}
	}
	if raw.LineWidthHz != nil {
		if f.LineWidthHz = *raw.LineWidthHz; !(f.LineWidthHz > 0) || !finite(f.LineWidthHz) || f.LineWidthHz > MaxFileLineWidthHz {
			p.errorf(p.loc.line("", 0, "line_width_hz"), "line_width_hz", "must be a positive number of Hz up to %g, found %v", MaxFileLineWidthHz, f.LineWidthHz)
		}
	}
	if len(raw.Group) == 0 {
		p.errorf(0, "group", "no [[group]] tables: expected at least one group")
	}
	index := map[string]int{}
	for i, g := range raw.Group {
		f.System.Groups = append(f.System.Groups, p.group(i, g, index))
	}
	seen := map[[2]int]int{}
	for i, c := range raw.Coupling {
		if cp, ok := p.coupling(i, c, index, seen); ok {
			f.System.Couplings = append(f.System.Couplings, cp)
		}
	}
	return f
}

func (p *fileParser) group(i int, g rawGroup, index map[string]int) Group {
	key := func(k string) (int, string) {
		return p.loc.line("group", i, k), fmt.Sprintf("group[%d].%s", i+1, k)
	}
	out := Group{Count: 1, Nucleus: "1H"}
	if g.Name == nil || *g.Name == "" {
		l, k := key("name")
		p.errorf(l, k, "missing group name")
	} else {
		out.Name = *g.Name
		if prev, dup := index[out.Name]; dup {
			l, k := key("name")
			p.errorf(l, k, "duplicate group name %q (first used by group %d)", out.Name, prev+1)
		} else {
			index[out.Name] = i
		}
	}
	if g.ShiftPPM == nil {
		l, k := key("shift_ppm")
		p.errorf(l, k, "missing shift")
	} else if out.ShiftPPM = *g.ShiftPPM; !finite(out.ShiftPPM) {
		l, k := key("shift_ppm")
		p.errorf(l, k, "shift must be a finite number, found %v", out.ShiftPPM)
	} else if math.Abs(out.ShiftPPM) > MaxFileShiftPPM {
		l, k := key("shift_ppm")
		p.errorf(l, k, "shift must be within ±%g ppm, found %v", MaxFileShiftPPM, out.ShiftPPM)
	}
	if g.Count != nil {
		if c := *g.Count; c < 1 || c > MaxCount {
			l, k := key("count")
			p.errorf(l, k, "count must be between 1 and %d, found %d", MaxCount, c)
		} else {
			out.Count = int(c)
		}
	}
	if g.Nucleus != nil {
		switch *g.Nucleus {
		case "1H", "19F", "31P":
			out.Nucleus = *g.Nucleus
		default:
			l, k := key("nucleus")
			p.errorf(l, k, "unknown nucleus %q (expected 1H, 19F or 31P)", *g.Nucleus)
		}
	}
	return out
}

func (p *fileParser) coupling(i int, c rawCoupling, index map[string]int, seen map[[2]int]int) (Coupling, bool) {
	key := func(k string) (int, string) {
		return p.loc.line("coupling", i, k), fmt.Sprintf("coupling[%d].%s", i+1, k)
	}
	ok := true
	var ab [2]int
	if len(c.Between) != 2 {
		l, k := key("between")
		p.errorf(l, k, "expected two group names, found %d", len(c.Between))
		ok = false
	} else {
		for n, name := range c.Between {
			g, known := index[name]
			if !known {
				l, k := key("between")
				p.errorf(l, k, "unknown group %q", name)
				ok = false
			}
			ab[n] = g
		}
		if ok && ab[0] == ab[1] {
			l, k := key("between")
			p.errorf(l, k, "couples group %q to itself (a coupling inside an equivalent group leaves no trace)", c.Between[0])
			ok = false
		}
	}
	if ok {
		pair := [2]int{min(ab[0], ab[1]), max(ab[0], ab[1])}
		if prev, dup := seen[pair]; dup {
			l, k := key("between")
			p.errorf(l, k, "groups %q and %q are already coupled by coupling %d", c.Between[0], c.Between[1], prev+1)
			ok = false
		}
		seen[pair] = i
	}
	j := 0.0
	if c.JHz == nil {
		l, k := key("j_hz")
		p.errorf(l, k, "missing coupling constant")
		ok = false
	} else if j = *c.JHz; !finite(j) {
		l, k := key("j_hz")
		p.errorf(l, k, "J must be a finite number, found %v", j)
		ok = false
	} else if math.Abs(j) > MaxFileJHz {
		l, k := key("j_hz")
		p.errorf(l, k, "J must be within ±%g Hz, found %v", MaxFileJHz, j)
		ok = false
	}
	return Coupling{A: ab[0], B: ab[1], JHz: j}, ok
}

// locator maps keys of the file to line numbers by a light scan of the
// text: table headers and "key =" lines. It serves messages only; the TOML
// decoder does the parsing.
type locator struct {
	keys    map[string]int // "table/index/key" → line
	headers map[string]int // "table/index" → line of the header
}

var (
	headerRE = regexp.MustCompile(`^\s*\[\[\s*([A-Za-z0-9_-]+)\s*\]\]`)
	tableRE  = regexp.MustCompile(`^\s*\[\s*([A-Za-z0-9_.-]+)\s*\]`)
	keyRE    = regexp.MustCompile(`^\s*"?([A-Za-z0-9_-]+)"?\s*=`)
)

func locate(data []byte) locator {
	l := locator{keys: map[string]int{}, headers: map[string]int{}}
	count := map[string]int{}
	table, idx := "", 0
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 64*1024), 1<<20)
	for n := 1; sc.Scan(); n++ {
		text := sc.Text()
		if m := headerRE.FindStringSubmatch(text); m != nil {
			table, idx = m[1], count[m[1]]
			count[m[1]]++
			l.headers[fmt.Sprintf("%s/%d", table, idx)] = n
		} else if m := tableRE.FindStringSubmatch(text); m != nil {
			table, idx = m[1], 0
		} else if m := keyRE.FindStringSubmatch(text); m != nil {
			k := fmt.Sprintf("%s/%d/%s", table, idx, m[1])
			if _, ok := l.keys[k]; !ok {
				l.keys[k] = n
			}
		}
	}
	return l
}

// line returns the line of key in the idx-th table (0 when unknown; the
// table header when the key is absent).
func (l locator) line(table string, idx int, key string) int {
	if n, ok := l.keys[fmt.Sprintf("%s/%d/%s", table, idx, key)]; ok {
		return n
	}
	return l.headers[fmt.Sprintf("%s/%d", table, idx)]
}

// find returns the first line holding the undecoded key k.
func (l locator) find(k toml.Key) int {
	if len(k) == 0 {
		return 0
	}
	table, last := strings.Join(k[:len(k)-1], "."), k[len(k)-1]
	best := 0
	for key, n := range l.keys {
		parts := strings.SplitN(key, "/", 3)
		if parts[0] == table && parts[2] == last && (best == 0 || n < best) {
			best = n
		}
	}
	if best == 0 && len(k) == 1 {
		for key, n := range l.headers {
			if strings.HasPrefix(key, last+"/") && (best == 0 || n < best) {
				best = n
			}
		}
	}
	return best
}
