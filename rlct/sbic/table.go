package sbic

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// Table is a set of candidates as written in a file: the models with their
// dimensions, log-likelihoods and prior weights, the order, the pairs (given
// by value or by a function K for lctkit to bound) and the sample size.
// ReadTable reads it in either of two forms, a line-based text form and a
// JSON form, and Candidates turns it into Candidates.
//
// # The text form
//
// One statement a line; '#' starts a comment that runs to the end of the
// line (outside a quoted string); blank lines are ignored. Tokens are
// separated by white space. The grammar, in EBNF:
//
//	table     = { line } .
//	line      = [ statement ] [ "#" comment ] newline .
//	statement = "n" number
//	          | "model" name { modelfield }
//	          | "order" name "<=" name { "<=" name }
//	          | "pair" name name { pairfield } .
//	modelfield = "dim" integer | "loglik" number | "prior" number .
//	pairfield  = "lambda" rational | "theta" integer | "status" status
//	           | "regular"
//	           | "k" string | "sos" string | "prior" string | "at" string
//	           | "description" string
//	           | "order" integer | "vars" string      (no order: chosen as by lctkit bound)
//	           | "estimate" rational integer | "source" string .
//	status    = "exact" | "upper-bound" | "uncertified" .
//	name      = namechar { namechar } .      (letters, digits, _ - .)
//	string    = '"' { any character but '"' and newline } '"' .
//	number    = a decimal floating-point number, such as -1234.5 or 1e9 .
//	rational  = an exact number: 3/2, 1.5, 2e-1 .
//
// "n" gives the sample size (once). "model" declares a model; dim (its
// dimension, an integer ≥ 0) and loglik (its maximised log-likelihood, in
// nats) are required, prior (a positive weight, normalised over the models)
// defaults to 1. "order a <= b <= c" says a ⪯ b ⪯ c (a ⊆ b ⊆ c); the order is
// closed under transitivity, and several order lines build a partial order.
// "pair M T" gives the learning coefficient of model M at a truth in model T
// (T ⪯ M), in one of three ways:
//
//   - lambda λ [theta θ] status S: the value, θ defaulting to 1, with the
//     status the value has (S is required: what the value claims is yours to
//     say);
//   - regular status S: λ = dim(M)/2, θ = 1, the value of a model that is
//     regular at that truth;
//   - k "EXPR" or sos "g1; g2; …": a function K (or K = Σ g_i²) comparable to
//     the Kullback–Leibler divergence of M from a truth in T, with the
//     optional prior, at, order and vars of `lctkit bound` (at may be
//     repeated for several points). lctkit bounds it (rlct.Bound) and the
//     pair takes λ, θ and the status of the answer;
//   - description "FILE": a model description (the format of package
//     rlct/model) of model M with its truth in T, in a file named relative
//     to the table's own; the caller builds it into TablePair.Problem
//     (lctkit choose does), and the pair takes the bound of that problem.
//
// In every form, estimate λ θ gives another value that the sensitivity
// report puts in the pair's place when the pair is not exact, and source
// "text" says where the value comes from. Every field appears at most once,
// except at.
//
//	# three nested models
//	n 500
//	model small  dim 1  loglik -731.2
//	model middle dim 3  loglik -720.9
//	model large  dim 6  loglik -719.5  prior 0.5
//	order small <= middle <= large
//	pair small  small  regular status exact
//	pair middle middle regular status exact
//	pair large  large  regular status exact
//	pair middle small  sos "a*b; a*c"
//	pair large  small  lambda 3/2 theta 2 status upper-bound estimate 1 1
//	pair large  middle lambda 5/2 status exact source "worked by hand"
//
// # The JSON form
//
// A table whose first character other than white space is '{' is read as
// one JSON object with the same content:
//
//	{"n": 500,
//	 "models": [{"name": "small", "dim": 1, "loglik": -731.2},
//	            {"name": "large", "dim": 6, "loglik": -719.5, "prior": 0.5}],
//	 "order": [["small", "large"]],
//	 "pairs": [{"model": "small", "truth": "small", "regular": true, "status": "exact"},
//	           {"model": "large", "truth": "large", "regular": true, "status": "exact"},
//	           {"model": "large", "truth": "small", "sos": ["a*b", "a*c"],
//	            "estimate": {"lambda": "1", "theta": 1}, "source": "…"}]}
//
// "order" is a list of chains, each a list of names in increasing order.
// A pair has "model" and "truth" and the fields of the text form: "lambda"
// (a string such as "3/2", or a number), "theta", "status", "regular"
// (true), "k", "sos" (a list of strings, or one string with ';'), "prior",
// "at" (a string or a list), "order", "vars" (a string or a list),
// "description" (a file name), "estimate" ({"lambda": …, "theta": …}) and
// "source". Unknown and repeated
// fields are errors.
type Table struct {
	// N is the sample size, 0 when the table gives none.
	N float64
	// Models are the models in the order given.
	Models []TableModel
	// Order holds the relations read, smaller first.
	Order []TableOrder
	// Pairs are the pairs in the order given.
	Pairs []TablePair
}

