package monomial

import (
	"fmt"
	"math/big"
	"strings"
	"unicode/utf8"
)

type tokenKind int

const (
	tEOF     tokenKind = iota
	tIllegal           // a lexical error; msg says what
	tNumber
	tIdent
	tPlus
	tMinus
	tStar
	tSlash
	tPow // ^ or **
	tLParen
	tRParen
	tSemi // ';' or a separating newline
	tComma
	tAssign
)

type token struct {
	kind      tokenKind
	off, end  int // byte offsets of the token text in the source
	line, col int // 1-based; col counts runes
	msg       string
}

// maxDecimalExponent bounds the exponent of a number in scientific notation
// (1e10000 is accepted, 1e10001 is not), so that a short literal cannot ask
// for a gigantic number.
const maxDecimalExponent = 10_000

// lexer splits source text into tokens. Spaces, tabs, carriage returns and
// comments (from '#' to the end of the line) are skipped. A newline is a
// separator token when newlineSep is set, the parentheses are balanced and
// the previous token can end an expression; otherwise it is skipped too.
type lexer struct {
	src        string
	off        int
	line, col  int
	depth      int
	canEnd     bool
	newlineSep bool
	nident     int // identifier tokens scanned so far
}

func newLexer(src string, newlineSep bool) *lexer {
	return &lexer{src: src, line: 1, col: 1, newlineSep: newlineSep}
}

func isLetter(r rune) bool { return r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r == '_' }
func isDigit(r rune) bool  { return r >= '0' && r <= '9' }

// identByte tells the bytes that continue an identifier: ASCII letters,
// digits and '_'.
var identByte = func() (t [256]bool) {
	for c := range 256 {
		t[c] = isLetter(rune(c)) || isDigit(rune(c))
	}
	return t
}()

// tokens returns all tokens of the source, ending with tEOF.
func (l *lexer) tokens() []token {
	var toks []token
	for {
		t := l.next()
		toks = append(toks, t)
		if t.kind == tEOF {
			return toks
		}
	}
}

// next returns the next token.
func (l *lexer) next() token {
	var t token
	l.scan(&t)
	return t
}

// scan reads the next token into *t. It scans bytes: everything but
// comments and unexpected characters is ASCII, so columns advance by one
// per byte there.
func (l *lexer) scan(t *token) {
	src := l.src
skip:
	for l.off < len(src) {
		switch src[l.off] {
		case ' ', '\t', '\r':
			l.off++
			l.col++
		case '#':
			end := strings.IndexByte(src[l.off:], '\n')
			if end < 0 {
				end = len(src) - l.off
			}
			l.col += utf8.RuneCountInString(src[l.off : l.off+end])
			l.off += end
		case '\n':
			if l.newlineSep && l.depth == 0 && l.canEnd {
				*t = token{kind: tSemi, off: l.off, end: l.off + 1, line: l.line, col: l.col}
				l.off++
				l.line++
				l.col = 1
				l.canEnd = false
				return
			}
			l.off++
			l.line++
			l.col = 1
		default:
			break skip
		}
	}
	*t = token{off: l.off, line: l.line, col: l.col}
	if l.off >= len(src) {
		t.kind = tEOF
		t.end = l.off
		l.canEnd = false
		return
	}
	c := src[l.off]
	switch {
	case isDigitByte(c) || c == '.':
		l.number(t)
	case isLetterByte(c):
		i := l.off + 1
		for i < len(src) && identByte[src[i]] {
			i++
		}
		l.col += i - l.off
		l.off = i
		t.kind = tIdent
		l.nident++
	case c >= utf8.RuneSelf:
		r, w := utf8.DecodeRuneInString(src[l.off:])
		l.off += w
		l.col++
		t.kind = tIllegal
		if r == utf8.RuneError {
			t.msg = "invalid UTF-8 encoding"
		} else {
			t.msg = fmt.Sprintf("unexpected character %q", r)
		}
	default:
		l.off++
		l.col++
		switch c {
		case '+':
			t.kind = tPlus
		case '-':
			t.kind = tMinus
		case '*':
			t.kind = tStar
			if l.off < len(src) && src[l.off] == '*' {
				l.off++
				l.col++
				t.kind = tPow
			}
		case '/':
			t.kind = tSlash
		case '^':
			t.kind = tPow
		case '(':
			t.kind = tLParen
			l.depth++
		case ')':
			t.kind = tRParen
			if l.depth > 0 {
				l.depth--
			}
		case ';':
			t.kind = tSemi
			l.depth = 0 // an expression never continues past a ';'
		case ',':
			t.kind = tComma
		case '=':
			t.kind = tAssign
		default:
			t.kind = tIllegal
			t.msg = fmt.Sprintf("unexpected character %q", rune(c))
		}
	}
	t.end = l.off
	l.canEnd = t.kind == tNumber || t.kind == tIdent || t.kind == tRParen
}

