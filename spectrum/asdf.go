package spectrum

import (
	"math"
	"strconv"
)

// ASDF (ASCII squeezed difference form, McDonald & Wilks 1988 §5.2, Table
// VII) writes each number with a pseudo-digit as its first character that
// carries the form, the sign and the first digit:
//
//	SQZ  @ A-I  a-i    value 0, +1..+9, -1..-9
//	DIF  % J-R  j-r    difference from the previous value
//	DUP  S-Z s         repeat count 1..9 of the previous token
//
// AFFN numbers start with a digit, '.', '+' or '-' (the last two also serve
// as PAC separators) and may carry an exponent "E+nn".

// tokKind is the form of one ASDF token.
type tokKind uint8

const (
	tokNone tokKind = iota
	tokAbs          // AFFN, PAC or SQZ: an absolute value
	tokDif          // DIF: a difference
	tokDup          // DUP: a repeat count
)

// pseudo maps a pseudo-digit to its form and signed first digit.
type pseudo struct {
	kind  tokKind
	digit int8 // signed first digit; for DUP the count digit
}

var pseudoTable = buildPseudo()

func buildPseudo() (t [256]pseudo) {
	t['@'] = pseudo{kind: tokAbs}
	t['%'] = pseudo{kind: tokDif}
	for i := 1; i <= 9; i++ {
		t['A'+i-1] = pseudo{kind: tokAbs, digit: int8(i)}
		t['a'+i-1] = pseudo{kind: tokAbs, digit: int8(-i)}
		t['J'+i-1] = pseudo{kind: tokDif, digit: int8(i)}
		t['j'+i-1] = pseudo{kind: tokDif, digit: int8(-i)}
	}
	for i := 1; i <= 8; i++ {
		t['S'+i-1] = pseudo{kind: tokDup, digit: int8(i)}
	}
	t['s'] = pseudo{kind: tokDup, digit: 9}
	return t
}

// lineScanner splits one data line into ASDF tokens.
type lineScanner struct {
	s   []byte
	pos int
	buf []byte // scratch for numbers that need strconv
}

// isSep reports whether c separates AFFN fields.
func isSep(c byte) bool { return c == ' ' || c == '\t' || c == ',' || c == ';' || c == '\r' }

func isDigit(c byte) bool { return c >= '0' && c <= '9' }

// next returns the next token. ok is false at the end of the line. A
// malformed token returns a non-empty msg.
func (sc *lineScanner) next() (kind tokKind, v float64, ok bool, msg string) {
	s := sc.s
	for sc.pos < len(s) && isSep(s[sc.pos]) {
		sc.pos++
	}
	if sc.pos >= len(s) {
		return tokNone, 0, false, ""
	}
	c := s[sc.pos]
	if p := pseudoTable[c]; p.kind != tokNone {
		sc.pos++
		v, msg := sc.digits(p.digit, p.kind == tokDup)
		return p.kind, v, true, msg
	}
	if isDigit(c) || c == '.' || c == '+' || c == '-' {
		v, msg := sc.affn()
		return tokAbs, v, true, msg
	}
	if c == '?' {
		return tokNone, 0, true, "missing value '?' is not supported"
	}
	return tokNone, 0, true, "unexpected character " + strconv.QuoteRune(rune(c)) + " in data"
}

// intDif reads the next token when it is a DIF value of at most 16
// digits without a decimal point (the common token of DIFDUP data) and
// returns it; otherwise it reads nothing and ok is false.
func (sc *lineScanner) intDif() (v float64, ok bool) {
	s, i := sc.s, sc.pos
	if i >= len(s) {
		return 0, false
	}
	p := pseudoTable[s[i]]
	if p.kind != tokDif {
		return 0, false
	}
	acc := int64(p.digit)
	neg := acc < 0
	if neg {
		acc = -acc
	}
	start := i + 1
	for i = start; i < len(s); i++ {
		c := s[i] - '0'
		if c > 9 {
			break
		}
		acc = acc*10 + int64(c)
	}
	if i-start >= 17 || (i < len(s) && s[i] == '.') {
		return 0, false // too long or a decimal: the general path decides
	}
	sc.pos = i
	v = float64(acc)
	if neg {
		v = -v
	}
	return v, true
}

