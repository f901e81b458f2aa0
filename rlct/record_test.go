package rlct

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"reflect"
	"strings"
	"testing"
)

func TestDecodeRecord(t *testing.T) {
	tests := []struct {
		in   string
		id   string // "" for no id
		spec Spec
	}{
		{`{"id": 1, "k": "x^4+y^6"}`, `1`, Spec{K: "x^4+y^6"}},
		// A number beyond float64 precision and int64 range keeps its digits.
		{`{"id":12345678901234567890123,"k":"x^2"}`, `12345678901234567890123`, Spec{K: "x^2"}},
		{`{"id": 1.50e3, "k":"x^2"}`, `1.50e3`, Spec{K: "x^2"}},
		{`{"id": {"run": [1, "a"]}, "k":"x^2"}`, `{"run": [1, "a"]}`, Spec{K: "x^2"}},
		{`{"id": null, "k":"x^2"}`, `null`, Spec{K: "x^2"}},
		{`{"k":"x^2"}`, ``, Spec{K: "x^2"}},
		{`  {"sos": ["x*y", "z"]}  `, ``, Spec{SOS: []string{"x*y", "z"}}},
		{`{"sos": "x*y; z"}`, ``, Spec{SOS: []string{"x*y; z"}}},
		{`{"k": "x^2", "prior": "x=1", "at": "x=0", "order": 6, "vars": "x, y"}`, ``,
			Spec{K: "x^2", Prior: "x=1", At: []string{"x=0"}, Order: 6, Vars: []string{"x", "y"}}},
		{`{"k": "x^2", "at": ["x=0", "x=1"], "vars": ["x", "y"], "order": 0}`, ``,
			Spec{K: "x^2", At: []string{"x=0", "x=1"}, Vars: []string{"x", "y"}}},
		{`{"k": "x^2", "prior": null, "at": null, "vars": ""}`, ``, Spec{K: "x^2"}},
		{`{"k": "x^2", "sos": null}`, ``, Spec{K: "x^2"}},
		{`{"k": "x<y & \u00e9"}`, ``, Spec{K: "x<y & é"}},
	}
	for _, tt := range tests {
		rec, err := DecodeRecord([]byte(tt.in))
		if err != nil {
			t.Errorf("%s: %v", tt.in, err)
			continue
		}
		if rec.Model != "" {
			t.Errorf("%s: model %q, want none", tt.in, rec.Model)
		}
		if string(rec.ID) != tt.id {
			t.Errorf("%s: id %q, want %q", tt.in, rec.ID, tt.id)
		}
		want := tt.spec
		if !strings.Contains(tt.in, `"order"`) {
			want.Order = OrderAuto // the documented default of an absent order
		}
		if !reflect.DeepEqual(rec.Spec, want) {
			t.Errorf("%s: spec %+v, want %+v", tt.in, rec.Spec, want)
		}
	}
}

// TestDecodeModelRecord checks records that give a model description: the
// text as one string or a list of lines, with an order that replaces the
// description's.
func TestDecodeModelRecord(t *testing.T) {
	tests := []struct {
		in    string
		model string
		order int
	}{
		{`{"id": 1, "model": "kind discrete\nparam a"}`, "kind discrete\nparam a", OrderAuto},
		{`{"model": ["kind discrete", "param a"], "order": 4}`, "kind discrete\nparam a", 4},
		{`{"model": ["kind discrete"], "k": null}`, "kind discrete", OrderAuto},
	}
	for _, tt := range tests {
		rec, err := DecodeRecord([]byte(tt.in))
		if err != nil {
			t.Errorf("%s: %v", tt.in, err)
			continue
		}
		if rec.Model != tt.model || rec.Spec.Order != tt.order {
			t.Errorf("%s: model %q, order %d; want %q, %d", tt.in, rec.Model, rec.Spec.Order, tt.model, tt.order)
		}
		// MarshalJSON writes what DecodeRecord reads.
		enc, err := json.Marshal(rec)
		if err != nil {
			t.Fatal(err)
		}
		back, err := DecodeRecord(enc)
		if err != nil || back.Model != rec.Model || back.Spec.Order != rec.Spec.Order {
			t.Errorf("%s: round trip through %s gives %+v, %v", tt.in, enc, back, err)
		}
	}
}