// TableModel is a model line of a Table.
type TableModel struct {
	Name   string
	Dim    int
	LogLik float64
	// Prior is the prior weight; 0 when not given (then 1).
	Prior float64
	// Where says where the model was declared ("line 3", "models[2]").
	Where string
}

// TableOrder is one relation Smaller ⪯ Larger of a Table.
type TableOrder struct {
	Smaller, Larger string
	Where           string
}

// TablePair is a pair of a Table: given by value (Lambda or Regular) or by a
// function (Spec).
type TablePair struct {
	Model, Truth string
	// Lambda, Theta and Status give the pair by value; Regular asks for
	// the model's regular value d/2, θ = 1, with Status.
	Lambda  *big.Rat
	Theta   int
	Status  rlct.Status
	Regular bool
	// Spec, when not nil, is the function whose bound gives the pair.
	Spec *rlct.Spec
	// Description names a file holding a model description of the pair
	// (see the package rlct/model); this package does not read it. The
	// caller builds it and sets Problem.
	Description string
	// Problem, when not nil and Spec is nil, is the problem whose bound
	// gives the pair: set by the caller from Description, or directly.
	Problem *rlct.Problem
	// Estimate and Source are as in Pair.
	Estimate *Value
	Source   string
	// Where says where the pair was given ("line 9", "pairs[4]").
	Where string
}

// ReadTable reads a table in its text or JSON form (see Table). Errors
// wrap ErrInput and say where the problem is: "line 7: …" in the text form,
// the field in the JSON form ("pairs[2].theta: …"). ReadTable checks the
// form of each field; the names and the pairs are checked by Candidates.
func ReadTable(data []byte) (*Table, error) {
	if !utf8.Valid(data) {
		return nil, inputf("sbic: the table is not valid UTF-8")
	}
	trimmed := bytes.TrimLeft(data, " \t\r\n")
	if len(trimmed) > 0 && trimmed[0] == '{' {
		return readJSONTable(trimmed)
	}
	return readTextTable(string(data))
}

// token is one token of a text line with its column (1-based, in runes).
type token struct {
	text   string
	quoted bool
	col    int
}

// tokenize splits a line into tokens; a '#' outside quotes ends it.
func tokenize(line string) ([]token, error) {
	var out []token
	rs := []rune(line)
	for i := 0; i < len(rs); {
		switch r := rs[i]; {
		case r == '#':
			return out, nil
		case r == ' ' || r == '\t' || r == '\r':
			i++
		case r == '"':
			j := i + 1
			for j < len(rs) && rs[j] != '"' {
				j++
			}
			if j == len(rs) {
				return nil, fmt.Errorf("column %d: the quoted string is not closed (strings end at the line's end)", i+1)
			}
			out = append(out, token{string(rs[i+1 : j]), true, i + 1})
			i = j + 1
		default:
			j := i
			for j < len(rs) && rs[j] != ' ' && rs[j] != '\t' && rs[j] != '\r' && rs[j] != '#' && rs[j] != '"' {
				j++
			}
			out = append(out, token{string(rs[i:j]), false, i + 1})
			i = j
		}
	}
	return out, nil
}

// validName reports whether s is a model name: letters, digits, _ - .
func validName(s string) bool {
	if s == "" {
		return false
	}
	for _, r := range s {
		if !(r == '_' || r == '-' || r == '.' || unicode.IsLetter(r) || unicode.IsDigit(r)) {
			return false
		}
	}
	return true
}

