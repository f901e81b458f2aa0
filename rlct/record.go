package rlct

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
	"unicode/utf8"
)

// ErrRecord is wrapped by the errors of DecodeRecord.
// It matches ErrInput.
var ErrRecord error = &inputError{"rlct: bad record"}

// Record is one problem of a JSON lines file, one JSON object per line, as
// the batch command of lctkit reads them:
//
//	{"id": 7, "k": "x^4 + y^6"}
//	{"id": "rank1-3x2", "sos": ["b1*a1", "b1*a2", "b2*a1"], "prior": "a1=1"}
//	{"id": [2, "b"], "k": "(x-1)^2 + y^2", "at": ["x=1", "x=-1"], "vars": "x,y"}
//
// The fields are
//
//	id     any JSON value, kept verbatim (optional)
//	k      K as an expression (a string)
//	sos    the generators of K = Σ g_i², a list of strings, or one string
//	       with the generators separated by ';'
//	prior  "x=1,y=1/2", as Spec.Prior (optional)
//	at     one point "x=0,y=1/3" or a list of them, as Spec.At (optional)
//	order  a non-negative integer literal, as Spec.Order, or "auto" for
//	       OrderAuto (optional; absent means OrderAuto, so that a series
//	       is expanded at an order chosen as on the command line)
//	vars   "x,y,z" or a list of names, as Spec.Vars (optional)
//	model  a model description (package rlct/model), one string or a list
//	       of its lines, instead of k or sos; with it only id and order
//	       (which replaces the description's order) may be given
//
// Exactly one of k, sos and model must be given. A field whose value is
// null counts as absent; any other field name is an error.
type Record struct {
	// ID is the value of "id" exactly as it was written, nil when absent.
	// It never passes through a float64, so an integer with any number of
	// digits comes back unchanged when the record is encoded again.
	ID json.RawMessage
	// Spec is the problem; Spec.Limits is left zero for the caller to set.
	// With Model set, only Spec.Order may be set.
	Spec Spec
	// Model is the text of a model description, its lines joined by
	// newlines, when the record gives one; this package does not read it
	// (package rlct/model does).
	Model string
}

// DecodeRecord reads one record from data, which must hold a single JSON
// object (surrounding white space is allowed). It returns an error
// wrapping ErrRecord for malformed JSON, a value that is not an object, a
// duplicate or unknown field, a field of the wrong type, or a record with
// both or neither of k and sos; the message names the field. On error the
// returned Record still carries the ID when the object was read far enough
// to find it, so that an answer can be matched with its question.
//
// DecodeRecord does not parse the expressions: Spec.Problem does that and
// reports positions inside them.
func DecodeRecord(data []byte) (Record, error) {
	var rec Record
	fields, err := readObject(data, &rec.ID)
	if err != nil {
		return rec, err
	}
	s := &rec.Spec
	s.Order = OrderAuto
	for _, f := range fields {
		if isNull(f.value) {
			continue
		}
		var err error
		switch f.name {
		case "id":
			// read by readObject
		case "k":
			err = decodeString(f.value, &s.K)
		case "sos":
			s.SOS, err = decodeStrings(f.value)
		case "prior":
			err = decodeString(f.value, &s.Prior)
		case "at":
			s.At, err = decodeStrings(f.value)
		case "order":
			s.Order, err = decodeOrder(f.value)
		case "vars":
			s.Vars, err = decodeNames(f.value)
		case "model":
			var lines []string
			lines, err = decodeStrings(f.value)
			rec.Model = strings.Join(lines, "\n")
		default:
			return rec, fmt.Errorf("%w: unknown field %q (known: id, k, sos, prior, at, order, vars, model)", ErrRecord, f.name)
		}
		if err != nil {
			return rec, fmt.Errorf("%w: field %q: %v", ErrRecord, f.name, err)
		}
	}
	if rec.Model != "" {
		if s.K != "" || len(s.SOS) > 0 || s.Prior != "" || len(s.At) > 0 || len(s.Vars) > 0 {
			return rec, fmt.Errorf(`%w: a record with "model" takes only "id" and "order" besides (the description holds K, the prior and the truth)`, ErrRecord)
		}
		return rec, nil
	}
	switch {
	case s.K == "" && len(s.SOS) == 0:
		return rec, fmt.Errorf(`%w: none of "k", "sos" and "model" is given`, ErrRecord)
	case s.K != "" && len(s.SOS) > 0:
		return rec, fmt.Errorf(`%w: give either "k" or "sos", not both`, ErrRecord)
	}
	return rec, nil
}

