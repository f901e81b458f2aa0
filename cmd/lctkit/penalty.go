package main

import (
	"errors"
	"fmt"

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
	JSON   bool   `help:"Print one JSON object."`
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
	rep := rlct.NewPenaltyReport(lambda, c.Theta, rlct.Status(c.Status), c.D, ns)
	if c.JSON {
		return writeJSON(e.stdout, rep)
	}
	fmt.Fprintf(e.stdout, "λ = %s, θ = %d (asymptotic penalties, in nats)\n", lambda.RatString(), c.Theta)
	if rep.Note != "" {
		fmt.Fprintf(e.stdout, "%s pair: %s\n", statusWord(rep.Status), rep.Note)
	}
	if c.D > 0 {
		fmt.Fprintf(e.stdout, "%12s  %22s  %22s\n", "n", "λ·log n − (θ−1)·log log n", fmt.Sprintf("regular, d = %d", c.D))
	} else {
		fmt.Fprintf(e.stdout, "%12s  %22s\n", "n", "λ·log n − (θ−1)·log log n")
	}
	for i, n := range rep.N {
		if c.D > 0 {
			fmt.Fprintf(e.stdout, "%12g  %22.4f  %22.4f\n", n, rep.Singular[i], rep.Regular[i])
		} else {
			fmt.Fprintf(e.stdout, "%12g  %22.4f\n", n, rep.Singular[i])
		}
	}
	return nil
}