func TestDecodeRecordErrors(t *testing.T) {
	tests := []struct {
		in   string
		id   string // the id still known despite the error
		want string // in the message
	}{
		{``, ``, "empty"},
		{`   `, ``, "empty"},
		{`[1, 2]`, ``, "want a JSON object, found '['"},
		{`"x^2"`, ``, "want a JSON object, found a string"},
		{`{"id": 1, "k": "x^2"`, `1`, "unexpected end"},
		{`{"id": 1, "k": x^2}`, `1`, "invalid JSON at byte"},
		{`{"id": 1, "k": "x^2"} {"k": "y"}`, `1`, "unexpected data after the object"},
		{`{"id": 1, "k": "x^2", "nonsense": 3}`, `1`, `unknown field "nonsense"`},
		{`{"id": 1, "K": "x^2"}`, `1`, `unknown field "K"`},
		{`{"id": 1, "k": "x^2", "k": "y^2"}`, `1`, `duplicate field "k"`},
		{`{"id": 1, "model": "kind regression", "k": "x^2"}`, `1`, `takes only "id" and "order"`},
		{`{"id": 1, "model": "kind regression", "prior": "x=1"}`, `1`, `takes only "id" and "order"`},
		{`{"id": 1, "model": 3}`, `1`, `field "model": want a string or a list of strings`},
		{`{"id": 1}`, `1`, `none of "k", "sos" and "model"`},
		{`{"id": 1, "k": ""}`, `1`, `none of "k", "sos" and "model"`},
		{`{"id": 1, "k": "x^2", "sos": ["x"]}`, `1`, `not both`},
		{`{"id": 1, "k": 5}`, `1`, `field "k": want a string`},
		{`{"id": 1, "sos": [1, 2]}`, `1`, `field "sos": entry 1: want a string`},
		{`{"id": 1, "sos": {"a": 1}}`, `1`, `field "sos": want a string or a list of strings`},
		{`{"id": 1, "k": "x^2", "order": 1.5}`, `1`, `field "order": want a non-negative integer or "auto", found 1.5`},
		{`{"id": 1, "k": "x^2", "order": -2}`, `1`, `field "order": want a non-negative integer`},
		{`{"id": 1, "k": "x^2", "order": "6"}`, `1`, `field "order": want a non-negative integer or "auto", found "6"`},
		{`{"id": 1, "k": "x^2", "order": 123456789012345678901234567890}`, `1`, `field "order"`},
		{`{"id": 1, "k": "x^2", "vars": "x,,y"}`, `1`, `field "vars": empty variable name`},
		{`{"id": 1, "k": "x^2", "vars": ["x", " "]}`, `1`, `field "vars": entry 2 is an empty name`},
		{`{"id": 1, "k": "x^2", "vars": 3}`, `1`, `field "vars": want a string`},
		{`{"k": "x^2", "prior": ["x=1"], "id": "late"}`, `"late"`, `field "prior": want a string`},
	}
	for _, tt := range tests {
		rec, err := DecodeRecord([]byte(tt.in))
		if err == nil {
			t.Errorf("%s: no error", tt.in)
			continue
		}
		if !errors.Is(err, ErrRecord) {
			t.Errorf("%s: error %v does not wrap ErrRecord", tt.in, err)
		}
		if !strings.Contains(err.Error(), tt.want) {
			t.Errorf("%s: error %q lacks %q", tt.in, err, tt.want)
		}
		if string(rec.ID) != tt.id {
			t.Errorf("%s: id %q, want %q", tt.in, rec.ID, tt.id)
		}
	}
}

