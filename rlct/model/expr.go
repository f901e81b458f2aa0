package model

import (
	"math/big"
	"strconv"
	"strings"

	"github.com/lctkit/lctkit/monomial"
)

// expr reads an expression.
//
//	Expr = Term { ( "+" | "-" ) Term } .
func (p *parser) expr() *node {
	x := p.term()
	for p.tok.kind == tPlus || p.tok.kind == tMinus {
		op := opAdd
		if p.tok.kind == tMinus {
			op = opSub
		}
		at := p.tok.off
		p.next()
		x = &node{op: op, pos: at, args: []*node{x, p.term()}}
	}
	return x
}

// term reads a product or quotient.
//
//	Term = Unary { ( "*" | "/" ) Unary } .
func (p *parser) term() *node {
	x := p.unary()
	for p.tok.kind == tStar || p.tok.kind == tSlash {
		op := opMul
		if p.tok.kind == tSlash {
			op = opDiv
		}
		at := p.tok.off
		p.next()
		x = &node{op: op, pos: at, args: []*node{x, p.unary()}}
	}
	return x
}

// enter counts one level of nesting and fails beyond maxNesting.
func (p *parser) enter() {
	p.depth++
	if p.depth > maxNesting {
		p.fail(p.tok.off, "the expression is nested more than %d levels deep", maxNesting)
	}
}

// unary reads a signed value.
//
//	Unary = ( "+" | "-" ) Unary | Power .
func (p *parser) unary() *node {
	p.enter()
	defer func() { p.depth-- }()
	switch p.tok.kind {
	case tPlus:
		p.next()
		return p.unary()
	case tMinus:
		at := p.tok.off
		p.next()
		return &node{op: opNeg, pos: at, args: []*node{p.unary()}}
	}
	return p.power()
}

// power reads a power; it is right-associative and binds tighter than a
// sign, as in the expression language (-x^2 = -(x^2), 2^-1 = 1/2).
//
//	Power = Postfix [ ( "^" | "**" ) Unary ] .
func (p *parser) power() *node {
	x := p.postfix()
	if p.tok.kind == tPow {
		at := p.tok.off
		p.next()
		x = &node{op: opPow, pos: at, args: []*node{x, p.unary()}}
	}
	return x
}

// postfix reads transposes and indices.
//
//	Postfix = Primary { "'" | "[" integer [ "," integer ] "]" } .
func (p *parser) postfix() *node {
	x := p.primary()
	for {
		switch p.tok.kind {
		case tQuote:
			x = &node{op: opTranspose, pos: p.tok.off, args: []*node{x}}
			p.next()
			continue
		case tLBrack:
			at := p.tok.off
			p.next()
			n := &node{op: opIndex, pos: at, args: []*node{x}}
			n.i = p.integer("an index", 1, maxShape)
			if p.tok.kind == tComma {
				p.next()
				n.j = p.integer("an index", 1, maxShape)
			}
			p.expect(tRBrack, "',' or ']'")
			x = n
			continue
		}
		return x
	}
}

// primary reads a number, a name, a call or a parenthesized expression.
//
//	Primary = number | identifier | function "(" Expr ")" | "sum" "(" Expr ")"
//	        | "(" Expr ")" | Matrix .
func (p *parser) primary() *node {
	at := p.tok.off
	switch p.tok.kind {
	case tNumber:
		text := p.text()
		if _, err := monomial.ParseRat(text); err != nil {
			p.fail(at, "%s", strings.TrimPrefix(err.Error(), "1:1: "))
		}
		p.next()
		return &node{op: opNum, pos: at, text: text}
	case tIdent:
		name := p.text()
		p.next()
		if isFunction(name) {
			if p.tok.kind != tLParen {
				p.fail(p.tok.off, "expected '(' after %s, found %s", name, p.found())
			}
			p.next()
			arg := p.expr()
			p.expect(tRParen, "')'")
			op := opCall
			if name == "sum" {
				op = opSum
			}
			return &node{op: op, pos: at, text: name, args: []*node{arg}}
		}
		return &node{op: opIdent, pos: at, text: name}
	case tLParen:
		p.enter()
		defer func() { p.depth-- }()
		p.next()
		x := p.expr()
		p.expect(tRParen, "')'")
		return &node{op: opParen, pos: at, args: []*node{x}}
	case tLBrack:
		p.enter()
		defer func() { p.depth-- }()
		return p.matrix()
	}
	p.fail(at, "expected an operand, found %s", p.found())
	return nil
}

