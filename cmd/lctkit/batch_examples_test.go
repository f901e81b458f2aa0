package main

import (
	"encoding/json"
	"math/big"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// lowRankExampleArgs is the command line of examples/lowrank (its README
// shows the same).
var lowRankExampleArgs = []string{"batch", "--brief", "../../examples/lowrank/input.jsonl"}

// TestBatchLowRankExample runs `lctkit batch` on examples/lowrank and
// compares with the golden file (rewrite it with -update). The golden file
// is only a regression record; the mathematics is checked independently
// below against the closed form of Aoyagi & Watanabe 2005.
func TestBatchLowRankExample(t *testing.T) {
	dir := "../../examples/lowrank"
	input, err := os.ReadFile(filepath.Join(dir, "input.jsonl"))
	if err != nil {
		t.Fatal(err)
	}
	out, errOut, code := runCLI(t, "", lowRankExampleArgs...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	checkGolden(t, filepath.Join(dir, "expected.jsonl"), out)

	inLines := strings.Split(strings.TrimSuffix(string(input), "\n"), "\n")
	recs := parseBatch(t, out)
	if len(recs) != len(inLines) {
		t.Fatalf("%d records for %d input lines", len(recs), len(inLines))
	}
	var rank1, exactHigher, strict int
	for i, r := range recs {
		var shape lowRankShape
		if err := json.Unmarshal(r.ID, &shape); err != nil || shape.N != i+1 || r.Line != i+1 {
			t.Fatalf("record %d: id %s, line %d", i+1, r.ID, r.Line)
		}
		m, n, h := shape.Soil, shape.Crops, shape.Factors
		if r.Error != "" {
			t.Errorf("record %d (M=%d N=%d H=%d): %s", i+1, m, n, h, r.Error)
			continue
		}
		got, ok := new(big.Rat).SetString(r.Lambda)
		if !ok {
			t.Fatalf("record %d: λ %q", i+1, r.Lambda)
		}
		// Aoyagi & Watanabe 2005, Neural Networks 18, main theorem, with
		// true rank r = 0 (formula from memory; see reducedRankLambda).
		lambda, theta := reducedRankLambda(m, n, h, 0)
		if h == 1 {
			// By hand: K = (Σ_i d_i²b_i²)(Σ_j e_j²a_j²), a product of two
			// positive definite forms in N and M variables, so λ = min(N, M)/2,
			// with θ = 2 when N = M (both factors tie) and 1 otherwise
			// (Watanabe 2009, Algebraic Geometry and Statistical Learning
			// Theory, ch. 2, normal crossings after polar coordinates; from
			// memory). Every face part is a single monomial, so the Newton
			// value is certified exact.
			byHand := big.NewRat(int64(min(m, n)), 2)
			handTheta := 1
			if m == n {
				handTheta = 2
			}
			if byHand.Cmp(lambda) != 0 || handTheta != theta {
				t.Fatalf("M=%d N=%d: the two closed forms disagree: %s,%d vs %s,%d", m, n, byHand.RatString(), handTheta, lambda.RatString(), theta)
			}
			if got.Cmp(byHand) != 0 || r.Theta != handTheta || r.Status != "exact" {
				t.Errorf("record %d (M=%d N=%d H=1): λ %s θ %d %s, want %s θ %d exact", i+1, m, n, r.Lambda, r.Theta, r.Status, byHand.RatString(), handTheta)
			}
			rank1++
			continue
		}
		// H ≥ 2: the Newton value bounds (λ, θ) from above: a larger λ, or the
		// same λ with a smaller or equal θ; exact only when it equals the truth.
		switch c := got.Cmp(lambda); {
		case c < 0 || (c == 0 && r.Theta > theta):
			t.Errorf("record %d (M=%d N=%d H=%d): Newton value (%s, %d) is below the true (%s, %d)", i+1, m, n, h, r.Lambda, r.Theta, lambda.RatString(), theta)
		case r.Status == "exact" && (c != 0 || r.Theta != theta):
			t.Errorf("record %d (M=%d N=%d H=%d): claimed exact (%s, %d), true (%s, %d)", i+1, m, n, h, r.Lambda, r.Theta, lambda.RatString(), theta)
		case r.Status == "exact":
			exactHigher++
		case c > 0:
			strict++
		}
	}
	if rank1 == 0 || strict == 0 {
		t.Errorf("the example lost its variety: %d records with H = 1, %d strict bounds", rank1, strict)
	}
	t.Logf("%d records: %d with H = 1 (exact, checked against min(M,N)/2), %d with H ≥ 2 certified exact, %d strict upper bounds", len(recs), rank1, exactHigher, strict)
}
