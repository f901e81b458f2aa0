package monomial

import (
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

// compareLexers checks that the lexer and the reference lexer give the
// same tokens (kind, span, position, message) on src, in both newline
// modes.
func compareLexers(t *testing.T, src string) {
	t.Helper()
	for _, sep := range []bool{false, true} {
		l, r := newLexer(src, sep), newRefLexer(src, sep)
		for i := 0; ; i++ {
			a, b := l.next(), r.next()
			if a != b {
				t.Fatalf("%q (newlines separate: %v): token %d is %+v, reference %+v", src, sep, i, a, b)
			}
			if a.kind == tEOF {
				break
			}
		}
	}
}

// TestLexerMatchesReference compares the byte-scanning lexer with the
// previous rune-at-a-time lexer on the test inputs and on tricky text.
func TestLexerMatchesReference(t *testing.T) {
	srcs := []string{
		"x1^4*x3^10 + 2.5e-3*y - .5/7.", "2ex", "2e+x", "2e+", "1e5x", "1.2.3", "..", "1e10001", "1e0000000000001",
		"x # é comment\n y", "# only", "#\n#\n", "\xff\xfe x", "x\r\n+\ty", "a**b***c", "é+ü", "x;\ny\n(z\n)", "(((\n)))\nx",
		"_a_1 + B2_", "0.000", "00012", "123456789012345678901234567890", "x,y=z", "\t\t", "",
	}
	for _, tc := range validCases {
		srcs = append(srcs, tc.src)
	}
	for _, tc := range invalidCases {
		srcs = append(srcs, tc.src)
	}
	r := rand.New(rand.NewPCG(5, 6))
	alphabet := []string{"x", "y1", "2", ".", "e", "E", "+", "-", "*", "^", "/", "(", ")", " ", "\n", "#", "é", "\xff", ";", ",", "=", "\r", "_"}
	for range 2000 {
		var b strings.Builder
		for range r.IntN(20) {
			b.WriteString(alphabet[r.IntN(len(alphabet))])
		}
		srcs = append(srcs, b.String())
	}
	for _, src := range srcs {
		compareLexers(t, src)
	}
}

// TestFastTerm checks which terms the fast path reads, and that it leaves
// the parser where it was when it declines one.
func TestFastTerm(t *testing.T) {
	for _, tc := range []struct {
		src    string
		accept bool
		want   string // the term read, when accepted
	}{
		{"2*x^3*y", true, "2*x^3*y"},
		{"x*x^2*x", true, "x^4"},
		{"(a*b^2)^2", true, "a^2*b^4"},
		{"-3/4*x", true, "-3/4*x"},
		{"x/2/3", true, "1/6*x"},
		{"2*-3*--x", true, "-6*x"},
		{"0.25*x^0", true, "1/4"},
		{"0*x^5", true, "0"},
		{"(-1)^3*x", true, "-x"},
		{"(2*x)^10", true, "1024*x^10"},
		{"x + y", true, "x"}, // one term: the sum is the caller's business
		{"x^y", false, ""},
		{"(x+y)^2", false, ""},
		{"exp(x)", false, ""},
		{"x^2^3", false, ""},
		{"x/y", false, ""},
		{"x/0", false, ""},
		{"x/2^2", false, ""},
		{"x^-1", false, ""},
		{"x^(2)", false, ""},
		{"x^1.5", false, ""},
		{"f(x)", false, ""},
		{"x^2000000000000", false, ""},
		{"((((((((((x))))))))))", false, ""},
		{"x*", false, ""},
		{"2x", false, ""},
	} {
		s, err := newSession(tc.src, Config{}, false)
		if err != nil {
			t.Fatal(err)
		}
		p := s.newParser()
		var buf termBuf
		_, end, ok := p.fastTerm(&buf, false)
		if ok != tc.accept {
			t.Errorf("fastTerm(%q) = %v, want %v", tc.src, ok, tc.accept)
			continue
		}
		if !ok {
			if p.tok().off != 0 || len(buf.coefs) != 0 || p.lx.off != newSession0(t, tc.src).lx.off {
				t.Errorf("fastTerm(%q) declined but moved to offset %d", tc.src, p.tok().off)
			}
			continue
		}
		if got := buf.poly(p.vars).String(); got != tc.want {
			t.Errorf("fastTerm(%q) read %s, want %s", tc.src, got, tc.want)
		}
		if wantEnd := len(strings.Split(tc.src, " +")[0]); end != wantEnd {
			t.Errorf("fastTerm(%q) ends at %d, want %d", tc.src, end, wantEnd)
		}
	}
}

// newSession0 returns a fresh parser on src, at its first token.
func newSession0(t *testing.T, src string) *parser {
	s, err := newSession(src, Config{}, false)
	if err != nil {
		t.Fatal(err)
	}
	return s.newParser()
}

// randomFastInput returns a sum whose terms exercise the fast path and the
// ways it declines: products of numbers (integers, decimals, fractions,
// long and scientific literals), variables and parenthesized products, with
// signs, literal powers and divisions, mixed with sums in parentheses,
// functions, symbolic or chained exponents and divisions by variables.
func randomFastInput(r *rand.Rand, terms int) string {
	vars := []string{"x1", "x2", "x3", "y", "z_1"}
	number := func() string {
		switch r.IntN(8) {
		case 0:
			return "0." + strconv.Itoa(r.IntN(1000))
		case 1:
			return "123456789012345678901234567890"
		case 2:
			return "2.5e-3"
		case 3:
			return "0"
		}
		return strconv.Itoa(1 + r.IntN(20))
	}
	var factor func(depth int) string
	factor = func(depth int) string {
		var f string
		switch k := r.IntN(12); {
		case k < 5:
			f = vars[r.IntN(len(vars))]
		case k < 7:
			f = number()
		case k < 9 && depth < 3:
			n := 1 + r.IntN(3)
			parts := make([]string, n)
			for i := range parts {
				parts[i] = factor(depth + 1)
			}
			f = "(" + strings.Join(parts, "*") + ")"
		case k == 9 && depth < 3:
			f = "(" + factor(depth+1) + " + " + factor(depth+1) + ")"
		case k == 10:
			f = "sin(" + vars[r.IntN(len(vars))] + ")"
		default:
			f = vars[r.IntN(len(vars))]
		}
		switch r.IntN(10) {
		case 0, 1, 2:
			f += "^" + strconv.Itoa(r.IntN(5))
		case 3:
			f += "**2"
		case 4:
			f += "^2^2"
		case 5:
			f += "^(1+1)"
		case 6:
			f = "-" + f
		}
		return f
	}
	var b strings.Builder
	for i := range terms {
		if i > 0 {
			b.WriteString([]string{" + ", " - ", "\n+ "}[r.IntN(3)])
		}
		n := 1 + r.IntN(4)
		for j := range n {
			if j > 0 {
				switch r.IntN(8) {
				case 0:
					b.WriteString("/")
					if r.IntN(4) == 0 {
						b.WriteString(vars[r.IntN(len(vars))])
					} else {
						b.WriteString(strconv.Itoa(1 + r.IntN(9)))
					}
					continue
				default:
					b.WriteString("*")
				}
			}
			b.WriteString(factor(0))
		}
	}
	return b.String()
}

// parseBoth parses src with and without the fast path.
func parseBoth(src string, cfg Config) (fast, general *Expansion, errFast, errGeneral error) {
	fast, errFast = Parse(src, cfg)
	fastPath = false
	defer func() { fastPath = true }()
	general, errGeneral = Parse(src, cfg)
	return
}

// cut shortens long text for failure messages.
func cut(s string) string {
	if len(s) > 300 {
		return s[:300] + "..."
	}
	return s
}

func sameResult(t *testing.T, src string, cfg Config) {
	t.Helper()
	if len(src) > 300 {
		defer func() {
			if t.Failed() {
				t.Logf("full input: %q", src)
			}
		}()
	}
	a, b, ea, eb := parseBoth(src, cfg)
	switch {
	case (ea == nil) != (eb == nil):
		t.Errorf("order %d: %q: fast path error %v, general path error %v", cfg.Order, cut(src), ea, eb)
	case ea != nil:
		if ea.Error() != eb.Error() {
			t.Errorf("order %d: %q: fast path error %v, general path error %v", cfg.Order, cut(src), ea, eb)
		}
	case !a.Poly.Equal(b.Poly) || a.Truncated != b.Truncated:
		t.Errorf("order %d: %q: fast path %s (truncated %v), general path %s (truncated %v)", cfg.Order, cut(src), cut(a.Poly.String()), a.Truncated, cut(b.Poly.String()), b.Truncated)
	}
}

// TestFastPathDifferential: on seeded random sums of monomials the fast
// path and the general path (forced) give identical expansions, or
// identical errors, in polynomial and series mode.
func TestFastPathDifferential(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	for range 500 {
		src := randomFastInput(r, 1+r.IntN(12))
		for _, order := range []int{0, 3} {
			sameResult(t, src, Config{Order: order})
		}
		if t.Failed() {
			return
		}
	}
	// The benchmark shapes, smaller, and limits that bite.
	even, _ := genEvenDegree(4, 6)
	for _, src := range []string{genSquares(9, 300, 8, 3), even, genSquaredProducts(9, 300, 6), genCoefficients(9, 300, 6)} {
		sameResult(t, src, Config{})
		sameResult(t, src, Config{Order: 5})
		sameResult(t, src, Config{Limits: Limits{MaxTerms: 50}})
		sameResult(t, src, Config{Limits: Limits{MaxWork: 200}})
		sameResult(t, src, Config{Order: 5, Limits: Limits{MaxWork: 200}})
	}
	for _, src := range []string{
		"(3*x)^100000", "(2*x)^600000", "x^1099511627775*x", "x^1099511627776", "(x^1048576)^1048576",
		"(x^3)^4611686018427387904 + 1", "0*x^4611686018427387904", "x^0^0", "(0*x)^0", "0^0*y",
	} {
		for _, order := range []int{0, 3} {
			sameResult(t, src, Config{Order: order})
			sameResult(t, src, Config{Order: order, Limits: Limits{MaxBits: 1000}})
		}
	}
	// ParseList, with errors in some items.
	a, ea := ParseList("2*x^2 + y\nx/0; 3*z\n(x*y)^2 - x^2*y^2\nx^", Config{})
	fastPath = false
	b, eb := ParseList("2*x^2 + y\nx/0; 3*z\n(x*y)^2 - x^2*y^2\nx^", Config{})
	fastPath = true
	if (ea == nil) != (eb == nil) || (ea != nil && ea.Error() != eb.Error()) || len(a) != len(b) {
		t.Fatalf("ParseList: fast path %v, %v; general path %v, %v", a, ea, b, eb)
	}
}

// TestNameTable: the pre-pass's name table returns what was put, reports
// absent names, and survives growth (values chosen here).
func TestNameTable(t *testing.T) {
	var tab nameTable
	if _, ok := tab.get("x"); ok {
		t.Fatal("empty table has x")
	}
	for i := range 1000 {
		tab.put("v"+strconv.Itoa(i), int32(3*i))
	}
	for i := range 1000 {
		if v, ok := tab.get("v" + strconv.Itoa(i)); !ok || v != int32(3*i) {
			t.Fatalf("get(v%d) = %d, %v; want %d, true", i, v, ok, 3*i)
		}
	}
	for _, name := range []string{"v1000", "v", "", "w1", "v01"} {
		if v, ok := tab.get(name); ok {
			t.Errorf("get(%q) = %d, want absent", name, v)
		}
	}
}