// textReader reads the text form, one line at a time.
type textReader struct {
	t    *Table
	line int
	toks []token
	pos  int
	nSet bool
}

// errorf returns an error at the current line, and at the column of the
// token at pos when there is one.
func (r *textReader) errorf(format string, args ...any) error {
	where := fmt.Sprintf("line %d", r.line)
	if r.pos < len(r.toks) {
		where += fmt.Sprintf(", column %d", r.toks[r.pos].col)
	}
	return inputf("sbic: %s: %s", where, fmt.Sprintf(format, args...))
}

// next returns the next token, or an error naming what was expected.
func (r *textReader) next(what string) (token, error) {
	if r.pos >= len(r.toks) {
		return token{}, r.errorf("expected %s, found the end of the line", what)
	}
	t := r.toks[r.pos]
	r.pos++
	return t, nil
}

// word reads an unquoted token.
func (r *textReader) word(what string) (string, error) {
	t, err := r.next(what)
	if err != nil {
		return "", err
	}
	if t.quoted {
		r.pos--
		return "", r.errorf("expected %s, found a quoted string", what)
	}
	return t.text, nil
}

// quoted reads a quoted string.
func (r *textReader) quoted(what string) (string, error) {
	t, err := r.next(what)
	if err != nil {
		return "", err
	}
	if !t.quoted {
		r.pos--
		return "", r.errorf("expected %s in double quotes, found %q", what, t.text)
	}
	return t.text, nil
}

// name reads a model name.
func (r *textReader) name(what string) (string, error) {
	s, err := r.word(what)
	if err != nil {
		return "", err
	}
	if !validName(s) {
		r.pos--
		return "", r.errorf("%q is not a model name (letters, digits, _ - .)", s)
	}
	return s, nil
}

// number reads a finite float.
func (r *textReader) number(what string) (float64, error) {
	s, err := r.word(what)
	if err != nil {
		return 0, err
	}
	x, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(x, 0) || math.IsNaN(x) {
		r.pos--
		return 0, r.errorf("%s: %q is not a finite number", what, s)
	}
	return x, nil
}

// integer reads an integer.
func (r *textReader) integer(what string) (int, error) {
	s, err := r.word(what)
	if err != nil {
		return 0, err
	}
	x, err := strconv.Atoi(s)
	if err != nil {
		r.pos--
		return 0, r.errorf("%s: %q is not an integer", what, s)
	}
	return x, nil
}

// rational reads an exact number.
func (r *textReader) rational(what string) (*big.Rat, error) {
	s, err := r.word(what)
	if err != nil {
		return nil, err
	}
	x, err := monomial.ParseRat(s)
	if err != nil {
		r.pos--
		return nil, r.errorf("%s: %q is not an exact number (3/2, 1.5)", what, s)
	}
	return x, nil
}

// status reads a status word.
func (r *textReader) status() (rlct.Status, error) {
	s, err := r.word("a status")
	if err != nil {
		return "", err
	}
	st, err := parseStatus(s)
	if err != nil {
		r.pos--
		return "", r.errorf("%v", err)
	}
	return st, nil
}

func parseStatus(s string) (rlct.Status, error) {
	switch st := rlct.Status(s); st {
	case rlct.Exact, rlct.UpperBound, rlct.Uncertified:
		return st, nil
	}
	return "", fmt.Errorf("unknown status %q (want exact, upper-bound or uncertified)", s)
}

// readTextTable reads the text form.
func readTextTable(src string) (*Table, error) {
	r := &textReader{t: &Table{}}
	for n, line := range strings.Split(src, "\n") {
		r.line, r.pos = n+1, 0
		toks, err := tokenize(line)
		if err != nil {
			return nil, inputf("sbic: line %d, %v", r.line, err)
		}
		r.toks = toks
		if len(toks) == 0 {
			continue
		}
		head, err := r.word("a statement (n, model, order or pair)")
		if err != nil {
			return nil, err
		}
		switch head {
		case "n":
			err = r.sampleSize()
		case "model":
			err = r.model()
		case "order":
			err = r.order()
		case "pair":
			err = r.pair()
		default:
			r.pos = 0
			return nil, r.errorf("unknown statement %q (want n, model, order or pair)", head)
		}
		if err != nil {
			return nil, err
		}
		if r.pos < len(r.toks) {
			return nil, r.errorf("unexpected %q after the statement", r.toks[r.pos].text)
		}
	}
	if len(r.t.Models) == 0 {
		return nil, inputf("sbic: the table declares no model (a line: model NAME dim D loglik L)")
	}
	return r.t, nil
}

