package rlct

import (
	"context"
	"errors"
	"math/big"
	"slices"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/monomial"
)

// ratVec reads "1,1/2,0" as exact values.
func ratVec(t *testing.T, s string) []*big.Rat {
	t.Helper()
	var out []*big.Rat
	for _, f := range strings.Split(s, ",") {
		r, ok := new(big.Rat).SetString(f)
		if !ok {
			t.Fatalf("bad rational %q", f)
		}
		out = append(out, r)
	}
	return out
}

func ratsString(xs []*big.Rat) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = x.RatString()
	}
	return strings.Join(parts, ",")
}

// Variables keep the order in which they first appear in K, whatever order
// --prior and --at name them in; Vars still comes first.
func TestSpecVariableOrder(t *testing.T) {
	tests := []struct {
		spec   Spec
		vars   string
		prior  string // "" when no prior
		points []string
	}{
		{Spec{K: "y^2 + x^4"}, "y,x", "", nil},
		{Spec{K: "y^2 + x^4", Prior: "x=1"}, "y,x", "0,1", nil},
		{Spec{K: "y^2 + x^4", Prior: "x=1,y=1/2", At: []string{"x=0,y=0"}}, "y,x", "1/2,1", []string{"0,0"}},
		{Spec{K: "(b - 1)^2 + a^2", At: []string{"a=0,b=1"}}, "b,a", "", []string{"1,0"}},
		{Spec{SOS: []string{"s*g1 - 1", "s*g2"}, At: []string{"g1=1,s=1"}}, "s,g1,g2", "", []string{"1,1,0"}},
		{Spec{SOS: []string{"s*g1", "s*g2"}, Prior: "g2=1,s=2"}, "s,g1,g2", "2,0,1", nil},
		{Spec{K: "y^2 + x^4", Prior: "x=1", Vars: []string{"x"}}, "x,y", "1,0", nil},
		{Spec{K: "x^2", Prior: "z=1", Vars: []string{"z"}}, "z,x", "1,0", nil},
	}
	for _, tt := range tests {
		p, err := tt.spec.Problem()
		if err != nil {
			t.Errorf("%+v: %v", tt.spec, err)
			continue
		}
		vars := p.Vars()
		if strings.Join(vars, ",") != tt.vars {
			t.Errorf("%+v: variables %v, want %s", tt.spec, vars, tt.vars)
		}
		if tt.prior == "" && p.Prior != nil || tt.prior != "" && ratsString(p.Prior) != tt.prior {
			t.Errorf("%+v: prior %v, want %q", tt.spec, p.Prior, tt.prior)
		}
		if len(p.Points) != len(tt.points) {
			t.Errorf("%+v: %d points, want %d", tt.spec, len(p.Points), len(tt.points))
			continue
		}
		for i, w := range p.Points {
			if ratsString(w) != tt.points[i] {
				t.Errorf("%+v: point %d is %s, want %s", tt.spec, i+1, ratsString(w), tt.points[i])
			}
		}
	}
}

// A name in --prior or --at that K does not use is refused at its place: it
// would otherwise add a dimension silently.
func TestSpecUnknownName(t *testing.T) {
	tests := []struct {
		spec  Spec
		field string
		col   int
		msg   string
	}{
		{Spec{K: "x^2", Prior: "z=1"}, "prior", 1, "z is not a variable of K (variables: x)"},
		{Spec{K: "x^2 + y^2", Prior: "x=1, yy=2"}, "prior", 6, "yy is not a variable of K (variables: x, y)"},
		{Spec{K: "x^2", At: []string{"x=0", "x=1,y=1"}}, "at", 5, "y is not a variable of K"},
		{Spec{SOS: []string{"a*b"}, At: []string{"ab = 1"}}, "at", 1, "ab is not a variable of K (variables: a, b)"},
	}
	for _, tt := range tests {
		_, err := tt.spec.Problem()
		var se *SpecError
		var pe *monomial.Error
		if !errors.As(err, &se) || !errors.As(err, &pe) {
			t.Errorf("%+v: error %v, want a SpecError with a position", tt.spec, err)
			continue
		}
		if se.Field != tt.field || pe.Col != tt.col || pe.Line != 1 || pe.Setting != "Vars" || !strings.Contains(err.Error(), tt.msg) {
			t.Errorf("%+v: %s error %q at %d:%d setting %q; want %s at 1:%d setting Vars, mentioning %q",
				tt.spec, se.Field, err, pe.Line, pe.Col, pe.Setting, tt.field, tt.col, tt.msg)
		}
		if !errors.Is(err, ErrInput) {
			t.Errorf("%+v: error %v is not an input error", tt.spec, err)
		}
	}
}

