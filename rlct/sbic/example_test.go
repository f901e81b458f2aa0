package sbic_test

import (
	"context"
	"encoding/json"
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/sbic"
)

// Three nested models (invented numbers): a chain none ⪯ one ⪯ two, where
// the middle pair is only an upper bound with a published estimate beside
// it.
func ExampleCandidates_Choose() {
	models := []sbic.Model{{Name: "none", Dim: 0}, {Name: "one", Dim: 3}, {Name: "two", Dim: 5}}
	order := [][2]int{{0, 1}, {1, 2}}
	pairs := []sbic.Pair{
		{Model: 0, Truth: 0, Lambda: big.NewRat(0, 1), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 1, Lambda: big.NewRat(3, 2), Theta: 1, Status: rlct.Exact},
		{Model: 2, Truth: 2, Lambda: big.NewRat(5, 2), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 0, Lambda: big.NewRat(1, 2), Theta: 1, Status: rlct.Exact},
		{Model: 2, Truth: 0, Lambda: big.NewRat(1, 1), Theta: 1, Status: rlct.Exact},
		{Model: 2, Truth: 1, Lambda: big.NewRat(2, 1), Theta: 1, Status: rlct.UpperBound,
			Estimate: &sbic.Value{Lambda: big.NewRat(7, 4), Theta: 2}},
	}
	c, err := sbic.New(models, order, pairs)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := c.Choose(200, []float64{-310.2, -301.9, -299.1})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, m := range r.Models {
		fmt.Printf("%-4s BIC %9.4f  sBIC %9.4f  weight %.3f  (%s)\n", m.Name, m.BIC, m.SBIC, m.WeightSBIC, m.Status)
	}
	fmt.Println("BIC chooses", r.Models[r.BIC.Model].Name, "and sBIC chooses", r.Models[r.SBIC.Model].Name)
	s := r.Sensitivity[0]
	fmt.Printf("with %s regular: sBIC chooses %s; with the estimate: %s\n",
		c.PairName(pairs[s.Pair]), r.Models[s.Regular.Choice.Model].Name, r.Models[s.Estimate.Choice.Model].Name)
	// Output:
	// none BIC -310.2000  sBIC -310.2000  weight 0.033  (exact)
	// one  BIC -309.8475  sBIC -307.3621  weight 0.568  (exact)
	// two  BIC -312.3458  sBIC -307.7160  weight 0.399  (upper-bound)
	// BIC chooses one and sBIC chooses one
	// with "two" at "one" regular: sBIC chooses one; with the estimate: two
}

// A research loop: the candidates are validated once and scored on many
// data sets with plain numbers.
func ExampleCandidates_Scores() {
	models := []sbic.Model{{Name: "rank0", Dim: 0}, {Name: "rank1", Dim: 7}}
	var pairs []sbic.Pair
	for h := range 2 {
		for r := 0; r <= h; r++ {
			v, _ := sbic.ReducedRank(3, 5, h, r) // Aoyagi & Watanabe 2005, from memory
			pairs = append(pairs, sbic.Pair{Model: h, Truth: r, Lambda: v.Lambda, Theta: v.Theta, Status: rlct.Exact})
		}
	}
	c, err := sbic.New(models, [][2]int{{0, 1}}, pairs)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, ll := range [][]float64{{-700, -690}, {-700, -699}} {
		s, _ := c.Scores(100, ll)
		fmt.Printf("%.4f %.4f\n", s[0], s[1])
	}
	// Output:
	// -700.0000 -698.5600
	// -700.0000 -705.9105
}

// The learning coefficients of reduced rank regression with 3 inputs and 5
// outputs, rank H at a truth of rank r.
func ExampleReducedRank() {
	for h := 0; h <= 3; h++ {
		for r := 0; r <= h; r++ {
			v, _ := sbic.ReducedRank(3, 5, h, r)
			fmt.Printf("H=%d r=%d: %v\n", h, r, v)
		}
	}
	// Output:
	// H=0 r=0: λ = 0, θ = 1
	// H=1 r=0: λ = 3/2, θ = 1
	// H=1 r=1: λ = 7/2, θ = 1
	// H=2 r=0: λ = 3, θ = 1
	// H=2 r=1: λ = 9/2, θ = 1
	// H=2 r=2: λ = 6, θ = 1
	// H=3 r=0: λ = 9/2, θ = 2
	// H=3 r=1: λ = 11/2, θ = 1
	// H=3 r=2: λ = 13/2, θ = 1
	// H=3 r=3: λ = 15/2, θ = 1
}

// A table in the text form, with one pair bounded by lctkit.
func ExampleReadTable() {
	src := `n 400
model flat  dim 1 loglik -512.0
model bent  dim 3 loglik -506.5
order flat <= bent
pair flat flat regular status exact
pair bent bent regular status exact
pair bent flat sos "s*g1; s*g2"   # K = s²(g1² + g2²)
`
	tab, err := sbic.ReadTable([]byte(src))
	if err != nil {
		fmt.Println(err)
		return
	}
	c, logLik, _, err := tab.Candidates(context.Background(), nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, _ := c.Choose(tab.N, logLik)
	for _, p := range c.Pairs() {
		fmt.Printf("%s: λ = %s, θ = %d, %s\n", c.PairName(p), p.Lambda.RatString(), p.Theta, p.Status)
	}
	for _, m := range r.Models {
		fmt.Printf("%s: BIC %.4f, sBIC %.4f\n", m.Name, m.BIC, m.SBIC)
	}
	// Output:
	// "flat" at "flat": λ = 1/2, θ = 1, exact
	// "bent" at "bent": λ = 3/2, θ = 1, exact
	// "bent" at "flat": λ = 1/2, θ = 1, exact
	// flat: BIC -514.9957, sBIC -514.9957
	// bent: BIC -515.4872, sBIC -512.2581
}

// A Result is written as JSON with the models and pairs named, as lctkit
// choose --json prints it; exact values are strings.
func ExampleResult_MarshalJSON() {
	models := []sbic.Model{{Name: "none", Dim: 0}, {Name: "one", Dim: 3}}
	pairs := []sbic.Pair{
		{Model: 0, Truth: 0, Lambda: big.NewRat(0, 1), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 1, Lambda: big.NewRat(3, 2), Theta: 1, Status: rlct.Exact},
		{Model: 1, Truth: 0, Lambda: big.NewRat(1, 2), Theta: 1, Status: rlct.Exact},
	}
	c, err := sbic.New(models, [][2]int{{0, 1}}, pairs)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := c.Choose(100, []float64{-150, -140})
	if err != nil {
		fmt.Println(err)
		return
	}
	data, err := json.Marshal(r)
	if err != nil {
		fmt.Println(err)
		return
	}
	var out struct {
		ChosenSBIC struct {
			Model string `json:"model"`
		} `json:"chosen_sbic"`
		Pairs []struct {
			Model  string `json:"model"`
			Truth  string `json:"truth"`
			Lambda string `json:"lambda"`
		} `json:"pairs"`
	}
	if err := json.Unmarshal(data, &out); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println("sBIC chooses", out.ChosenSBIC.Model)
	for _, p := range out.Pairs {
		fmt.Printf("%s at %s: λ = %s\n", p.Model, p.Truth, p.Lambda)
	}
	// Output:
	// sBIC chooses one
	// none at none: λ = 0
	// one at one: λ = 3/2
	// one at none: λ = 1/2
}