func (r *textReader) sampleSize() error {
	if r.nSet {
		r.pos = 0
		return r.errorf("the sample size is given twice")
	}
	x, err := r.number("the sample size")
	if err != nil {
		return err
	}
	r.t.N, r.nSet = x, true
	return nil
}

func (r *textReader) model() error {
	name, err := r.name("a model name")
	if err != nil {
		return err
	}
	m := TableModel{Name: name, Where: fmt.Sprintf("line %d", r.line)}
	seen := map[string]bool{}
	for r.pos < len(r.toks) {
		key, err := r.word("a field (dim, loglik or prior)")
		if err != nil {
			return err
		}
		if seen[key] {
			r.pos--
			return r.errorf("model %q: %s is given twice", name, key)
		}
		seen[key] = true
		switch key {
		case "dim":
			m.Dim, err = r.integer("dim")
			if err == nil && m.Dim < 0 {
				r.pos--
				err = r.errorf("model %q: dim %d is negative", name, m.Dim)
			}
		case "loglik":
			m.LogLik, err = r.number("loglik")
		case "prior":
			m.Prior, err = r.number("prior")
			if err == nil && !(m.Prior > 0) {
				r.pos--
				err = r.errorf("model %q: prior weight %g must be positive", name, m.Prior)
			}
		default:
			r.pos--
			return r.errorf("model %q: unknown field %q (want dim, loglik or prior)", name, key)
		}
		if err != nil {
			return err
		}
	}
	for _, k := range []string{"dim", "loglik"} {
		if !seen[k] {
			return r.errorf("model %q: %s is missing", name, k)
		}
	}
	r.t.Models = append(r.t.Models, m)
	return nil
}

func (r *textReader) order() error {
	prev, err := r.name("a model name")
	if err != nil {
		return err
	}
	links := 0
	for r.pos < len(r.toks) {
		op, err := r.word("<=")
		if err != nil {
			return err
		}
		if op != "<=" {
			r.pos--
			return r.errorf("expected <= between model names, found %q", op)
		}
		next, err := r.name("a model name after <=")
		if err != nil {
			return err
		}
		r.t.Order = append(r.t.Order, TableOrder{prev, next, fmt.Sprintf("line %d", r.line)})
		prev = next
		links++
	}
	if links == 0 {
		return r.errorf("an order line needs at least two models: order A <= B")
	}
	return nil
}

func (r *textReader) pair() error {
	model, err := r.name("the model's name")
	if err != nil {
		return err
	}
	truth, err := r.name("the truth's model name")
	if err != nil {
		return err
	}
	p := TablePair{Model: model, Truth: truth, Where: fmt.Sprintf("line %d", r.line)}
	label := fmt.Sprintf("pair %q at %q", model, truth)
	seen := map[string]bool{}
	spec := rlct.Spec{Order: rlct.OrderAuto} // a series gets an order chosen unless "order" says
	for r.pos < len(r.toks) {
		key, err := r.word("a field")
		if err != nil {
			return err
		}
		if seen[key] && key != "at" {
			r.pos--
			return r.errorf("%s: %s is given twice", label, key)
		}
		seen[key] = true
		switch key {
		case "lambda":
			p.Lambda, err = r.rational("the value of lambda")
		case "theta":
			p.Theta, err = r.integer("the value of theta")
		case "status":
			p.Status, err = r.status()
		case "regular":
			p.Regular = true
		case "k":
			spec.K, err = r.quoted("the expression K")
		case "sos":
			var s string
			s, err = r.quoted("the generators")
			spec.SOS = []string{s}
		case "prior":
			spec.Prior, err = r.quoted("the prior exponents")
		case "at":
			var s string
			s, err = r.quoted("a point")
			spec.At = append(spec.At, s)
		case "order":
			spec.Order, err = r.integer("order")
		case "vars":
			var s string
			if s, err = r.quoted("the variables"); err == nil {
				spec.Vars, err = rlct.SplitNames(s)
				if err != nil {
					r.pos--
					err = r.errorf("%s: vars: %v", label, err)
				}
			}
		case "estimate":
			var v Value
			if v.Lambda, err = r.rational("the estimate's λ"); err == nil {
				v.Theta, err = r.integer("the estimate's θ")
			}
			p.Estimate = &v
		case "source":
			p.Source, err = r.quoted("the source")
		case "description":
			p.Description, err = r.quoted("the description's file")
		default:
			r.pos--
			return r.errorf("%s: unknown field %q (want lambda, theta, status, regular, k, sos, prior, at, order, vars, description, estimate or source)", label, key)
		}
		if err != nil {
			return err
		}
	}
	if seen["k"] || seen["sos"] {
		p.Spec = &spec
	}
	if err := p.check(seen); err != nil {
		return inputf("sbic: line %d: %s: %v", r.line, label, err)
	}
	r.t.Pairs = append(r.t.Pairs, p)
	return nil
}