// digits reads the digits that follow a pseudo-digit whose signed value is
// first. Numbers of up to maxExactDigits digits are converted exactly by
// hand; longer ones with a decimal point go through strconv.
func (sc *lineScanner) digits(first int8, intOnly bool) (float64, string) {
	s := sc.s
	start := sc.pos
	neg := first < 0
	lead := int64(first)
	if neg {
		lead = -lead
	}
	acc := lead
	i := sc.pos
	for i < len(s) {
		c := s[i] - '0'
		if c > 9 {
			break
		}
		acc = acc*10 + int64(c)
		i++
	}
	sc.pos = i
	if i-start >= 17 {
		return 0, "number with too many digits"
	}
	if i < len(s) && s[i] == '.' && !intOnly {
		frac := 0
		for sc.pos++; sc.pos < len(s) && isDigit(s[sc.pos]); sc.pos++ {
			acc = acc*10 + int64(s[sc.pos]-'0')
			frac++
		}
		if nd := 1 + (i - start) + frac; nd <= maxExactDigits {
			// The leading digit, the digits before the point and frac
			// after it: few enough for an exact conversion.
			return exactDecimal(uint64(acc), frac, neg), ""
		}
		sc.buf = append(sc.buf[:0], byte('0'+lead))
		sc.buf = append(sc.buf, s[start:sc.pos]...)
		f, err := strconv.ParseFloat(string(sc.buf), 64)
		if err != nil {
			return 0, "malformed number"
		}
		if neg {
			f = -f
		}
		return f, ""
	}
	v := float64(acc)
	if neg {
		v = -v
	}
	return v, ""
}

// affn reads an AFFN number: [sign] digits [. digits] [E sign digits].
func (sc *lineScanner) affn() (float64, string) {
	s := sc.s
	start := sc.pos
	neg := false
	if s[sc.pos] == '+' || s[sc.pos] == '-' {
		neg = s[sc.pos] == '-'
		sc.pos++
	}
	digStart := sc.pos
	var mant uint64
	n, frac := 0, 0 // digits read, digits after the point
	for sc.pos < len(s) && isDigit(s[sc.pos]) {
		if n < 18 {
			mant = mant*10 + uint64(s[sc.pos]-'0')
		}
		n++
		sc.pos++
	}
	if sc.pos < len(s) && s[sc.pos] == '.' {
		for sc.pos++; sc.pos < len(s) && isDigit(s[sc.pos]); sc.pos++ {
			if n < 18 {
				mant = mant*10 + uint64(s[sc.pos]-'0')
			}
			n++
			frac++
		}
	}
	simple := n > 0
	// An exponent is E or e followed by a sign and a digit; otherwise the
	// letter is an SQZ pseudo-digit that starts the next token.
	if sc.pos+2 < len(s) && (s[sc.pos] == 'E' || s[sc.pos] == 'e') &&
		(s[sc.pos+1] == '+' || s[sc.pos+1] == '-') && isDigit(s[sc.pos+2]) {
		simple = false
		for sc.pos += 2; sc.pos < len(s) && isDigit(s[sc.pos]); sc.pos++ {
		}
	}
	if sc.pos == digStart || (sc.pos == digStart+1 && s[digStart] == '.') {
		return 0, "malformed number " + strconv.Quote(string(s[start:sc.pos]))
	}
	if simple && n <= maxExactDigits {
		return exactDecimal(mant, frac, neg), ""
	}
	f, err := strconv.ParseFloat(string(s[start:sc.pos]), 64)
	if err != nil || math.IsInf(f, 0) {
		return 0, "malformed number " + strconv.Quote(string(s[start:sc.pos]))
	}
	return f, ""
}

// maxExactDigits is the most decimal digits exactDecimal takes: 10¹⁵ < 2⁵³,
// so the digits form an exactly representable integer, and at most 15
// digits after the point keep the power of ten exact too.
const maxExactDigits = 15

// pow10 holds the powers of ten that are exact in float64.
var pow10 = [...]float64{1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15}

// exactDecimal is ±mant·10⁻ᶠʳᵃᶜ for mant < 10¹⁵ and frac ≤ 15. Both operands
// are exact, so the one correctly rounded division gives the correctly
// rounded value, the same float64 that strconv.ParseFloat returns for the
// text (which takes this path itself: Clinger 1990, "How to read floating
// point numbers accurately", PLDI).
func exactDecimal(mant uint64, frac int, neg bool) float64 {
	f := float64(mant) / pow10[frac]
	if neg {
		f = -f
	}
	return f
}