// Locals translates to each point, weights the prior only where the point
// is 0, and notes the exponents that do not count.
func TestLocals(t *testing.T) {
	ex, err := monomial.Parse("(x-1)^2 + y^2", monomial.Config{})
	if err != nil {
		t.Fatal(err)
	}
	p := &Problem{K: ex.Poly, Prior: ratVec(t, "1,1"), Points: [][]*big.Rat{ratVec(t, "1,0"), {nil, nil}}}
	locals, err := p.Locals()
	if err != nil {
		t.Fatal(err)
	}
	if len(locals) != 2 {
		t.Fatalf("%d locals, want 2", len(locals))
	}
	// At (1, 0): K = u² + y² in the offset u = x − 1 (by hand); τ = (1, 2)
	// since only y vanishes there; the exponent of x does not count.
	at1 := locals[0]
	if got := at1.Polys[0].String(); got != "x^2 + y^2" || ratsString(at1.Weights) != "1,2" || ratsString(at1.Point) != "1,0" {
		t.Errorf("at (1,0): K = %s, τ = %s, point %s; want x^2 + y^2, 1,2, 1,0", got, ratsString(at1.Weights), ratsString(at1.Point))
	}
	if len(at1.Notes) != 1 || !strings.Contains(at1.Notes[0], "prior exponent 1 of x does not count") || !strings.Contains(at1.Notes[0], "x = 1 there") {
		t.Errorf("at (1,0): notes %q, want one about x", at1.Notes)
	}
	// At the origin (nil entries read as 0): K unchanged, τ = (2, 2), no note.
	at0 := locals[1]
	if got := at0.Polys[0].String(); got != ex.Poly.String() || ratsString(at0.Weights) != "2,2" || len(at0.Notes) != 0 {
		t.Errorf("at the origin: K = %s, τ = %s, notes %q", got, ratsString(at0.Weights), at0.Notes)
	}

	// Errors name the point when there are several.
	bad := &Problem{K: ex.Poly, Points: [][]*big.Rat{ratVec(t, "1,0"), ratVec(t, "1")}}
	if _, err := bad.Locals(); !errors.Is(err, ErrDimension) || !strings.HasPrefix(err.Error(), "point 2: ") {
		t.Errorf("short second point: error %v, want ErrDimension at point 2", err)
	}
	one := &Problem{K: ex.Poly, Points: [][]*big.Rat{ratVec(t, "1")}}
	if _, err := one.Locals(); !errors.Is(err, ErrDimension) || strings.HasPrefix(err.Error(), "point") {
		t.Errorf("short single point: error %v, want ErrDimension without a point number", err)
	}
	series, err := monomial.Parse("exp(x) - 1 + y^2", monomial.Config{Order: 3})
	if err != nil {
		t.Fatal(err)
	}
	shifted := &Problem{K: series.Poly, Truncated: series.Truncated, Order: 3, Points: [][]*big.Rat{ratVec(t, "0,0"), ratVec(t, "1,0")}}
	if _, err := Bound(context.Background(), shifted, nil); !errors.Is(err, ErrShiftSeries) || !strings.HasPrefix(err.Error(), "point 2: ") {
		t.Errorf("truncated series at a second point: error %v, want ErrShiftSeries at point 2", err)
	}
}

// One entry point answers a problem at several points: the minimum in the
// order of Less, each point's answer in Locals, and a status that claims
// only what every point supports.
func TestBoundPoints(t *testing.T) {
	tests := []struct {
		name   string
		k      string
		order  int
		points []string // each "x,y,…"
		lambda string
		theta  int
		status Status
		locals []string // each point's "λ θ status"
	}{
		// x²(x−1)⁴ + y²: at the origin regular, λ = 1 (d/2, Schwarz 1978);
		// at x = 1, u⁴ + y² gives 1/4 + 1/2 = 3/4 (sum over separate
		// variables, common practice). Both exact, so the minimum is.
		{"two exact points", "x^2*(x-1)^4 + y^2", 0, []string{"0,0", "1,0"}, "3/4", 1, Exact,
			[]string{"1 1 exact", "3/4 1 exact"}},
		// The same at x = 1 alone: the answer there, with no Locals.
		{"one point", "x^2*(x-1)^4 + y^2", 0, []string{"1,0"}, "3/4", 1, Exact, nil},
		// (x−y)²(x−3)²: at 0 the degenerate edge gives only the bound 1
		// (the true value is 1/2, common practice); at (3, 0) K ≈ 9u²
		// gives 1/2 exactly in (u, y) with y free: the Newton value 1/2 is
		// the minimum and exact, but the other point is only an upper
		// bound, so the true minimum could lie there: UpperBound.
		{"a degenerate point", "(x-y)^2*(x-3)^2", 0, []string{"0,0", "3,0"}, "1/2", 1, UpperBound,
			[]string{"1 1 upper-bound", "1/2 1 exact"}},
		// A truncated series at the origin twice: y⁴ + x⁴y²·exp(x) cut at
		// degree 6 is not certified (the README's example), so neither is
		// the minimum.
		{"uncertified", "y^4 + x^4*y^2*exp(x)", 6, []string{"0,0", "0,0"}, "3/8", 1, Uncertified,
			[]string{"3/8 1 uncertified", "3/8 1 uncertified"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			ex, err := monomial.Parse(tt.k, monomial.Config{Order: tt.order, Vars: []string{"x", "y"}})
			if err != nil {
				t.Fatal(err)
			}
			p := &Problem{K: ex.Poly, Order: tt.order, Truncated: ex.Truncated}
			for _, w := range tt.points {
				p.Points = append(p.Points, ratVec(t, w))
			}
			r, err := Bound(context.Background(), p, &Options{NoReduction: true, NoRepair: true})
			if err != nil {
				t.Fatal(err)
			}
			if r.Lambda.RatString() != tt.lambda || r.Theta != tt.theta || r.Status != tt.status {
				t.Errorf("got (%s, %d, %s), want (%s, %d, %s); reasons %q", r.Lambda.RatString(), r.Theta, r.Status, tt.lambda, tt.theta, tt.status, r.Reasons)
			}
			var locals []string
			for i, l := range r.Locals {
				locals = append(locals, l.Lambda.RatString()+" "+itoa(l.Theta)+" "+string(l.Status))
				if ratsString(l.Point) != tt.points[i] {
					t.Errorf("local %d at %s, want %s", i+1, ratsString(l.Point), tt.points[i])
				}
			}
			if !slices.Equal(locals, tt.locals) {
				t.Errorf("locals %q, want %q", locals, tt.locals)
			}
			if r.Status != Exact && len(r.Reasons) == 0 {
				t.Error("a status that is not exact without a reason")
			}
		})
	}
}

func itoa(n int) string { return big.NewInt(int64(n)).String() }