// check checks which fields a pair combines; seen holds the field names
// given (in JSON, "regular" only when true).
func (p *TablePair) check(seen map[string]bool) error {
	ways := 0
	for _, k := range []string{"lambda", "regular", "k", "sos", "description"} {
		if seen[k] {
			ways++
		}
	}
	switch {
	case ways == 0:
		return errors.New("give the value (lambda λ status S, or regular status S), a function (k \"EXPR\" or sos \"g1; g2\") or a model description (description \"FILE\")")
	case ways > 1:
		return errors.New("give only one of lambda, regular, k, sos and description")
	case seen["description"] && (seen["status"] || seen["theta"] || seen["prior"] || seen["at"] || seen["order"] || seen["vars"]):
		return errors.New("a model description gives the prior, the truth and K, and lctkit's bound gives status and theta; give none of status, theta, prior, at, order and vars with it")
	case seen["description"] && strings.TrimSpace(p.Description) == "":
		return errors.New("description: an empty file name")
	case p.Spec == nil && !seen["description"] && !seen["status"]:
		return errors.New("status is missing: say what the value claims (exact, upper-bound or uncertified)")
	case p.Spec != nil && (seen["status"] || seen["theta"]):
		return errors.New("status and theta come from lctkit's bound of K; give neither with k or sos")
	case p.Regular && seen["theta"]:
		return errors.New("regular means θ = 1; give no theta")
	case p.Spec == nil && (seen["prior"] || seen["at"] || seen["order"] || seen["vars"]):
		return errors.New("prior, at, order and vars go with k or sos")
	}
	if p.Spec != nil {
		if p.Spec.Order < 0 && p.Spec.Order != rlct.OrderAuto {
			return fmt.Errorf("order %d is negative", p.Spec.Order)
		}
		if p.Spec.Order > monomial.DefaultMaxOrder {
			return fmt.Errorf("order %d is above the largest order lctkit expands, %d", p.Spec.Order, monomial.DefaultMaxOrder)
		}
	}
	if p.Spec == nil && !seen["description"] && !p.Regular && !seen["theta"] {
		p.Theta = 1
	}
	if p.Regular {
		p.Theta = 1
	}
	if p.Lambda != nil {
		if err := checkValue(p.Lambda, p.Theta); err != nil {
			return err
		}
	}
	if p.Estimate != nil {
		if err := checkValue(p.Estimate.Lambda, p.Estimate.Theta); err != nil {
			return fmt.Errorf("estimate: %v", err)
		}
	}
	return nil
}

// Computed is the answer of lctkit for a pair given by a function.
type Computed struct {
	// Pair is the index of the pair in the table (and in the candidates).
	Pair int
	// Result is the answer of rlct.Bound.
	Result *rlct.Result
}

