package rlct

import (
	"context"
	"errors"
	"fmt"
	"math/big"
	"strings"
	"testing"
)

// floorCases are problems for Spec.Bound with OrderAuto, some of which go
// past the first order, so that the cut by the polyhedron is used.
func floorCases() []Spec {
	return []Spec{
		{K: "x^2 + y^10", Order: OrderAuto},
		{K: "(x - tanh(x))^2 + y^2", Order: OrderAuto},
		{SOS: []string{"x - tanh(x)", "y"}, Order: OrderAuto},
		{K: "x^2*(1 - cos(y)) + (x*y*z*exp(x+y+z))^2", Order: OrderAuto},
		{K: "x^2*(1 - cos(y))", Order: OrderAuto},
		{K: "(a*tanh(b))^2 + (a*tanh(2*b) - a*b)^2", Order: OrderAuto},
		{SOS: []string{"x - sin(x) + y^3", "tanh(y)^2 - y*x"}, Order: OrderAuto},
		{SOS: []string{"a*tanh(b) - 2*b", "a - 2 + b*c"}, At: []string{"a=2"}, Order: OrderAuto},
		{K: "(sinh(x) - x)^2 + (y - tanh(y))^2 + x^2*y^2", Order: OrderAuto},
		{K: "(a*b)^2*cosh(a + b) + (a - tanh(a))^2 + (b - sin(b))^2", Order: OrderAuto},
		{SOS: []string{"a*b*exp(a + b + c)", "a - tanh(a)", "b - sin(b)", "c^3*cos(a*b)"}, Order: OrderAuto},
		{SOS: []string{"(a*tanh(b) + c*tanh(2*b))*exp(a)", "a - tanh(a)", "sinh(c) - c"}, Order: OrderAuto},
		{K: "(x*y*z)^2*exp(x + y + z) + (x - sin(x))^2 + (y - tanh(y))^2 + (z - atan(z))^2", Order: OrderAuto},
		{SOS: []string{"a*tanh(b) - 2*b + a^2*b", "a - 2 - sin(b)^3"}, At: []string{"a=2"}, Order: OrderAuto},
		{K: "(sin(x) - x + x^3/6)^2 + (a*b)^2*exp(a + b + x) + a^4*x^2", Order: OrderAuto},
		{SOS: []string{"x - y*tanh(y)", "y^2*(y - sin(y))*exp(x)", "x*y*z*exp(z)", "z^3 - sin(z)^3"}, Order: OrderAuto},
		{SOS: benchTanh(1), Order: OrderAuto},
		{SOS: benchTanh(2), Order: OrderAuto},
		{SOS: benchTanh(3), Order: OrderAuto},
	}
}

// TestAutoFloor checks that the cut by the polyhedron changes no answer of
// Spec.Bound with OrderAuto: λ, θ, the status, the order chosen and the
// truncation verdicts are those without the cut, and the cut does save
// terms on the tanh networks.
func TestAutoFloor(t *testing.T) {
	if testing.Short() {
		t.Skip("bounds each problem twice at several orders")
	}
	ctx := context.Background()
	saved := false
	for _, s := range floorCases() {
		name := s.K + strings.Join(s.SOS, "; ")
		autoFloor = false
		p0, r0, err0 := s.Bound(ctx, nil)
		autoFloor = true
		p1, r1, err1 := s.Bound(ctx, nil)
		if (err0 == nil) != (err1 == nil) {
			t.Fatalf("%s: error %v with the cut, %v without", name, err1, err0)
		}
		if err0 != nil {
			continue
		}
		if r0.Lambda.Cmp(r1.Lambda) != 0 || r0.Theta != r1.Theta || r0.Status != r1.Status || p0.Order != p1.Order {
			t.Errorf("%s: λ %v θ %d %v at order %d with the cut, λ %v θ %d %v at order %d without",
				name, r1.Lambda, r1.Theta, r1.Status, p1.Order, r0.Lambda, r0.Theta, r0.Status, p0.Order)
		}
		if rank(r0) != rank(r1) {
			t.Errorf("%s: truncation rank %d with the cut, %d without", name, rank(r1), rank(r0))
		}
		n0, n1 := terms(p0), terms(p1)
		if n1 > n0 {
			t.Errorf("%s: %d terms with the cut, %d without", name, n1, n0)
		}
		if n1 < n0 {
			saved = true
		}
		t.Logf("%s: order %d, λ %v θ %d %v; %d terms with the cut, %d without", name, p1.Order, r1.Lambda, r1.Theta, r1.Status, n1, n0)
	}
	if !saved {
		t.Error("the cut saved no term on any problem")
	}
}

