package main

import (
	"errors"
	"fmt"
	"io"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// penaltyCmd prints the asymptotic penalty of a singular model.
type penaltyCmd struct {
	Lambda string `required:"" help:"The learning coefficient λ, exact (3/4, 0.75, 2)." placeholder:"3/4"`
	Theta  int    `default:"1" help:"The multiplicity θ (a positive integer)."`
	N      string `required:"" help:"Sample sizes, comma separated; each must exceed 3." placeholder:"1000,10000"`
	D      int    `help:"Number of parameters: also print the regular model's penalty (d/2)·log n." placeholder:"d"`
	Status string `default:"exact" enum:"exact,upper-bound,uncertified" help:"The status of the pair, as bound reports it (exact, upper-bound, uncertified); a pair that is not exact marks every penalty."`
	jsonFlag
}

// Help is shown under the command's usage.
func (c *penaltyCmd) Help() string {
	return `Evaluates λ·log n − (θ−1)·log log n, the terms the learning coefficient adds to
the free energy −log Z_n beyond n·S_n, and with --d the regular (BIC) penalty
(d/2)·log n for comparison. These are asymptotic statements; the values are
float64 evaluations in nats.

Example:
  lctkit penalty --lambda 3/4 --theta 2 --n 1000,10000,100000 --d 3`
}

// Validate checks the flags before Run.
func (c *penaltyCmd) Validate() error {
	if c.Theta < 1 {
		return errors.New("--theta must be a positive integer")
	}
	if c.D < 0 {
		return errors.New("--d must not be negative")
	}
	return nil
}

// Run prints the penalties.
func (c *penaltyCmd) Run(e *env) error {
	lambda, err := monomial.ParseRat(c.Lambda)
	if err != nil {
		return badFlag("--lambda", err)
	}
	if lambda.Sign() <= 0 {
		return badFlag("--lambda", fmt.Errorf("λ must be positive, got %s", lambda.RatString()))
	}
	ns, err := parseSizes(c.N)
	if err != nil {
		return badFlag("--n", err)
	}
	return e.print(penaltyAnswer{rlct.NewPenalties(lambda, c.Theta, rlct.Status(c.Status), c.D, ns)}, c.JSON)
}

// penaltyAnswer is what penalty prints; its JSON form is that of
// rlct.Penalties.
type penaltyAnswer struct {
	*rlct.Penalties
}

func (a penaltyAnswer) writeText(w io.Writer) {
	p := a.Penalties
	fmt.Fprintf(w, "λ = %s, θ = %d (asymptotic penalties, in nats)\n", p.Lambda.RatString(), p.Theta)
	if p.Note != "" {
		fmt.Fprintf(w, "%s pair: %s\n", statusWord(p.Status), p.Note)
	}
	if p.Dim > 0 {
		fmt.Fprintf(w, "%12s  %22s  %22s\n", "n", "λ·log n − (θ−1)·log log n", fmt.Sprintf("regular, d = %d", p.Dim))
	} else {
		fmt.Fprintf(w, "%12s  %22s\n", "n", "λ·log n − (θ−1)·log log n")
	}
	for i, n := range p.N {
		if p.Dim > 0 {
			fmt.Fprintf(w, "%12g  %22.4f  %22.4f\n", n, p.Singular[i], p.Regular[i])
		} else {
			fmt.Fprintf(w, "%12g  %22.4f\n", n, p.Singular[i])
		}
	}
}
