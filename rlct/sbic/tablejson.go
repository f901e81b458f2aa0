package sbic

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"math/big"
	"strings"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// jsonTable is the JSON form of a Table.
type jsonTable struct {
	N      *float64    `json:"n"`
	Models []jsonModel `json:"models"`
	Order  [][]string  `json:"order"`
	Pairs  []jsonPair  `json:"pairs"`
}

type jsonModel struct {
	Name   *string  `json:"name"`
	Dim    *int     `json:"dim"`
	LogLik *float64 `json:"loglik"`
	Prior  *float64 `json:"prior"`
}

type jsonPair struct {
	Model       *string         `json:"model"`
	Truth       *string         `json:"truth"`
	Lambda      json.RawMessage `json:"lambda"`
	Theta       *int            `json:"theta"`
	Status      *string         `json:"status"`
	Regular     *bool           `json:"regular"`
	K           *string         `json:"k"`
	SOS         json.RawMessage `json:"sos"`
	Prior       *string         `json:"prior"`
	At          json.RawMessage `json:"at"`
	Order       *int            `json:"order"`
	Vars        json.RawMessage `json:"vars"`
	Estimate    *jsonValue      `json:"estimate"`
	Source      *string         `json:"source"`
	Description *string         `json:"description"`
}

type jsonValue struct {
	Lambda json.RawMessage `json:"lambda"`
	Theta  *int            `json:"theta"`
}