func TestRecordMarshalRoundTrip(t *testing.T) {
	tests := []Record{
		{ID: json.RawMessage(`12345678901234567890123`), Spec: Spec{K: "x^4+y^6"}},
		{Spec: Spec{SOS: []string{"b1*a1", "b1*a2"}, Prior: "a1=1", At: []string{"a1=0", "a2=1"}, Order: 3, Vars: []string{"a1", "a2", "b1"}}},
		{ID: json.RawMessage(`"a<b&c"`), Spec: Spec{K: "x<y"}},
	}
	for _, rec := range tests {
		// An Encoder without HTML escaping, as the batch command uses;
		// json.Marshal would escape < in the output of MarshalJSON again.
		var buf bytes.Buffer
		enc := json.NewEncoder(&buf)
		enc.SetEscapeHTML(false)
		if err := enc.Encode(rec); err != nil {
			t.Fatal(err)
		}
		b := bytes.TrimSpace(buf.Bytes())
		back, err := DecodeRecord(b)
		if err != nil {
			t.Fatalf("%s: %v", b, err)
		}
		if !reflect.DeepEqual(back, rec) {
			t.Errorf("%s: decoded %+v, want %+v", b, back, rec)
		}
		if bytes.Contains(b, []byte(`\u003c`)) {
			t.Errorf("%s: < was escaped", b)
		}
	}
	if _, err := json.Marshal(Record{ID: json.RawMessage(`{bad`), Spec: Spec{K: "x"}}); err == nil {
		t.Error("an invalid ID marshalled without error")
	}
}

// FuzzDecodeRecord checks that any line gives either a record or an error
// wrapping ErrRecord, never a panic; that a known id is the input's own
// text; and that a decoded record survives MarshalJSON and decoding again.
func FuzzDecodeRecord(f *testing.F) {
	for _, s := range []string{
		`{"id": 1, "k": "x^4+y^6"}`,
		`{"id":12345678901234567890123,"sos":["x*y","z"],"prior":"x=1","at":["x=0","x=1"],"order":3,"vars":"x,y,z"}`,
		`{"id": [1, {"a": null}], "sos": "a*b; a*c", "vars": ["a", "b", "c"]}`,
		`{"id": 1, "k": "x^2", "nonsense": 3}`,
		`{"id": 1, "k": "x^2", "k": "y"}`,
		`{"k": "x^2"} trailing`,
		`[1, 2]`,
		``,
		`{"k": "\ud800"}`,
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		rec, err := DecodeRecord(data)
		if rec.ID != nil && !bytes.Contains(data, rec.ID) {
			t.Fatalf("id %q is not part of the input %q", rec.ID, data)
		}
		if err != nil {
			if !errors.Is(err, ErrRecord) {
				t.Fatalf("error %v does not wrap ErrRecord", err)
			}
			return
		}
		if (rec.Spec.K == "") == (len(rec.Spec.SOS) == 0) {
			t.Fatalf("record without exactly one of k and sos: %+v", rec.Spec)
		}
		b, err := json.Marshal(rec)
		if err != nil {
			t.Fatalf("marshal %+v: %v", rec, err)
		}
		back, err := DecodeRecord(b)
		if err != nil {
			t.Fatalf("re-decoding %s: %v", b, err)
		}
		if !bytes.Equal(compactJSON(t, back.ID), compactJSON(t, rec.ID)) || !reflect.DeepEqual(back.Spec, rec.Spec) {
			t.Fatalf("round trip changed %+v into %+v", rec, back)
		}
	})
}

func compactJSON(t *testing.T, b []byte) []byte {
	if b == nil {
		return nil
	}
	var out bytes.Buffer
	if err := json.Compact(&out, b); err != nil {
		t.Fatalf("invalid JSON %q: %v", b, err)
	}
	return out.Bytes()
}

func ExampleDecodeRecord() {
	rec, err := DecodeRecord([]byte(`{"id": 12345678901234567890123, "sos": ["b1*a1", "b1*a2"], "prior": "a1=1"}`))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(string(rec.ID), rec.Spec.SOS, rec.Spec.Prior)

	_, err = DecodeRecord([]byte(`{"id": 8, "k": "x^2", "weight": 2}`))
	fmt.Println(err)
	// Output:
	// 12345678901234567890123 [b1*a1 b1*a2] a1=1
	// rlct: bad record: unknown field "weight" (known: id, k, sos, prior, at, order, vars, model)
}
