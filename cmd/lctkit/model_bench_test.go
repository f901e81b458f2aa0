package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math/big"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/model"
)

// modelBatch returns n batch records with model descriptions of mixed
// families (reduced-rank regression, one-unit tanh regression on a design,
// discrete coins, Poisson and binomial mixtures, latent class models; fixed
// seed), and the same problems as ready-made K: the generators the
// descriptions build, with the order and the truths, as "sos" records.
func modelBatch(tb testing.TB, n int) (descriptions, ready []byte) {
	rng := rand.New(rand.NewPCG(3, 5))
	var desc, made bytes.Buffer
	for i := range n {
		var d *model.Description
		var err error
		switch i % 6 {
		case 0:
			d, err = model.ReducedRank(1+rng.IntN(3), 1+rng.IntN(3), 1+rng.IntN(2), 0)
		case 1:
			x := big.NewRat(int64(1+rng.IntN(5)), int64(1+rng.IntN(3)))
			d, err = model.Parse(fmt.Sprintf("model tanh %d\nkind regression\nparam a, b\ninput x ~ design { -1: 1/2, %s: 1/2 }\nnoise 1\nmean a*tanh(b*x)\norder 4\n", i, x.RatString()))
		case 2:
			q := big.NewRat(int64(1+rng.IntN(4)), 5)
			d, err = model.Parse(fmt.Sprintf("model coin %d\nkind discrete\nparam a, b, c\ncategory h = %s + a*b + c^2\ncategory t = 1 - %s - a*b - c^2\n", i, q.RatString(), q.RatString()))
		case 3:
			d, err = model.PoissonMixture(big.NewRat(int64(1+rng.IntN(5)), 1), big.NewRat(int64(rng.IntN(3)), 2), 4)
		case 4:
			d, err = model.BinomialMixture(1+rng.IntN(3), big.NewRat(int64(1+rng.IntN(3)), 4), big.NewRat(int64(rng.IntN(3)), 2))
		case 5:
			d, err = model.LatentClass(2, 2, big.NewRat(int64(1+rng.IntN(3)), 4))
		}
		if err != nil {
			tb.Fatal(err)
		}
		line, _ := json.Marshal(map[string]any{"id": i, "model": d.String()})
		desc.Write(line)
		desc.WriteByte('\n')

		m, err := model.Build(context.Background(), d, nil)
		if err != nil {
			tb.Fatal(err)
		}
		rec := rlct.Record{ID: json.RawMessage(fmt.Sprint(i))}
		for _, g := range m.Problem.Generators {
			rec.Spec.SOS = append(rec.Spec.SOS, g.String())
		}
		rec.Spec.Order = m.Problem.Order
		for _, p := range m.Problem.Points {
			var parts []string
			for k, v := range m.Vars() {
				parts = append(parts, v+"="+p[k].RatString())
			}
			rec.Spec.At = append(rec.Spec.At, strings.Join(parts, ","))
		}
		line, err = json.Marshal(rec)
		if err != nil {
			tb.Fatal(err)
		}
		made.Write(line)
		made.WriteByte('\n')
	}
	return desc.Bytes(), made.Bytes()
}

// BenchmarkBatchModels runs `lctkit batch --brief` over 1,000 model
// descriptions of mixed families and over the same problems given as
// ready-made K (the generators), and reports records per second; the
// target is a rate for descriptions within a factor 2 of ready-made K.
//
//	go test ./cmd/lctkit -run '^$' -bench BatchModels -benchtime 5x
func BenchmarkBatchModels(b *testing.B) {
	desc, made := modelBatch(b, 1000)
	for _, c := range []struct {
		name  string
		input []byte
	}{{"input=descriptions", desc}, {"input=ready-made", made}} {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				var errOut bytes.Buffer
				e := &env{stdin: bytes.NewReader(c.input), stdout: io.Discard, stderr: &errOut}
				if code := run([]string{"batch", "--brief"}, e); code != exitOK {
					b.Fatalf("exit %d: %s", code, errOut.String())
				}
			}
			b.ReportMetric(1000*float64(b.N)/b.Elapsed().Seconds(), "records/s")
		})
	}
}

// TestModelBatchInput checks that the two inputs of BenchmarkBatchModels
// pose the same problems: every record answers with the same λ and θ.
// A ready-made K is the built series written as an exact polynomial, so a
// change of coordinates (which changes exact polynomials only, or solves
// them exactly) may improve it where the truncated description stays:
// both answers are then bounds of different problems. So both runs use
// --no-changes, and the Newton values of the two inputs compare.
func TestModelBatchInput(t *testing.T) {
	desc, made := modelBatch(t, 60)
	out1, e1, c1 := runCLI(t, string(desc), "batch", "--brief", "--no-changes", "-")
	out2, e2, c2 := runCLI(t, string(made), "batch", "--brief", "--no-changes", "-")
	if c1 != exitOK || c2 != exitOK {
		t.Fatalf("exit %d, %d: %s %s", c1, c2, e1, e2)
	}
	r1, r2 := strings.Split(out1, "\n"), strings.Split(out2, "\n")
	for i := range r1 {
		if r1[i] == "" {
			continue
		}
		var a, b struct {
			Lambda    string `json:"lambda"`
			Theta     int    `json:"theta"`
			Reduction any    `json:"reduction"`
			Repair    any    `json:"repair"`
		}
		if err := json.Unmarshal([]byte(r1[i]), &a); err != nil {
			t.Fatal(err)
		}
		if err := json.Unmarshal([]byte(r2[i]), &b); err != nil {
			t.Fatal(err)
		}
		if a.Reduction != nil || a.Repair != nil || b.Reduction != nil || b.Repair != nil {
			t.Errorf("record %d: a change of coordinates despite --no-changes", i+1)
		}
		if a != b {
			t.Errorf("record %d: description (%s, %d), ready-made (%s, %d)", i+1, a.Lambda, a.Theta, b.Lambda, b.Theta)
		}
	}
}