// readJSONTable reads the JSON form.
func readJSONTable(data []byte) (*Table, error) {
	if err := checkDuplicateKeys(data); err != nil {
		return nil, inputf("sbic: JSON table: %v", err)
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var jt jsonTable
	if err := dec.Decode(&jt); err != nil {
		return nil, inputf("sbic: JSON table: %v", jsonMessage(err))
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, inputf("sbic: JSON table: more data after the object")
	}
	t := &Table{}
	if jt.N != nil {
		if math.IsInf(*jt.N, 0) || math.IsNaN(*jt.N) {
			return nil, inputf("sbic: JSON table: n is not finite")
		}
		t.N = *jt.N
	}
	if len(jt.Models) == 0 {
		return nil, inputf(`sbic: JSON table: "models" is missing or empty`)
	}
	for i, m := range jt.Models {
		where := fmt.Sprintf("models[%d]", i)
		switch {
		case m.Name == nil || !validName(*m.Name):
			if m.Name == nil {
				return nil, inputf("sbic: %s: name is missing", where)
			}
			return nil, inputf("sbic: %s: %q is not a model name (letters, digits, _ - .)", where, *m.Name)
		case m.Dim == nil:
			return nil, inputf("sbic: %s (%q): dim is missing", where, *m.Name)
		case *m.Dim < 0:
			return nil, inputf("sbic: %s (%q): dim %d is negative", where, *m.Name, *m.Dim)
		case m.LogLik == nil:
			return nil, inputf("sbic: %s (%q): loglik is missing", where, *m.Name)
		case m.Prior != nil && !(*m.Prior > 0):
			return nil, inputf("sbic: %s (%q): prior weight %g must be positive", where, *m.Name, *m.Prior)
		}
		tm := TableModel{Name: *m.Name, Dim: *m.Dim, LogLik: *m.LogLik, Where: where}
		if m.Prior != nil {
			tm.Prior = *m.Prior
		}
		t.Models = append(t.Models, tm)
	}
	for c, chain := range jt.Order {
		if len(chain) < 2 {
			return nil, inputf("sbic: order[%d]: a chain needs at least two models", c)
		}
		for k := 1; k < len(chain); k++ {
			t.Order = append(t.Order, TableOrder{chain[k-1], chain[k], fmt.Sprintf("order[%d]", c)})
		}
	}
	for n, jp := range jt.Pairs {
		p, err := jp.pair(fmt.Sprintf("pairs[%d]", n))
		if err != nil {
			return nil, err
		}
		t.Pairs = append(t.Pairs, p)
	}
	return t, nil
}

// pair converts one JSON pair.
func (jp *jsonPair) pair(where string) (TablePair, error) {
	if jp.Model == nil || jp.Truth == nil {
		return TablePair{}, inputf(`sbic: %s: "model" and "truth" are required`, where)
	}
	p := TablePair{Model: *jp.Model, Truth: *jp.Truth, Where: where}
	label := fmt.Sprintf("%s (pair %q at %q)", where, p.Model, p.Truth)
	fail := func(field string, err error) (TablePair, error) {
		return TablePair{}, inputf("sbic: %s: %s: %v", label, field, err)
	}
	seen := map[string]bool{}
	var err error
	if present(jp.Lambda) {
		seen["lambda"] = true
		if p.Lambda, err = jsonRat(jp.Lambda); err != nil {
			return fail("lambda", err)
		}
	}
	if jp.Theta != nil {
		seen["theta"] = true
		p.Theta = *jp.Theta
	}
	if jp.Status != nil {
		seen["status"] = true
		if p.Status, err = parseStatus(*jp.Status); err != nil {
			return fail("status", err)
		}
	}
	if jp.Regular != nil {
		if !*jp.Regular {
			return fail("regular", errors.New("write true, or leave it out"))
		}
		seen["regular"], p.Regular = true, true
	}
	spec := rlct.Spec{Order: rlct.OrderAuto} // a series gets an order chosen unless "order" says
	if jp.K != nil {
		seen["k"], spec.K = true, *jp.K
	}
	if present(jp.SOS) {
		seen["sos"] = true
		if spec.SOS, err = jsonStrings(jp.SOS); err != nil {
			return fail("sos", err)
		}
		if len(spec.SOS) == 0 {
			return fail("sos", errors.New("no generators"))
		}
	}
	if jp.Prior != nil {
		seen["prior"], spec.Prior = true, *jp.Prior
	}
	if present(jp.At) {
		seen["at"] = true
		if spec.At, err = jsonStrings(jp.At); err != nil {
			return fail("at", err)
		}
	}
	if jp.Order != nil {
		seen["order"], spec.Order = true, *jp.Order
	}
	if present(jp.Vars) {
		seen["vars"] = true
		var one string
		if json.Unmarshal(jp.Vars, &one) == nil {
			spec.Vars, err = rlct.SplitNames(one)
		} else {
			spec.Vars, err = jsonStrings(jp.Vars)
		}
		if err != nil {
			return fail("vars", err)
		}
	}
	if seen["k"] || seen["sos"] {
		p.Spec = &spec
	}
	if jp.Description != nil {
		seen["description"], p.Description = true, *jp.Description
	}
	if jp.Estimate != nil {
		if !present(jp.Estimate.Lambda) || jp.Estimate.Theta == nil {
			return fail("estimate", errors.New(`give both "lambda" and "theta"`))
		}
		lambda, err := jsonRat(jp.Estimate.Lambda)
		if err != nil {
			return fail("estimate.lambda", err)
		}
		p.Estimate = &Value{lambda, *jp.Estimate.Theta}
	}
	if jp.Source != nil {
		p.Source = *jp.Source
	}
	if err := p.check(seen); err != nil {
		return TablePair{}, inputf("sbic: %s: %v", label, err)
	}
	return p, nil
}

// present reports whether a raw field was given and is not null.
func present(raw json.RawMessage) bool {
	return len(raw) > 0 && string(raw) != "null"
}

// jsonRat reads an exact number written as a JSON string ("3/2") or a JSON
// number (1.5), from its literal text.
func jsonRat(raw json.RawMessage) (*big.Rat, error) {
	var s string
	if json.Unmarshal(raw, &s) != nil {
		var num json.Number
		if err := json.Unmarshal(raw, &num); err != nil {
			return nil, fmt.Errorf("want an exact number such as \"3/2\" or 1.5, found %s", raw)
		}
		s = string(num)
	}
	x, err := monomial.ParseRat(strings.TrimSpace(s))
	if err != nil {
		return nil, fmt.Errorf("%q is not an exact number (3/2, 1.5)", s)
	}
	return x, nil
}

// jsonStrings reads a list of strings, or one string with the items
// separated by ';'.
func jsonStrings(raw json.RawMessage) ([]string, error) {
	var one string
	if json.Unmarshal(raw, &one) == nil {
		return []string{one}, nil
	}
	var list []string
	if err := json.Unmarshal(raw, &list); err != nil {
		return nil, errors.New("want a string or a list of strings")
	}
	return list, nil
}

// jsonMessage makes the errors of encoding/json name the field.
func jsonMessage(err error) string {
	var te *json.UnmarshalTypeError
	if errors.As(err, &te) {
		return fmt.Sprintf("%s: want %s, found a JSON %s", te.Field, te.Type, te.Value)
	}
	return err.Error()
}

// checkDuplicateKeys walks the JSON document and reports a key repeated
// in one object, with its path.
func checkDuplicateKeys(data []byte) error {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	var walk func(path string, depth int) error
	walk = func(path string, depth int) error {
		if depth > 64 {
			return errors.New("nested too deeply")
		}
		tok, err := dec.Token()
		if err != nil {
			return err
		}
		d, ok := tok.(json.Delim)
		if !ok {
			return nil
		}
		switch d {
		case '{':
			seen := map[string]bool{}
			for dec.More() {
				kt, err := dec.Token()
				if err != nil {
					return err
				}
				key, _ := kt.(string)
				if seen[key] {
					return fmt.Errorf("%s%q appears twice", prefix(path), key)
				}
				seen[key] = true
				if err := walk(path+"."+key, depth+1); err != nil {
					return err
				}
			}
		case '[':
			for i := 0; dec.More(); i++ {
				if err := walk(fmt.Sprintf("%s[%d]", path, i), depth+1); err != nil {
					return err
				}
			}
		}
		_, err = dec.Token() // the closing delimiter
		return err
	}
	return walk("", 0)
}

// prefix writes a path as the place a key was found in.
func prefix(path string) string {
	if path == "" {
		return "key "
	}
	return strings.TrimPrefix(path, ".") + ": key "
}
