package model

import (
	"context"
	"math/big"
	"testing"
	"time"

	"github.com/lctkit/lctkit/monomial"
)

// FuzzParse reads arbitrary text as a description. It must never panic;
// what parses must print and read back to the same canonical form; and
// what builds (within small limits) must give generators that vanish at
// the truth.
func FuzzParse(f *testing.F) {
	for _, src := range descriptions {
		f.Add(src)
	}
	for _, c := range parseErrors {
		f.Add(c.src)
	}
	for _, c := range buildErrors {
		f.Add(c.src)
	}
	f.Fuzz(func(t *testing.T, src string) {
		d, err := Parse(src)
		if err != nil {
			return
		}
		once := d.String()
		d2, err := Parse(once)
		if err != nil {
			t.Fatalf("%q printed as %q, which does not parse: %v", src, once, err)
		}
		if twice := d2.String(); twice != once {
			t.Fatalf("%q printed as %q, then as %q", src, once, twice)
		}
		ctx, cancel := context.WithTimeout(context.Background(), time.Second)
		defer cancel()
		m, err := Build(ctx, d, &Options{Limits: monomial.Limits{MaxTerms: 20000, MaxWork: 5_000_000, MaxExponent: 200, MaxBits: 20000}})
		if err != nil {
			return
		}
		at := make([]*big.Rat, len(m.Vars()))
		for i := range at {
			at[i] = new(big.Rat)
		}
		if !m.Offsets {
			at = m.Problem.Points[0]
		}
		for i, g := range m.Problem.Generators {
			if v := g.Eval(at); v.Sign() != 0 {
				t.Fatalf("%q: generator %d (%s) is %s at the truth", src, i+1, g, v.RatString())
			}
		}
	})
}
