package model

import (
	"fmt"
	"unicode/utf8"
)

// tokenKind is the kind of a token of a description.
type tokenKind int

const (
	tEOF tokenKind = iota
	tNewline
	tIdent
	tNumber
	tPlus
	tMinus
	tStar
	tSlash
	tPow // ^ or **
	tLParen
	tRParen
	tLBrack
	tRBrack
	tLBrace
	tRBrace
	tComma
	tSemi
	tColon
	tTilde
	tAssign
	tQuote // ' (transpose)
)

// tokenNames are the kinds as messages name them.
var tokenNames = [...]string{
	tEOF: "end of input", tNewline: "end of line", tIdent: "name", tNumber: "number",
	tPlus: "'+'", tMinus: "'-'", tStar: "'*'", tSlash: "'/'", tPow: "'^'",
	tLParen: "'('", tRParen: "')'", tLBrack: "'['", tRBrack: "']'", tLBrace: "'{'", tRBrace: "'}'",
	tComma: "','", tSemi: "';'", tColon: "':'", tTilde: "'~'", tAssign: "'='", tQuote: "'''",
}

func (k tokenKind) String() string { return tokenNames[k] }

// token is one token: its kind and its text's byte offsets in the source.
type token struct {
	kind     tokenKind
	off, end int
}

// lexer splits a description into tokens on demand. Spaces, tabs, carriage
// returns and comments (from '#' to the end of the line) are skipped; a
// newline is a token (the end of a statement) except inside parentheses,
// brackets and braces, where statements may continue over several lines.
type lexer struct {
	src   string
	off   int
	depth int
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' }
func isDigit(c byte) bool  { return c >= '0' && c <= '9' }

// next returns the next token, or an *Error for a character that starts no
// token.
func (l *lexer) next() (token, *Error) {
	for l.off < len(l.src) {
		c := l.src[l.off]
		switch {
		case c == ' ' || c == '\t' || c == '\r':
			l.off++
			continue
		case c == '#':
			for l.off < len(l.src) && l.src[l.off] != '\n' {
				l.off++
			}
			continue
		case c == '\n' && l.depth > 0:
			l.off++
			continue
		}
		break
	}
	start := l.off
	if l.off >= len(l.src) {
		return token{tEOF, start, start}, nil
	}
	c := l.src[l.off]
	emit := func(k tokenKind, n int) (token, *Error) {
		l.off += n
		return token{k, start, l.off}, nil
	}
	switch {
	case isLetter(c):
		l.off++
		for l.off < len(l.src) && (isLetter(l.src[l.off]) || isDigit(l.src[l.off])) {
			l.off++
		}
		return token{tIdent, start, l.off}, nil
	case isDigit(c) || c == '.' && l.off+1 < len(l.src) && isDigit(l.src[l.off+1]):
		l.scanNumber()
		return token{tNumber, start, l.off}, nil
	}
	switch c {
	case '\n':
		return emit(tNewline, 1)
	case '+':
		return emit(tPlus, 1)
	case '-':
		return emit(tMinus, 1)
	case '*':
		if l.off+1 < len(l.src) && l.src[l.off+1] == '*' {
			return emit(tPow, 2)
		}
		return emit(tStar, 1)
	case '/':
		return emit(tSlash, 1)
	case '^':
		return emit(tPow, 1)
	case '(', '[', '{':
		l.depth++
		return emit(map[byte]tokenKind{'(': tLParen, '[': tLBrack, '{': tLBrace}[c], 1)
	case ')', ']', '}':
		if l.depth > 0 {
			l.depth--
		}
		return emit(map[byte]tokenKind{')': tRParen, ']': tRBrack, '}': tRBrace}[c], 1)
	case ',':
		return emit(tComma, 1)
	case ';':
		return emit(tSemi, 1)
	case ':':
		return emit(tColon, 1)
	case '~':
		return emit(tTilde, 1)
	case '=':
		return emit(tAssign, 1)
	case '\'':
		return emit(tQuote, 1)
	}
	r, size := utf8.DecodeRuneInString(l.src[l.off:])
	l.off += size
	if r == utf8.RuneError && size <= 1 {
		return token{}, errorAt(l.src, start, "invalid UTF-8 byte %#x", c)
	}
	return token{}, errorAt(l.src, start, "unexpected character %s", quoteRune(r))
}

// scanNumber reads digits [ "." digits ] [ ("e"|"E") ["+"|"-"] digits ]; the
// exponent is taken only when digits follow it, as in the expression
// language (monomial.ParseRat checks the text).
func (l *lexer) scanNumber() {
	for l.off < len(l.src) && isDigit(l.src[l.off]) {
		l.off++
	}
	if l.off < len(l.src) && l.src[l.off] == '.' {
		l.off++
		for l.off < len(l.src) && isDigit(l.src[l.off]) {
			l.off++
		}
	}
	if l.off < len(l.src) && (l.src[l.off] == 'e' || l.src[l.off] == 'E') {
		k := l.off + 1
		if k < len(l.src) && (l.src[k] == '+' || l.src[k] == '-') {
			k++
		}
		if k < len(l.src) && isDigit(l.src[k]) {
			for k < len(l.src) && isDigit(l.src[k]) {
				k++
			}
			l.off = k
		}
	}
}

// quoteRune writes r for a message: printable runes in quotes, others as
// U+XXXX.
func quoteRune(r rune) string {
	if r < ' ' || r == 0x7f {
		return fmt.Sprintf("U+%04X", r)
	}
	return fmt.Sprintf("%q", r)
}