// TestFloorReduction checks that a series cut by a floor is expanded again
// without it when the cut keeps a reduction from being tried: at order 6
// the problem below is exact only through a reduction.
func TestFloorReduction(t *testing.T) {
	ctx := context.Background()
	s := Spec{SOS: []string{"x - y*tanh(y)", "y^2*(y - sin(y))*exp(x)", "x*y*z*exp(z)", "z^3 - sin(z)^3"}, Order: 4}
	p4, err := s.Problem()
	if err != nil {
		t.Fatal(err)
	}
	floor := floorOf(p4)
	s.Order = 6
	cut, err := s.problem(floor)
	if err != nil {
		t.Fatal(err)
	}
	if !cutByFloor(cut.Remainder, 6) {
		t.Fatalf("floor %v: no remainder monomial of degree <= 6 (remainder %v)", floor, cut.Remainder)
	}
	r, err := Bound(ctx, cut, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !blocked(r) || r.Reduction != nil {
		t.Errorf("the cut series: blocked %v, reduction %v", blocked(r), r.Reduction)
	}
	p, res, err := s.boundFloored(ctx, floor, nil)
	if err != nil {
		t.Fatal(err)
	}
	if res.Reduction == nil || res.Status != Exact || cutByFloor(p.Remainder, 6) {
		t.Errorf("boundFloored: %v %v, reduction %v, remainder %v", res.Lambda, res.Status, res.Reduction, p.Remainder)
	}
}

// TestFloorChecked checks that a remainder monomial of low degree that
// dominates no exponent of K is refused, and that boundFloored then
// expands without the floor.
func TestFloorChecked(t *testing.T) {
	s := Spec{K: "(a*tanh(b))^2 + c^2", Order: 6}
	floor := [][]int{{1, 0, 0}, {0, 0, 2}} // a is no exponent of K
	p, err := s.problem(floor)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Bound(context.Background(), p, nil); !errors.Is(err, ErrDimension) {
		t.Errorf("a remainder below the support: error %v, want ErrDimension", err)
	}
	p, res, err := s.boundFloored(context.Background(), floor, nil)
	if err != nil || cutByFloor(p.Remainder, 6) || res.Lambda.Cmp(big.NewRat(1, 1)) != 0 {
		t.Errorf("boundFloored: %v, remainder %v, error %v", res, p.Remainder, err)
	}
}

// terms counts the terms of K or of the generators.
func terms(p *Problem) int {
	if p.K != nil {
		return p.K.Len()
	}
	n := 0
	for _, g := range p.Generators {
		n += g.Len()
	}
	return n
}

// BenchmarkFloor times the expansion and the bound of a tanh network (3
// hidden units, 3 inputs, as in BenchmarkBound; K or its generators) and
// of a product with an exponential at high orders, in full
// and cut by the polyhedron of order 4 (the floor Spec.Bound would use),
// and reports the terms kept.
func BenchmarkFloor(b *testing.B) {
	ctx := context.Background()
	var sq []string
	for _, g := range benchTanh(3) {
		sq = append(sq, "("+g+")^2")
	}
	forms := []struct {
		name string
		spec Spec
	}{
		{"tanh3/sos", Spec{SOS: benchTanh(3)}},
		{"tanh3/k", Spec{K: strings.Join(sq, " + ")}},
		{"exp4/k", Spec{K: "(a*b*c)^2*exp(a + b + c + d) + (d - sin(d))^2 + a^4 + b^4 + c^4"}},
	}
	for _, form := range forms {
		low := form.spec
		low.Order = 4
		p4, err := low.Problem()
		if err != nil {
			b.Fatal(err)
		}
		floor := floorOf(p4)
		for _, order := range []int{8, 12, 16} {
			for _, cut := range []bool{false, true} {
				name := fmt.Sprintf("%s/order=%d/full", form.name, order)
				f := [][]int(nil)
				if cut {
					name, f = fmt.Sprintf("%s/order=%d/cut", form.name, order), floor
				}
				b.Run(name, func(b *testing.B) {
					s := form.spec
					s.Order = order
					n := 0
					for b.Loop() {
						p, err := s.problem(f)
						if err != nil {
							b.Fatal(err)
						}
						if _, err := Bound(ctx, p, nil); err != nil {
							b.Fatal(err)
						}
						n = terms(p)
					}
					b.ReportMetric(float64(n), "terms")
				})
			}
		}
	}
}
