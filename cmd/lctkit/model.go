package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"strings"
	"unicode/utf8"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/model"
)

// modelFlags are the flags of lctkit model, shared with bound --model.
type modelFlags struct {
	Order    int    `help:"Replace the description's order: series are truncated at this total degree in the parameters." placeholder:"D"`
	MaxFaces int    `name:"max-faces" help:"Most compact faces the certificate examines before it stops with an upper bound (default 20000)." placeholder:"N"`
	MaxTerms int    `name:"max-terms" help:"Most terms an expansion may have (default 2000000)." placeholder:"N"`
	N        string `help:"Also print the penalty λ·log n − (θ−1)·log log n at these sample sizes (comma separated)." placeholder:"1000,10000"`
	AllFaces bool   `name:"all-faces" help:"Decide and list every compact face of the Newton polyhedron."`
	jsonFlag
}

// modelCmd builds K from a model description and bounds it.
type modelCmd struct {
	File string `arg:"" help:"The model description; - reads it from standard input."`
	modelFlags
}

// Help is shown under the command's usage.
func (c *modelCmd) Help() string {
	return `Reads a model description (a small text format: parameters with their
priors, the truth, and the model: a regression, a discrete model or a
mixture), builds K from it exactly, prints K as a weighted sum of squares and
bounds it as "bound" does. The format is documented in
"go doc github.com/lctkit/lctkit/rlct/model". An example:

  model rank one, three sensors
  kind regression
  param B[2,1], A[1,3]
  input x[3] ~ normal
  noise 1/2
  mean B*A*x

Errors point at the line and column of the description.

Examples:
  lctkit model sensors.txt
  lctkit model - --json < sensors.txt
  lctkit bound --model sensors.txt --n 1000`
}

// Validate checks the flags' ranges before Run.
func (f *modelFlags) Validate() error {
	switch {
	case f.Order < 0:
		return errors.New("--order must not be negative")
	case f.Order > monomial.DefaultMaxOrder:
		return fmt.Errorf("--order %d is above the largest order lctkit expands, %d", f.Order, monomial.DefaultMaxOrder)
	case f.MaxFaces < 0:
		return errors.New("--max-faces must not be negative")
	case f.MaxTerms < 0:
		return errors.New("--max-terms must not be negative")
	}
	return nil
}

// Run builds and bounds the model.
func (c *modelCmd) Run(e *env) error { return runModel(e, c.File, c.modelFlags) }

// modelAnswer is what lctkit model prints: the model's K, then the bound
// as bound prints it; in JSON one object with the fields of both.
type modelAnswer struct {
	model *model.Model
	bound *boundAnswer
}

func (a *modelAnswer) writeText(w io.Writer) {
	writeModel(w, a.model)
	a.bound.writeText(w)
}

// MarshalJSON writes the model's fields followed by the bound's.
func (a *modelAnswer) MarshalJSON() ([]byte, error) { return mergeJSON(a.model, a.bound) }

// modelHints name what the user can change for an error that a setting
// would lift.
var modelHints = map[string]string{
	"Order":    "add an order statement (order D) to the description, or give --order D",
	"MaxTerms": "raise --max-terms to allow larger expansions",
	"At":       "each function is expanded around its argument's value at the truth; rewrite it as the message says",
}

// runModel reads the description in file ("-" for standard input), builds
// K and bounds it.
func runModel(e *env, file string, f modelFlags) error {
	src, name, err := readDescription(e, file)
	if err != nil {
		return err
	}
	ns, err := parseSizes(f.N)
	if err != nil {
		return badFlag("--n", err)
	}
	fail := func(err error) error {
		printModelError(e.stderr, name, src, err)
		return exitError{exitFailed, err}
	}
	d, err := model.Parse(src)
	if err != nil {
		return fail(err)
	}
	m, err := model.Build(context.Background(), d, &model.Options{Order: f.Order, Limits: monomial.Limits{MaxTerms: f.MaxTerms}})
	if err != nil {
		return fail(err)
	}
	r, err := m.Bound(context.Background(), &rlct.Options{MaxFaces: f.MaxFaces, AllFaces: f.AllFaces})
	if err != nil {
		return fail(err)
	}
	a := &modelAnswer{model: m, bound: &boundAnswer{Result: r}}
	if ns != nil {
		a.bound.Penalty = rlct.NewPenalties(r.Lambda, r.Theta, r.Status, len(r.Vars), ns)
	}
	return e.print(a, f.JSON)
}

