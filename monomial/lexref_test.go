package monomial

import (
	"fmt"
	"unicode/utf8"
)

// refLexer is the previous rune-at-a-time lexer, kept as a test oracle for
// the byte-scanning lexer: both must produce the same tokens, positions and
// messages on every input.
type refLexer struct {
	src        string
	off        int
	line, col  int
	depth      int
	canEnd     bool
	newlineSep bool
}

func newRefLexer(src string, newlineSep bool) *refLexer {
	return &refLexer{src: src, line: 1, col: 1, newlineSep: newlineSep}
}

func (l *refLexer) peek() rune {
	if l.off >= len(l.src) {
		return -1
	}
	r, _ := utf8.DecodeRuneInString(l.src[l.off:])
	return r
}

func (l *refLexer) advance() {
	r, w := utf8.DecodeRuneInString(l.src[l.off:])
	l.off += w
	if r == '\n' {
		l.line++
		l.col = 1
	} else {
		l.col++
	}
}

func (l *refLexer) next() token {
	for {
		r := l.peek()
		switch {
		case r == ' ' || r == '\t' || r == '\r':
			l.advance()
			continue
		case r == '#':
			for l.off < len(l.src) && l.peek() != '\n' {
				l.advance()
			}
			continue
		case r == '\n':
			if l.newlineSep && l.depth == 0 && l.canEnd {
				t := token{kind: tSemi, off: l.off, end: l.off + 1, line: l.line, col: l.col}
				l.advance()
				l.canEnd = false
				return t
			}
			l.advance()
			continue
		}
		break
	}
	t := token{off: l.off, line: l.line, col: l.col}
	r := l.peek()
	switch {
	case r < 0:
		t.kind = tEOF
	case isDigit(r) || r == '.':
		l.number(&t)
	case isLetter(r):
		for r := l.peek(); isLetter(r) || isDigit(r); r = l.peek() {
			l.advance()
		}
		t.kind = tIdent
	default:
		l.advance()
		switch r {
		case '+':
			t.kind = tPlus
		case '-':
			t.kind = tMinus
		case '*':
			t.kind = tStar
			if l.peek() == '*' {
				l.advance()
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
			if r == utf8.RuneError {
				t.msg = "invalid UTF-8 encoding"
			} else {
				t.msg = fmt.Sprintf("unexpected character %q", r)
			}
		}
	}
	t.end = l.off
	l.canEnd = t.kind == tNumber || t.kind == tIdent || t.kind == tRParen
	return t
}

// number scans digits ["." digits] [("e"|"E") ["+"|"-"] digits], with at
// least one digit in the mantissa.
func (l *refLexer) number(t *token) {
	t.kind = tNumber
	digits := 0
	for isDigit(l.peek()) {
		l.advance()
		digits++
	}
	if l.peek() == '.' {
		l.advance()
		for isDigit(l.peek()) {
			l.advance()
			digits++
		}
	}
	if digits == 0 {
		t.kind = tIllegal
		t.msg = "malformed number: '.' must be followed or preceded by digits"
		return
	}
	if r := l.peek(); r == 'e' || r == 'E' {
		l.advance()
		if r := l.peek(); r == '+' || r == '-' {
			l.advance()
		}
		n := 0
		for isDigit(l.peek()) {
			l.advance()
			n++
		}
		if n == 0 {
			t.kind = tIllegal
			t.msg = fmt.Sprintf("malformed number %s: exponent has no digits", l.src[t.off:l.off])
			return
		}
	}
	if r := l.peek(); isLetter(r) || r == '.' {
		// "2x" or "1.2.3": keep the error on the number.
		for r := l.peek(); isLetter(r) || isDigit(r) || r == '.'; r = l.peek() {
			l.advance()
		}
		t.kind = tIllegal
		t.msg = fmt.Sprintf("malformed number %s (write products with '*')", l.src[t.off:l.off])
		return
	}
	if _, err := numberValue(l.src[t.off:l.off]); err != "" {
		t.kind = tIllegal
		t.msg = err
	}
}
