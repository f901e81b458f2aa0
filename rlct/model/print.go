package model

import (
	"math/big"
	"strconv"
	"strings"
)

// textStmt is a keyword followed by text: model, kind, order, noise.
type textStmt struct{ keyword, text string }

func (s textStmt) print(b *strings.Builder) { b.WriteString(s.keyword + " " + s.text) }

// exprStmt is a keyword followed by an expression: mean.
type exprStmt struct {
	keyword string
	expr    *node
}

func (s exprStmt) print(b *strings.Builder) {
	b.WriteString(s.keyword + " ")
	s.expr.print(b)
}

// paramStmt is one param statement.
type paramStmt []*param

func (s paramStmt) print(b *strings.Builder) {
	b.WriteString("param ")
	for i, p := range s {
		if i > 0 {
			b.WriteString(", ")
		}
		p.decl.print(b)
	}
	if s[0].prior.Sign() != 0 {
		b.WriteString(" prior " + s[0].prior.RatString())
	}
}

func (t *truth) print(b *strings.Builder) {
	b.WriteString("truth")
	for i, x := range t.bindings {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString(" " + x.name + " = ")
		if x.one != nil {
			b.WriteString(x.one.RatString())
			continue
		}
		b.WriteByte('[')
		for r, row := range x.rows {
			if r > 0 {
				b.WriteString("; ")
			}
			b.WriteString(ratJoin(row, ", "))
		}
		b.WriteByte(']')
	}
}

func (in *input) print(b *strings.Builder) {
	b.WriteString("input ")
	in.decl.print(b)
	b.WriteString(" ~ ")
	l := &in.law
	switch l.kind {
	case lawNormal:
		b.WriteString("normal")
		if l.a.Sign() != 0 || l.b.Cmp(big.NewRat(1, 1)) != 0 {
			b.WriteString("(" + l.a.RatString() + ", " + l.b.RatString() + ")")
		}
	case lawUniform:
		b.WriteString("uniform(" + l.a.RatString() + ", " + l.b.RatString() + ")")
	case lawDesign, lawMoments:
		if l.kind == lawDesign {
			b.WriteString("design {")
		} else {
			b.WriteString("moments {")
		}
		for k, pt := range l.points {
			if k > 0 {
				b.WriteByte(',')
			}
			b.WriteByte(' ')
			if len(pt) == 1 && !in.shape.vector {
				b.WriteString(pt[0].RatString())
			} else {
				b.WriteString("(" + ratJoin(pt, ", ") + ")")
			}
			b.WriteString(": " + l.weights[k].RatString())
		}
		b.WriteString(" }")
	}
}

func (c *category) print(b *strings.Builder) {
	b.WriteString("category " + c.name + " = ")
	c.expr.print(b)
}

func (c *component) print(b *strings.Builder) {
	b.WriteString("component " + c.family + "(")
	if c.family == "binomial" {
		b.WriteString(strconv.Itoa(c.trials) + ", ")
	}
	c.arg.print(b)
	b.WriteString(") weight ")
	c.weight.print(b)
}

// ratJoin writes rationals in lowest terms separated by sep.
func ratJoin(xs []*big.Rat, sep string) string {
	parts := make([]string, len(xs))
	for i, x := range xs {
		parts[i] = x.RatString()
	}
	return strings.Join(parts, sep)
}