// MarshalJSON writes r in the form DecodeRecord reads: id (when set), k or
// sos (a list), then prior, at (a list), order, vars (a list) and model (a
// string) when they are set. An ID that is not valid JSON is an error.
func (r Record) MarshalJSON() ([]byte, error) {
	var b bytes.Buffer
	b.WriteByte('{')
	sep := ""
	put := func(name string, v any) error {
		enc, err := marshalNoEscape(v)
		if err != nil {
			return err
		}
		b.WriteString(sep)
		sep = ","
		b.WriteString(strconv.Quote(name))
		b.WriteByte(':')
		b.Write(enc)
		return nil
	}
	s := r.Spec
	steps := []struct {
		name string
		set  bool
		v    any
	}{
		{"id", r.ID != nil, r.ID},
		{"k", s.K != "", s.K},
		{"sos", len(s.SOS) > 0, s.SOS},
		{"prior", s.Prior != "", s.Prior},
		{"at", len(s.At) > 0, s.At},
		{"order", s.Order != OrderAuto, s.Order},
		{"vars", len(s.Vars) > 0, s.Vars},
		{"model", r.Model != "", r.Model},
	}
	for _, st := range steps {
		if !st.set {
			continue
		}
		if err := put(st.name, st.v); err != nil {
			return nil, fmt.Errorf("rlct: record field %q: %w", st.name, err)
		}
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}

// marshalNoEscape is json.Marshal without the HTML escaping of <, > and &,
// which would make expressions like "x<y" hard to read.
func marshalNoEscape(v any) ([]byte, error) {
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimRight(b.Bytes(), "\n"), nil
}

// field is one name/value pair of a JSON object, value verbatim.
type field struct {
	name  string
	value json.RawMessage
}

// readObject splits data, a JSON object, into its fields in order. It sets
// *id as soon as an "id" field has been read.
func readObject(data []byte, id *json.RawMessage) ([]field, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	tok, err := dec.Token()
	if err == io.EOF {
		return nil, fmt.Errorf("%w: empty", ErrRecord)
	}
	if err != nil {
		return nil, jsonError(err)
	}
	if d, ok := tok.(json.Delim); !ok || d != '{' {
		return nil, fmt.Errorf("%w: want a JSON object, found %s", ErrRecord, describeToken(tok))
	}
	var fields []field
	seen := map[string]bool{}
	for dec.More() {
		tok, err := dec.Token()
		if err != nil {
			return nil, jsonError(err)
		}
		name, ok := tok.(string)
		if !ok { // the decoder only returns strings as keys; be safe
			return nil, fmt.Errorf("%w: object key is not a string", ErrRecord)
		}
		var value json.RawMessage
		if err := dec.Decode(&value); err != nil {
			return nil, jsonError(err)
		}
		if seen[name] {
			return nil, fmt.Errorf("%w: duplicate field %q", ErrRecord, name)
		}
		seen[name] = true
		if name == "id" {
			*id = value
		}
		fields = append(fields, field{name, value})
	}
	if _, err := dec.Token(); err != nil { // the closing brace
		return nil, jsonError(err)
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, fmt.Errorf("%w: unexpected data after the object at byte %d", ErrRecord, dec.InputOffset())
	}
	return fields, nil
}

// jsonError words an error of encoding/json with its byte offset.
func jsonError(err error) error {
	var se *json.SyntaxError
	if errors.As(err, &se) {
		return fmt.Errorf("%w: invalid JSON at byte %d: %s", ErrRecord, se.Offset, se.Error())
	}
	if err == io.ErrUnexpectedEOF || err == io.EOF {
		return fmt.Errorf("%w: invalid JSON: unexpected end of the line", ErrRecord)
	}
	return fmt.Errorf("%w: invalid JSON: %v", ErrRecord, err)
}

func describeToken(tok json.Token) string {
	switch t := tok.(type) {
	case json.Delim:
		return "'" + t.String() + "'"
	case string:
		return "a string"
	case json.Number:
		return "a number"
	case bool:
		return "a boolean"
	case nil:
		return "null"
	}
	return fmt.Sprintf("%v", tok)
}

func isNull(v json.RawMessage) bool { return string(v) == "null" }

func decodeString(v json.RawMessage, out *string) error {
	if len(v) == 0 || v[0] != '"' {
		return errors.New("want a string")
	}
	return json.Unmarshal(v, out)
}

// decodeStrings reads a string or a list of strings; a single string
// becomes a list of one.
func decodeStrings(v json.RawMessage) ([]string, error) {
	if len(v) > 0 && v[0] == '"' {
		var s string
		if err := json.Unmarshal(v, &s); err != nil {
			return nil, err
		}
		return []string{s}, nil
	}
	if len(v) == 0 || v[0] != '[' {
		return nil, errors.New("want a string or a list of strings")
	}
	var raw []json.RawMessage
	if err := json.Unmarshal(v, &raw); err != nil {
		return nil, err
	}
	out := make([]string, len(raw))
	for i, r := range raw {
		if err := decodeString(r, &out[i]); err != nil {
			return nil, fmt.Errorf("entry %d: %v", i+1, err)
		}
	}
	if len(out) == 0 {
		return nil, nil
	}
	return out, nil
}

// decodeNames reads "x,y,z" or ["x", "y", "z"].
func decodeNames(v json.RawMessage) ([]string, error) {
	if len(v) > 0 && v[0] == '"' {
		var s string
		if err := json.Unmarshal(v, &s); err != nil {
			return nil, err
		}
		return SplitNames(s)
	}
	names, err := decodeStrings(v)
	if err != nil {
		return nil, errors.New("want a string \"x,y,z\" or a list of names")
	}
	for i, name := range names {
		if strings.TrimSpace(name) == "" {
			return nil, fmt.Errorf("entry %d is an empty name", i+1)
		}
	}
	return names, nil
}

// decodeOrder reads a non-negative integer literal or "auto".
func decodeOrder(v json.RawMessage) (int, error) {
	if string(v) == `"auto"` {
		return OrderAuto, nil
	}
	n, err := strconv.Atoi(string(v))
	if err != nil || n < 0 {
		return 0, fmt.Errorf("want a non-negative integer or \"auto\", found %s", abbreviate(string(v)))
	}
	return n, nil
}

// abbreviate shortens s for an error message.
func abbreviate(s string) string {
	const max = 40
	if len(s) <= max {
		return s
	}
	cut := max
	for cut > 0 && !utf8.RuneStart(s[cut]) {
		cut--
	}
	return s[:cut] + "…"
}