// xyDecoder decodes the lines of an (X++(Y..Y)) table in any mix of AFFN
// and ASDF forms, checking DIF Y-check values between lines.
type xyDecoder struct {
	file    string
	ys      []float64 // raw ordinates, before YFACTOR
	marks   []lineMark
	maxN    int    // refuse to hold more points than this
	limit   string // what maxN stands for, for messages
	prevDIF bool   // previous line ended in DIF form: this line repeats its last Y
}

// lineMark records the abscissa written at the start of a line and the
// index of the point it belongs to, for X checks.
type lineMark struct {
	line  int
	x     float64
	index int
}

// decodeLine decodes one data line.
func (d *xyDecoder) decodeLine(num int, text []byte) error {
	sc := lineScanner{s: text}
	kind, x, ok, msg := sc.next()
	if !ok {
		return nil // blank line
	}
	if msg != "" {
		return errorf(d.file, num, "%s", msg)
	}
	if kind != tokAbs {
		return errorf(d.file, num, "expected an X value at the start of the line, found %q", clip(string(text)))
	}
	var (
		last     float64 // last Y value of this line
		lastDif  float64 // last difference, for DUP after DIF
		lastKind = tokNone
		first    = true
	)
	mark := lineMark{line: num, x: x, index: len(d.ys)}
	for {
		if lastKind != tokNone {
			if v, ok := sc.intDif(); ok {
				// The common token of DIFDUP data, without the general path.
				last += v
				lastDif, lastKind = v, tokDif
				if err := d.push(num, last); err != nil {
					return err
				}
				first = false
				continue
			}
		}
		kind, v, ok, msg := sc.next()
		if !ok {
			break
		}
		if msg != "" {
			return errorf(d.file, num, "%s", msg)
		}
		switch kind {
		case tokAbs:
			if first && d.prevDIF {
				n := len(d.ys)
				if !sameValue(v, d.ys[n-1]) {
					return errorf(d.file, num, "Y-check value %s does not match the last value %s of the previous line",
						fmtNum(v), fmtNum(d.ys[n-1]))
				}
				mark.index = n - 1
			} else if err := d.push(num, v); err != nil {
				return err
			}
			last, lastKind = v, tokAbs
		case tokDif:
			if lastKind == tokNone {
				return errorf(d.file, num, "DIF value at the start of a line; expected an absolute (SQZ or AFFN) value")
			}
			last += v
			lastDif, lastKind = v, tokDif
			if err := d.push(num, last); err != nil {
				return err
			}
		case tokDup:
			if lastKind == tokNone {
				return errorf(d.file, num, "DUP count without a preceding value")
			}
			if v < 1 {
				return errorf(d.file, num, "DUP count %s is less than 1", fmtNum(v))
			}
			if err := d.dup(num, int64(v)-1, &last, lastDif, lastKind); err != nil {
				return err
			}
		}
		first = false
	}
	if first && d.prevDIF {
		// A line holding only X: nothing to check; keep waiting.
		d.marks = append(d.marks, mark)
		return nil
	}
	d.prevDIF = lastKind == tokDif
	d.marks = append(d.marks, mark)
	return nil
}

// push appends one value, refusing to grow beyond maxN.
func (d *xyDecoder) push(num int, v float64) error {
	if len(d.ys) >= d.maxN {
		return d.limitError(num)
	}
	d.ys = append(d.ys, v)
	return nil
}

// dup repeats the previous token extra more times.
func (d *xyDecoder) dup(num int, extra int64, last *float64, dif float64, kind tokKind) error {
	if extra > int64(d.maxN-len(d.ys)) {
		return d.limitError(num)
	}
	for i := int64(0); i < extra; i++ {
		if kind == tokDif {
			*last += dif
		}
		d.ys = append(d.ys, *last)
	}
	return nil
}

// limitError reports data beyond maxN.
func (d *xyDecoder) limitError(num int) error {
	if d.limit != "" {
		return errorf(d.file, num, "more data points than %s", d.limit)
	}
	return errorf(d.file, num, "more than %d data points", d.maxN)
}

// sameValue compares a Y-check value with the value it repeats.
func sameValue(a, b float64) bool {
	return math.Abs(a-b) <= 1e-9*math.Max(1, math.Max(math.Abs(a), math.Abs(b)))
}

// fmtNum formats a number for messages.
func fmtNum(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
