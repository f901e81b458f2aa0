package rlct

import (
	"context"
	"errors"
	"math/big"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

// A series at one point is expanded there: the problem holds the same
// polynomial as the expression shifted by hand and expanded at the origin.
func TestSpecSeriesAtPoint(t *testing.T) {
	tests := []struct {
		spec    Spec
		shifted string // the expression in offsets, written by hand
		sos     bool
	}{
		// (a·b)²/(1 + a) at a = 1/2: a = 1/2 + u.
		{Spec{K: "(a*b)^2/(1+a)", At: []string{"a=1/2"}, Order: 5}, "((a+1/2)*b)^2/(3/2+a)", false},
		// a·tanh(b) − a·b at b = 0, a = 2 (a = 2 + u).
		{Spec{K: "a*tanh(b) - 2*b", At: []string{"a=2"}, Order: 7}, "(a+2)*tanh(b) - 2*b", false},
		// Generators 1/(1 − x) − 1 − y at x = 1/3: 1/(2/3 − u) − 1 − y.
		{Spec{SOS: []string{"1/(1-x) - 3/2 - y", "x*y"}, At: []string{"x=1/3"}, Order: 4}, "1/(2/3-x) - 3/2 - y; (x+1/3)*y", true},
	}
	for _, tc := range tests {
		p, err := tc.spec.Problem()
		if err != nil {
			t.Fatalf("%v: %v", tc.spec, err)
		}
		if !p.Centered || len(p.Points) != 1 {
			t.Fatalf("%v: Centered %v with %d points", tc.spec, p.Centered, len(p.Points))
		}
		cfg := monomial.Config{Vars: p.Vars(), Order: tc.spec.Order}
		if tc.sos {
			exs, err := monomial.ParseList(tc.shifted, cfg)
			if err != nil {
				t.Fatal(err)
			}
			for i, ex := range exs {
				if !ex.Poly.Equal(p.Generators[i]) {
					t.Errorf("%v: generator %d is %v, by hand %v", tc.spec, i+1, p.Generators[i], ex.Poly)
				}
			}
			continue
		}
		ex, err := monomial.Parse(tc.shifted, cfg)
		if err != nil {
			t.Fatal(err)
		}
		if !ex.Poly.Equal(p.K) {
			t.Errorf("%v: K is %v, by hand %v", tc.spec, p.K, ex.Poly)
		}
		// The locals keep it as it is: no second translation.
		ls, err := p.Locals()
		if err != nil {
			t.Fatal(err)
		}
		if !ls[0].Polys[0].Equal(ex.Poly) {
			t.Errorf("%v: the local problem was translated again", tc.spec)
		}
	}
	// A centered problem has exactly one point.
	x2, err := monomial.Parse("x^2", monomial.Config{})
	if err != nil {
		t.Fatal(err)
	}
	p := &Problem{K: x2.Poly, Centered: true}
	if _, err := p.Locals(); !errors.Is(err, ErrDimension) {
		t.Errorf("centered without a point: %v, want ErrDimension", err)
	}
}

// With OrderAuto the order is raised until the truncation is certified;
// a K without series is bounded exactly at once.
func TestSpecBoundAutoOrder(t *testing.T) {
	ctx := context.Background()
	tests := []struct {
		spec   Spec
		lambda *big.Rat
		theta  int
		status Status
		auto   bool // a note on the order chosen
	}{
		// x² + y¹⁰: the edge (2,0)–(0,10) meets (t,t) at t(1/2 + 1/10) = 1,
		// t = 5/3, λ = 3/5 (hand-worked); a polynomial, bounded once.
		{Spec{K: "x^2 + y^10", Order: OrderAuto}, big.NewRat(3, 5), 1, Exact, false},
		// (x − tanh x)² + y²: tanh x = x − x³/3 + 2x⁵/15 − … (common
		// practice), so x − tanh x = x³/3 − …, its square starts at x⁶/9,
		// and the edge (6,0)–(0,2) gives t(1/6 + 1/2) = 1, λ = 2/3.
		{Spec{K: "(x - tanh(x))^2 + y^2", Order: OrderAuto}, big.NewRat(2, 3), 1, Exact, true},
		// The same in sum-of-squares form.
		{Spec{SOS: []string{"x - tanh(x)", "y"}, Order: OrderAuto}, big.NewRat(2, 3), 1, Exact, true},
	}
	for _, tc := range tests {
		p, res, err := tc.spec.Bound(ctx, nil)
		if err != nil {
			t.Fatalf("%v: %v", tc.spec, err)
		}
		if res.Lambda.Cmp(tc.lambda) != 0 || res.Theta != tc.theta || res.Status != tc.status {
			t.Errorf("%v: λ %v θ %d %v, want %v %d %v (reasons %v)", tc.spec, res.Lambda, res.Theta, res.Status, tc.lambda, tc.theta, tc.status, res.Reasons)
		}
		note := strings.Join(res.Notes, "; ")
		if got := strings.Contains(note, "chosen automatically"); got != tc.auto {
			t.Errorf("%v: notes %q, want a note on the order: %v", tc.spec, note, tc.auto)
		}
		if tc.auto && (!p.Truncated || res.Truncation == nil || !res.Truncation.Faces || res.Truncation.Order != p.Order) {
			t.Errorf("%v: order %d, truncation %+v", tc.spec, p.Order, res.Truncation)
		}
	}
	// An expansion limit stops the search with a note, keeping the best
	// order reached; a fixed order is used as given.
	s := Spec{K: "x^2*(1 - cos(y)) + (x*y*z*exp(x+y+z))^2", Order: OrderAuto, Limits: monomial.Limits{MaxTerms: 400}}
	if _, res, err := s.Bound(ctx, nil); err == nil {
		if note := strings.Join(res.Notes, "; "); !strings.Contains(note, "chosen automatically") {
			t.Errorf("limit: notes %q", note)
		}
	} else if !errors.Is(err, ErrInput) {
		t.Errorf("limit: %v", err)
	}
	fixed := Spec{K: "x^2 + sin(y)^2", Order: 6}
	p, _, err := fixed.Bound(ctx, nil)
	if err != nil || p.Order != 6 {
		t.Errorf("fixed order: order %v, error %v", p.Order, err)
	}
}

func TestRecordOrderAuto(t *testing.T) {
	rec, err := DecodeRecord([]byte(`{"k": "sin(x)^2", "order": "auto"}`))
	if err != nil || rec.Spec.Order != OrderAuto {
		t.Fatalf("order auto: %v, %v", rec, err)
	}
	// "auto" is the default: written by leaving the field out.
	b, err := rec.MarshalJSON()
	if err != nil || strings.Contains(string(b), `"order"`) {
		t.Errorf("encoded %s, %v", b, err)
	}
	if rec, err := DecodeRecord([]byte(`{"k": "sin(x)^2"}`)); err != nil || rec.Spec.Order != OrderAuto {
		t.Errorf("no order: %v, %v", rec.Spec.Order, err)
	}
	if rec, err := DecodeRecord([]byte(`{"k": "x^2", "order": 0}`)); err != nil || rec.Spec.Order != 0 {
		t.Errorf("order 0: %v, %v", rec.Spec.Order, err)
	} else if b, _ := rec.MarshalJSON(); !strings.Contains(string(b), `"order":0`) {
		t.Errorf("order 0 encoded %s", b)
	}
}