// Candidates resolves the table: it maps the names to models, bounds the
// pairs given by a function with rlct.Bound (opt may be nil; limits on
// the expansion come from each Spec's Limits, which the caller may set
// beforehand), and validates the whole with New. It returns the candidates,
// the log-likelihoods (one per model, as Scores and Choose take them) and
// lctkit's answers for the computed pairs. Errors say where in the table the
// problem is; an error in an expression wraps the *rlct.SpecError with its
// position.
func (t *Table) Candidates(ctx context.Context, opt *rlct.Options) (*Candidates, []float64, []Computed, error) {
	index := map[string]int{}
	models := make([]Model, len(t.Models))
	logLik := make([]float64, len(t.Models))
	for i, m := range t.Models {
		if prev, ok := index[m.Name]; ok {
			return nil, nil, nil, inputf("sbic: %s: model %q is declared again (first at %s)", m.Where, m.Name, t.Models[prev].Where)
		}
		index[m.Name] = i
		models[i] = Model{Name: m.Name, Dim: m.Dim, Prior: m.Prior}
		logLik[i] = m.LogLik
	}
	lookup := func(where, name, role string) (int, error) {
		i, ok := index[name]
		if !ok {
			return 0, inputf("sbic: %s: %s %q is not a declared model", where, role, name)
		}
		return i, nil
	}
	var order [][2]int
	for _, o := range t.Order {
		j, err := lookup(o.Where, o.Smaller, "order: model")
		if err != nil {
			return nil, nil, nil, err
		}
		i, err := lookup(o.Where, o.Larger, "order: model")
		if err != nil {
			return nil, nil, nil, err
		}
		order = append(order, [2]int{j, i})
	}
	pairs := make([]Pair, len(t.Pairs))
	var computed []Computed
	for n, tp := range t.Pairs {
		i, err := lookup(tp.Where, tp.Model, "pair: model")
		if err != nil {
			return nil, nil, nil, err
		}
		j, err := lookup(tp.Where, tp.Truth, "pair: truth")
		if err != nil {
			return nil, nil, nil, err
		}
		p := Pair{Model: i, Truth: j, Lambda: tp.Lambda, Theta: tp.Theta, Status: tp.Status, Estimate: tp.Estimate, Source: tp.Source}
		switch {
		case tp.Regular:
			p.Lambda = big.NewRat(int64(t.Models[i].Dim), 2)
			p.Theta = 1
			if p.Source == "" {
				p.Source = fmt.Sprintf("regular value d/2 with d = %d", t.Models[i].Dim)
			}
		case tp.Spec != nil || tp.Problem != nil:
			var res *rlct.Result
			var err error
			src := "computed by lctkit from K"
			if tp.Spec != nil {
				res, err = boundSpec(ctx, tp.Spec, opt)
			} else {
				res, err = rlct.Bound(ctx, tp.Problem, opt)
				if tp.Description != "" {
					src = "computed by lctkit from the model description " + tp.Description
				}
			}
			if err != nil {
				return nil, nil, nil, &boundError{fmt.Sprintf("sbic: %s: pair %q at %q: %v", tp.Where, tp.Model, tp.Truth, err), err}
			}
			p.Lambda, p.Theta, p.Status = res.Lambda, res.Theta, res.Status
			if tp.Source != "" {
				src += "; " + tp.Source
			}
			p.Source = src
			computed = append(computed, Computed{Pair: n, Result: res})
		}
		if tp.Description != "" && tp.Problem == nil {
			return nil, nil, nil, inputf("sbic: %s: pair %q at %q: the model description %s was not built (the caller builds descriptions; lctkit choose does)", tp.Where, tp.Model, tp.Truth, tp.Description)
		}
		pairs[n] = p
	}
	c, err := New(models, order, pairs)
	if err != nil {
		return nil, nil, nil, err
	}
	return c, logLik, computed, nil
}

// boundSpec parses a spec and bounds it at its points.
func boundSpec(ctx context.Context, s *rlct.Spec, opt *rlct.Options) (*rlct.Result, error) {
	_, res, err := s.Bound(ctx, opt)
	return res, err
}

// boundError is an error of lctkit's bound of a pair's K, with the place in
// the table. It unwraps to the error of rlct, and matches ErrInput when that
// error is an input error (rlct.ErrInput).
type boundError struct {
	msg string
	err error
}

func (e *boundError) Error() string { return e.msg }
func (e *boundError) Unwrap() error { return e.err }

// Is reports that the error is an input error when rlct's is.
func (e *boundError) Is(target error) bool {
	return target == ErrInput && errors.Is(e.err, rlct.ErrInput)
}
