package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"reflect"

	"github.com/alecthomas/kong"

	"github.com/lctkit/lctkit/rlct"
)

// The output layer. A command that prints an answer builds one value that
// writes itself as text (an answer) and hands it to env.print; with --json
// the same value goes to writeJSON, the one JSON writer of the program, which
// encodes it from its json tags (the library's types are their own JSON
// form) or its MarshalJSON method. A command run with --json that fails
// also prints {"error": …}, written by run for every command alike.

// answer is a command's output: it writes itself as plain text, and is
// encoded as JSON by writeJSON.
type answer interface {
	writeText(w io.Writer)
}

// jsonFlag is the --json flag of the commands that print an answer.
type jsonFlag struct {
	JSON bool `help:"Print one JSON object instead of text."`
}

// wantsJSON reports whether --json was given.
func (f *jsonFlag) wantsJSON() bool { return f.JSON }

// print writes a to standard output as text, or as one JSON object.
func (e *env) print(a answer, asJSON bool) error {
	if asJSON {
		return writeJSON(e.stdout, a)
	}
	a.writeText(e.stdout)
	return nil
}

// writeJSON writes v as one line of JSON.
func writeJSON(w io.Writer, v any) error {
	b, err := encodeJSON(v)
	if err != nil {
		return err
	}
	_, err = w.Write(append(b, '\n'))
	return err
}

// encodeJSON is json.Marshal without the HTML escaping of <, > and &, so
// that "x + y >= 2" reads as it is. Every MarshalJSON of this package uses
// it: an escape made inside one cannot be undone by the outer encoder.
func encodeJSON(v any) ([]byte, error) {
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return bytes.TrimSuffix(b.Bytes(), []byte("\n")), nil
}

// mergeJSON encodes a and b, whose JSON forms are objects, as one object
// with the fields of a followed by those of b.
func mergeJSON(a, b any) ([]byte, error) {
	ja, err := encodeJSON(a)
	if err != nil {
		return nil, err
	}
	jb, err := encodeJSON(b)
	if err != nil {
		return nil, err
	}
	if len(ja) < 2 || ja[0] != '{' || len(jb) < 2 || jb[0] != '{' {
		return nil, errors.New("mergeJSON: both values must encode as objects")
	}
	switch {
	case len(jb) == 2: // {}
		return ja, nil
	case len(ja) == 2:
		return jb, nil
	}
	out := append(ja[:len(ja)-1:len(ja)-1], ',')
	return append(out, jb[1:]...), nil
}

// result is a result of rlct, or the error that stopped it: the form of a
// batch record and of the bound inside estimate's JSON.
type result struct {
	*rlct.Result
	Error string `json:"error,omitempty"`
}

// errorObject is what a command run with --json prints when it fails.
type errorObject struct {
	Error string `json:"error"`
}

// wantsJSON reports whether the selected command was given --json.
func wantsJSON(ctx *kong.Context) bool {
	n := ctx.Selected()
	if n == nil || !n.Target.IsValid() {
		return false
	}
	t := n.Target
	if t.Kind() != reflect.Pointer && t.CanAddr() {
		t = t.Addr()
	}
	j, ok := t.Interface().(interface{ wantsJSON() bool })
	return ok && j.wantsJSON()
}

// writeJSONError prints {"error": …} for a failed command run with --json,
// also when the message was already shown on stderr with a caret. An exit
// error without an error (a batch with failed records) prints nothing.
func writeJSONError(e *env, err error) {
	var ee exitError
	if errors.As(err, &ee) {
		if ee.err == nil {
			return
		}
		err = ee.err
	}
	if werr := writeJSON(e.stdout, errorObject{err.Error()}); werr != nil {
		fmt.Fprintln(e.stderr, "lctkit:", werr)
	}
}