// matrix reads a matrix of scalar expressions, rows separated by ';'.
//
//	Matrix = "[" Expr { ( "," | ";" ) Expr } "]" .
func (p *parser) matrix() *node {
	n := &node{op: opMatrix, pos: p.tok.off}
	p.next()
	cols := 0
	for {
		n.args = append(n.args, p.expr())
		cols++
		switch p.tok.kind {
		case tComma:
			p.next()
			continue
		case tSemi, tRBrack:
			if n.i > 0 && cols != n.j {
				p.fail(p.tok.off, "this row has %d entries, and the first has %d", cols, n.j)
			}
			n.i, n.j, cols = n.i+1, cols, 0
			if p.tok.kind == tSemi {
				p.next()
				continue
			}
			p.next()
			return n
		}
		p.fail(p.tok.off, "expected ',', ';' or ']', found %s", p.found())
	}
}

// precedence of a node when printed: higher binds tighter.
func (n *node) precedence() int {
	switch n.op {
	case opAdd, opSub:
		return 1
	case opMul, opDiv:
		return 2
	case opNeg:
		return 3
	case opPow:
		return 4
	}
	return 5
}

// print writes the expression with the parentheses its structure needs
// (redundant ones are dropped); numbers keep their text.
func (n *node) print(b *strings.Builder) {
	wrap := func(x *node, need bool) {
		if need {
			b.WriteByte('(')
			x.print(b)
			b.WriteByte(')')
		} else {
			x.print(b)
		}
	}
	switch n.op {
	case opNum, opIdent:
		b.WriteString(n.text)
	case opCall, opSum:
		b.WriteString(n.text + "(")
		n.args[0].print(b)
		b.WriteByte(')')
	case opParen:
		n.args[0].print(b)
	case opNeg:
		b.WriteByte('-')
		wrap(n.args[0], n.args[0].unwrap().precedence() < 4)
	case opAdd, opSub, opMul, opDiv:
		l, r := n.args[0].unwrap(), n.args[1].unwrap()
		wrap(l, l.precedence() < n.precedence() || l.op == opNeg && n.precedence() > 1)
		b.WriteString(map[nodeOp]string{opAdd: " + ", opSub: " - ", opMul: "*", opDiv: "/"}[n.op])
		wrap(r, r.precedence() <= n.precedence() || r.op == opNeg)
	case opPow:
		l, r := n.args[0].unwrap(), n.args[1].unwrap()
		wrap(l, l.precedence() <= 4)
		b.WriteByte('^')
		wrap(r, r.precedence() < 4)
	case opIndex:
		x := n.args[0].unwrap()
		wrap(x, x.precedence() < 5)
		b.WriteString("[" + strconv.Itoa(n.i))
		if n.j > 0 {
			b.WriteString("," + strconv.Itoa(n.j))
		}
		b.WriteByte(']')
	case opTranspose:
		x := n.args[0].unwrap()
		wrap(x, x.precedence() < 5)
		b.WriteByte('\'')
	case opMatrix:
		b.WriteByte('[')
		for k, x := range n.args {
			switch {
			case k == 0:
			case k%n.j == 0:
				b.WriteString("; ")
			default:
				b.WriteString(", ")
			}
			x.print(b)
		}
		b.WriteByte(']')
	}
}

// isFunction reports whether an identifier token names a function: one of
// the expression language (an identifier that it does not accept as a
// variable) or sum.
func isFunction(name string) bool { return name == "sum" || !monomial.IsIdentifier(name) }

// start returns the offset where the expression's text begins.
func (n *node) start() int {
	switch n.op {
	case opAdd, opSub, opMul, opDiv, opPow, opIndex, opTranspose:
		return n.args[0].start()
	}
	return n.pos
}

// unwrap returns the node inside written parentheses.
func (n *node) unwrap() *node {
	for n.op == opParen {
		n = n.args[0]
	}
	return n
}

// ratText writes a rational as an operand of the expression language.
func ratText(r *big.Rat) string {
	if r.Sign() >= 0 && r.IsInt() {
		return r.RatString()
	}
	return "(" + r.RatString() + ")"
}