func isLetterByte(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' }
func isDigitByte(c byte) bool  { return c >= '0' && c <= '9' }

// number scans digits ["." digits] [("e"|"E") ["+"|"-"] digits], with at
// least one digit in the mantissa. Only a number with a decimal exponent
// can be too large, so only those are evaluated here.
func (l *lexer) number(t *token) {
	i := l.numberEnd(t)
	l.col += i - l.off // numbers are ASCII
	l.off = i
}

// numberEnd scans the number starting at l.off, sets t's kind (and message
// for a malformed number) and returns the offset where it ends.
func (l *lexer) numberEnd(t *token) int {
	src := l.src
	i := l.off
	t.kind = tNumber
	digits := 0
	for i < len(src) && isDigitByte(src[i]) {
		i++
		digits++
	}
	if i < len(src) && src[i] == '.' {
		i++
		for i < len(src) && isDigitByte(src[i]) {
			i++
			digits++
		}
	}
	if digits == 0 {
		t.kind = tIllegal
		t.msg = "malformed number: '.' must be followed or preceded by digits"
		return i
	}
	hasExp := false
	if i < len(src) && (src[i] == 'e' || src[i] == 'E') {
		i++
		if i < len(src) && (src[i] == '+' || src[i] == '-') {
			i++
		}
		n := 0
		for i < len(src) && isDigitByte(src[i]) {
			i++
			n++
		}
		if n == 0 {
			t.kind = tIllegal
			t.msg = fmt.Sprintf("malformed number %s: exponent has no digits", src[t.off:i])
			return i
		}
		hasExp = true
	}
	if i < len(src) && (isLetterByte(src[i]) || src[i] == '.') {
		// "2x" or "1.2.3": keep the error on the number.
		for i < len(src) && (isLetterByte(src[i]) || isDigitByte(src[i]) || src[i] == '.') {
			i++
		}
		t.kind = tIllegal
		t.msg = fmt.Sprintf("malformed number %s (write products with '*')", src[t.off:i])
		return i
	}
	if hasExp {
		if _, err := numberValue(src[t.off:i]); err != "" {
			t.kind = tIllegal
			t.msg = err
		}
	}
	return i
}

// numberValue returns the exact value of a number token's text, or an error
// message.
func numberValue(s string) (*big.Rat, string) {
	mant, exp := s, ""
	if i := strings.IndexAny(s, "eE"); i >= 0 {
		mant, exp = s[:i], s[i+1:]
	}
	scale := 0
	if exp != "" {
		neg := false
		switch exp[0] {
		case '+':
			exp = exp[1:]
		case '-':
			neg = true
			exp = exp[1:]
		}
		exp = strings.TrimLeft(exp, "0")
		if len(exp) > 6 {
			return nil, fmt.Sprintf("number %s is too large: its decimal exponent exceeds %d", s, maxDecimalExponent)
		}
		for _, c := range exp {
			scale = scale*10 + int(c-'0')
		}
		if scale > maxDecimalExponent {
			return nil, fmt.Sprintf("number %s is too large: its decimal exponent exceeds %d", s, maxDecimalExponent)
		}
		if neg {
			scale = -scale
		}
	}
	intPart, frac := mant, ""
	if i := strings.IndexByte(mant, '.'); i >= 0 {
		intPart, frac = mant[:i], mant[i+1:]
	}
	scale -= len(frac)
	n, ok := new(big.Int).SetString(intPart+frac, 10)
	if !ok {
		return nil, fmt.Sprintf("malformed number %s", s)
	}
	r := new(big.Rat).SetInt(n)
	if scale != 0 {
		p := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(scale))), nil)
		if scale > 0 {
			r.Mul(r, new(big.Rat).SetInt(p))
		} else {
			r.Quo(r, new(big.Rat).SetInt(p))
		}
	}
	return r, ""
}

func abs(x int) int {
	if x < 0 {
		return -x
	}
	return x
}

// describe returns how a token is named in messages: "'+'", "'x'",
// "end of input", "newline".
func describe(src string, t token) string {
	switch t.kind {
	case tEOF:
		return "end of input"
	case tSemi:
		if src[t.off] == '\n' {
			return "newline"
		}
	}
	return "'" + shorten(src[t.off:t.end]) + "'"
}

// shorten collapses white space and cuts long text for messages.
func shorten(s string) string {
	s = strings.Join(strings.Fields(s), " ")
	if utf8.RuneCountInString(s) > 40 {
		r := []rune(s)
		s = string(r[:37]) + "..."
	}
	return s
}