// readDescription returns the text of the description and the name to
// show in messages.
func readDescription(e *env, file string) (src, name string, err error) {
	if file == "-" {
		src, err = readExpr("-", e)
		return src, "<stdin>", err
	}
	b, err := os.ReadFile(file)
	if err != nil {
		return "", "", err
	}
	return string(b), file, nil
}

// maxGeneratorLines bounds the generators the text output lists one by one.
const maxGeneratorLines = 24

// writeModel prints what K is and its generators.
func writeModel(w io.Writer, m *model.Model) {
	name := m.Name
	if name == "" {
		name = "(unnamed)"
	}
	fmt.Fprintf(w, "model: %s (%s)\n", name, m.Kind)
	fmt.Fprintf(w, "  %s\n", m.What)
	p := m.Problem
	fmt.Fprintf(w, "  K = Σ c·g² over %s in (%s):\n", plural(len(p.Generators), "generator", "generators"), strings.Join(m.Vars(), ", "))
	for i, g := range p.Generators {
		if i == maxGeneratorLines {
			fmt.Fprintf(w, "    … (%d generators in all; --json lists them all)\n", len(p.Generators))
			break
		}
		fmt.Fprintf(w, "    %s*(%s)^2   [%s]\n", p.GeneratorWeights[i].RatString(), shortPolynomial(g.String(), g.Len()), m.Labels[i])
	}
	if m.Offsets && !allZero(m.Truth) {
		fmt.Fprintf(w, "  a series in the offsets w − w* from the truth %s, under the parameters' names\n", m.TruthString())
	}
	if rem := m.RemainderStrings(); len(rem) > 0 {
		fmt.Fprintf(w, "  every omitted term is a multiple of %s\n", shortPolynomial(strings.Join(rem, ", "), 0))
	}
}

// printModelError writes an error of a description with the offending line
// and a caret under the column, and a hint when a setting would lift it.
func printModelError(w io.Writer, name, src string, err error) {
	var list model.ErrorList
	var one *model.Error
	switch {
	case errors.As(err, &list):
		for i, me := range list {
			if i == 5 {
				fmt.Fprintf(w, "lctkit: … (%d errors in all)\n", len(list))
				break
			}
			printOne(w, name, src, me)
		}
	case errors.As(err, &one):
		printOne(w, name, src, one)
	default:
		fmt.Fprintf(w, "lctkit: %s: %v\n", name, err)
	}
}

// printOne writes one positioned error.
func printOne(w io.Writer, name, src string, me *model.Error) {
	fmt.Fprintf(w, "lctkit: %s:%s\n", name, me.Error())
	if h, ok := modelHints[me.Setting]; ok {
		fmt.Fprintf(w, "  (%s)\n", h)
	}
	lines := strings.Split(src, "\n")
	if me.Line < 1 || me.Line > len(lines) {
		return
	}
	line := strings.TrimRight(lines[me.Line-1], "\r")
	if utf8.RuneCountInString(line) > 200 {
		return
	}
	fmt.Fprintf(w, "  %s\n  %s^\n", line, caretPad(line, me.Col))
}

// caretPad returns the white space that puts a caret under column col of
// line, keeping its tabs.
func caretPad(line string, col int) string {
	var b strings.Builder
	for i, r := range []rune(line) {
		if i >= col-1 {
			break
		}
		if r == '\t' {
			b.WriteRune('\t')
		} else {
			b.WriteByte(' ')
		}
	}
	return b.String()
}

// boundModel builds and bounds the model description of a batch record;
// it sets *name to the model's name. Errors in the description read
// "model: line:col: message".
func boundModel(ctx context.Context, rec rlct.Record, maxTerms int, opt *rlct.Options, name *string) (*rlct.Result, error) {
	d, err := model.Parse(rec.Model)
	if err != nil {
		return nil, fmt.Errorf("model: %w", err)
	}
	*name = d.Name()
	m, err := model.Build(ctx, d, &model.Options{Order: rec.Spec.Order, Limits: monomial.Limits{MaxTerms: maxTerms}})
	if err != nil {
		return nil, fmt.Errorf("model: %w", err)
	}
	return m.Bound(ctx, opt)
}
