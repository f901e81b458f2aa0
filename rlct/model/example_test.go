package model_test

import (
	"context"
	"errors"
	"fmt"
	"log"
	"math/big"

	"github.com/lctkit/lctkit/rlct/model"
)

// A reduced-rank regression written as a description: B and A are matrix
// parameters, and K comes out as ‖BA‖²/(2σ²), one square per entry of BA.
func ExampleBuild() {
	d, err := model.Parse(`
model rank one, three sensors
kind regression
param B[2,1], A[1,3]
input x[3] ~ normal       # independent standard normal inputs
noise 1/2                 # σ², so that 1/(2σ²) = 1
mean B*A*x
`)
	if err != nil {
		log.Fatal(err)
	}
	m, err := model.Build(context.Background(), d, nil)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println("K =", m)
	r, err := m.Bound(context.Background(), nil)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("λ = %s, θ = %d (%s)\n", r.Lambda.RatString(), r.Theta, r.Status)
	// Output:
	// K = (B_1_1*A_1_1)^2 + (B_1_1*A_1_2)^2 + (B_1_1*A_1_3)^2 + (B_2_1*A_1_1)^2 + (B_2_1*A_1_2)^2 + (B_2_1*A_1_3)^2
	// λ = 1, θ = 1 (exact)
}

// A one-unit tanh regression on a design of three points is a series: the
// generators are expanded to the order, and the remainder (every omitted
// term is a multiple of a·b^5) lets rlct certify the answer.
func ExampleBuild_series() {
	d, err := model.Parse(`
kind regression
param a, b
input x ~ design { -1: 1/4, 1/2: 1/4, 2: 1/2 }
noise 1
mean a*tanh(b*x)
order 4
`)
	if err != nil {
		log.Fatal(err)
	}
	m, err := model.Build(context.Background(), d, nil)
	if err != nil {
		log.Fatal(err)
	}
	for i, g := range m.Problem.Generators {
		fmt.Printf("%s*(%s)^2   %s\n", m.Problem.GeneratorWeights[i].RatString(), g, m.Labels[i])
	}
	fmt.Println("remainder:", m.RemainderStrings())
	r, err := m.Bound(context.Background(), nil)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("λ = %s, θ = %d (%s)\n", r.Lambda.RatString(), r.Theta, r.Status)
	// Output:
	// 1/8*(1/3*a*b^3 - a*b)^2   output 1 at x = -1
	// 1/8*(-1/24*a*b^3 + 1/2*a*b)^2   output 1 at x = 1/2
	// 1/4*(-8/3*a*b^3 + 2*a*b)^2   output 1 at x = 2
	// remainder: [a*b^5]
	// λ = 1/2, θ = 2 (exact)
}

// Errors point at the line and column of the description.
func ExampleParse_error() {
	_, err := model.Parse("kind regression\nparam B[2,2]\ninput x[3] ~ normal\nnoise 1\nmean B*x\n")
	var e *model.Error
	if errors.As(err, &e) {
		fmt.Println(e.Line, e.Col)
	}
	fmt.Println(err)
	// Output:
	// 5 7
	// 5:7: cannot multiply a 2×2 matrix by a 3×1 matrix (the inner sizes 2 and 3 differ)
}

// A discrete model: K replaces the divergence by Σ (p − q)²/(2q).
func ExampleBuild_discrete() {
	d, err := model.Parse(`
kind discrete
param a, b
category heads = 1/3 + a*b
category tails = 2/3 - a*b
`)
	if err != nil {
		log.Fatal(err)
	}
	m, err := model.Build(context.Background(), d, nil)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Println("K =", m)
	// Output:
	// K = 3/2*(a*b)^2 + 3/4*(-a*b)^2
}

// The constructors write descriptions of common families.
func ExamplePoissonMixture() {
	d, err := model.PoissonMixture(big.NewRat(3, 1), big.NewRat(0, 1), 3)
	if err != nil {
		log.Fatal(err)
	}
	fmt.Print(d)
	// Output:
	// model two-component Poisson mixture at a single Poisson law
	// kind mixture
	// param a, m1, m2
	// component poisson(m1) weight a
	// component poisson(m2) weight 1 - a
	// truth a = 0, m1 = 3, m2 = 3
	// order 3
}
