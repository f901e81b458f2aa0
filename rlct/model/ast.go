package model

import (
	"math/big"
	"strconv"
	"strings"
)

// Kind is the kind of a model: what K is built from.
type Kind string

// The kinds of model a description can declare.
const (
	// Regression: y = f(x; w) + Gaussian noise of known variance σ²,
	// K(w) = E_x‖f(x; w) − f(x; w*)‖²/(2σ²).
	Regression Kind = "regression"
	// Discrete: category probabilities p_k(w), optionally given a discrete
	// input; K is replaced by the comparable Σ_k (p_k(w) − q_k)²/(2q_k).
	Discrete Kind = "discrete"
	// Mixture: a mixture of distributions from one exponential family
	// (Poisson, binomial, Bernoulli) with weights given as expressions.
	Mixture Kind = "mixture"
)

// maxShape bounds the rows and columns of a parameter or input, so that a
// short description cannot declare a gigantic matrix.
const maxShape = 1000

// shape is the shape of a parameter, an input or a value: rows × cols.
// vector marks a declaration written with one index (v[n]), an n×1 column.
type shape struct {
	rows, cols int
	vector     bool
}

func (s shape) String() string {
	if s.rows == 1 && s.cols == 1 {
		return "scalar"
	}
	return strconv.Itoa(s.rows) + "×" + strconv.Itoa(s.cols)
}

// size is the number of entries.
func (s shape) size() int { return s.rows * s.cols }

// decl declares a name with a shape: "B[3,2]", "v[4]" or "a".
type decl struct {
	name  string
	pos   int
	shape shape
}

func (d *decl) print(b *strings.Builder) {
	b.WriteString(d.name)
	switch {
	case d.shape.vector:
		b.WriteString("[" + strconv.Itoa(d.shape.rows) + "]")
	case d.shape.rows != 1 || d.shape.cols != 1:
		b.WriteString("[" + strconv.Itoa(d.shape.rows) + "," + strconv.Itoa(d.shape.cols) + "]")
	}
}

// entryName is the variable name of entry (i, j) (0-based) of a declared
// name: a for a scalar, v_3 for a vector, B_2_1 for a matrix (1-based in
// the name).
func (d *decl) entryName(i, j int) string {
	switch {
	case d.shape.vector:
		return d.name + "_" + strconv.Itoa(i+1)
	case d.shape.rows == 1 && d.shape.cols == 1:
		return d.name
	}
	return d.name + "_" + strconv.Itoa(i+1) + "_" + strconv.Itoa(j+1)
}

// entryLabel is entry (i, j) as the description writes it: a, v[3], B[2,1].
func (d *decl) entryLabel(i, j int) string {
	switch {
	case d.shape.vector:
		return d.name + "[" + strconv.Itoa(i+1) + "]"
	case d.shape.rows == 1 && d.shape.cols == 1:
		return d.name
	}
	return d.name + "[" + strconv.Itoa(i+1) + "," + strconv.Itoa(j+1) + "]"
}

// param is one parameter with its prior exponent h (prior ∝ |w|^h near the
// truth, for each entry).
type param struct {
	decl
	prior *big.Rat
}

// lawKind is the kind of an input's law.
type lawKind int

const (
	lawNormal lawKind = iota
	lawUniform
	lawDesign
	lawMoments
)

// law is the distribution of an input: independent normal or uniform
// coordinates, or a joint finite design or moment table.
type law struct {
	kind lawKind
	pos  int
	// a, b: mean and variance (normal), or the interval (uniform).
	a, b *big.Rat
	// points and weights (design), or exponents and values (moments:
	// E[x^points[k]] = weights[k], points holding integer exponents).
	points  [][]*big.Rat
	weights []*big.Rat
	// pointPos are the offsets of the points, for messages.
	pointPos []int
}

// input is an input variable with its law.
type input struct {
	decl
	law law
}

// binding sets a parameter to a value in a truth statement: a number for
// every entry, or a row-major list of rows.
type binding struct {
	name  string
	pos   int
	rows  [][]*big.Rat // nil when scalar is set
	one   *big.Rat     // a single number for every entry
	shape shape        // of rows as written (rows×cols)
}

// truth is one true parameter.
type truth struct {
	pos      int
	bindings []binding
}

// component is one component of a mixture: a family with its parameters
// and a weight.
type component struct {
	pos    int    // offset of the family name
	family string // "poisson", "binomial" or "bernoulli"
	trials int    // binomial n (1 for bernoulli)
	arg    *node  // the Poisson mean or the success probability
	weight *node  // the mixing weight
}

// category is one category (or a vector of them) of a discrete model.
type category struct {
	name string
	pos  int
	expr *node
}

// nodeOp is the operation of an expression node.
type nodeOp int

const (
	opNum nodeOp = iota
	opIdent
	opCall // a function of the expression language, elementwise
	opSum  // sum(E): the sum of the entries
	opNeg
	opAdd
	opSub
	opMul
	opDiv
	opPow
	opIndex
	opTranspose
	opParen  // parentheses as written, kept for printing
	opMatrix // [a, b; c, d]: args row by row, i rows and j columns
)

// node is an expression of a description.
type node struct {
	op   nodeOp
	pos  int    // offset of the token that starts (or, for operators, is) the node
	text string // number text, identifier or function name
	args []*node
	i, j int // 1-based indices of opIndex; j = 0 for one index
}
