package model

import (
	"sort"
	"strconv"
)

// mark ties a place of generated text to a place of the description: the
// text from byte gen on was generated from the node at byte src.
type mark struct{ gen, src int }

// frag is scalar text in the expression language, generated from a
// description, with the marks that lead each part of it back to the
// description.
type frag struct {
	b     []byte
	marks []mark
	// prec is how tightly the text binds, as in node.precedence: 1 a sum,
	// 2 a product, 3 a sign, 4 a power, 5 an atom (a name, a number, a
	// call or a parenthesized text); it decides where parentheses are
	// needed.
	prec int
}

// emit appends s, generated from the description at src.
func (f *frag) emit(s string, src int) {
	f.marks = append(f.marks, mark{len(f.b), src})
	f.b = append(f.b, s...)
}

// add appends g.
func (f *frag) add(g *frag) {
	base := len(f.b)
	for _, m := range g.marks {
		f.marks = append(f.marks, mark{base + m.gen, m.src})
	}
	f.b = append(f.b, g.b...)
}

// wrapped appends "(" g ")", the parentheses generated at src.
func (f *frag) wrapped(g *frag, src int) {
	f.emit("(", src)
	f.add(g)
	f.emit(")", src)
}

// operand appends g, in parentheses when it binds less tightly than prec
// (or, with strict, no more tightly).
func (f *frag) operand(g *frag, src, prec int, strict bool) {
	if g.prec < prec || strict && g.prec == prec {
		f.wrapped(g, src)
	} else {
		f.add(g)
	}
}

// sourceMap leads offsets of generated text back to the description.
type sourceMap struct{ marks []mark }

// source returns the offset in the description of generated offset off.
func (m *sourceMap) source(off int) int {
	k := sort.Search(len(m.marks), func(i int) bool { return m.marks[i].gen > off })
	if k == 0 {
		if len(m.marks) > 0 {
			return m.marks[0].src
		}
		return 0
	}
	return m.marks[k-1].src
}

// value is the value of an expression: a matrix of scalar texts, row-major
// (nil entries when only shapes are computed).
type value struct {
	shape shape
	e     []*frag
}

// at returns entry (i, j), 0-based.
func (v *value) at(i, j int) *frag { return v.e[i*v.shape.cols+j] }

// evaluator evaluates expressions of a description over an environment.
type evaluator struct {
	src string
	env map[string]*value
	// shapes: compute shapes only (the check of Parse).
	shapes bool
	// budget, when set, is the number of bytes of text the evaluations may
	// still generate (shared by the evaluators of one Build).
	budget *int
}

// maxText bounds the text that the expressions of one description may
// expand to before the expression language reads it (64 MiB).
const maxText = 64 << 20

// charge takes n bytes of generated text from the budget, failing at the
// node when it is spent.
func (ev *evaluator) charge(n *node, bytes int) {
	if ev.shapes || ev.budget == nil {
		return
	}
	*ev.budget -= bytes
	if *ev.budget < 0 {
		ev.fail(n, "the model's expressions expand to more than %d MiB of text; describe a smaller model", maxText>>20)
	}
}

// size is the number of bytes of the entries of v.
func (v *value) size() int {
	n := 0
	for _, f := range v.e {
		n += len(f.b)
	}
	return n
}

// fail reports an error at the node.
func (ev *evaluator) fail(n *node, format string, args ...any) {
	panic(bailout{errorAt(ev.src, n.pos, format, args...)})
}

// run evaluates n, returning an *Error for a name that is not declared or
// shapes that do not fit.
func (ev *evaluator) run(n *node) (v *value, err *Error) {
	defer func() {
		if r := recover(); r != nil {
			b, ok := r.(bailout)
			if !ok {
				panic(r)
			}
			v, err = nil, b.err
		}
	}()
	return ev.eval(n), nil
}

// newValue returns a value of the given shape with fresh entries.
func (ev *evaluator) newValue(s shape) *value {
	v := &value{shape: shape{rows: s.rows, cols: s.cols}}
	if !ev.shapes {
		v.e = make([]*frag, s.size())
		for k := range v.e {
			v.e[k] = &frag{}
		}
	}
	return v
}

// scalar reports whether v is 1×1.
func scalar(v *value) bool { return v.shape.rows == 1 && v.shape.cols == 1 }

func (ev *evaluator) eval(n *node) *value {
	v := ev.eval1(n)
	switch n.op {
	case opParen, opIndex, opTranspose:
		// shares the entries of its operand
	default:
		ev.charge(n, v.size())
	}
	return v
}

func (ev *evaluator) eval1(n *node) *value {
	switch n.op {
	case opNum:
		v := ev.newValue(shape{rows: 1, cols: 1})
		if !ev.shapes {
			v.e[0].emit(n.text, n.pos)
			v.e[0].prec = 5
		}
		return v
	case opIdent:
		x, ok := ev.env[n.text]
		if !ok {
			ev.fail(n, "unknown name %s (declare it with param or input)", n.text)
		}
		if ev.shapes {
			return &value{shape: x.shape}
		}
		v := ev.newValue(x.shape)
		for k, f := range x.e {
			// Re-mark the entry at the name's place.
			v.e[k].emit(string(f.b), n.pos)
			v.e[k].prec = f.prec
		}
		return v
	case opParen:
		return ev.eval(n.args[0])
	case opCall:
		a := ev.eval(n.args[0])
		v := ev.newValue(a.shape)
		for k := range v.e {
			v.e[k].emit(n.text, n.pos)
			v.e[k].wrapped(a.e[k], n.pos)
			v.e[k].prec = 5
		}
		return v
	case opSum:
		a := ev.eval(n.args[0])
		v := ev.newValue(shape{rows: 1, cols: 1})
		if !ev.shapes {
			for k, f := range a.e {
				if k > 0 {
					v.e[0].emit(" + ", n.pos)
				}
				v.e[0].operand(f, n.pos, 1, k > 0)
			}
			v.e[0].prec = 1
		}
		return v
	case opNeg:
		a := ev.eval(n.args[0])
		v := ev.newValue(a.shape)
		for k := range v.e {
			v.e[k].emit("-", n.pos)
			v.e[k].operand(a.e[k], n.pos, 4, false)
			v.e[k].prec = 3
		}
		return v
	case opAdd, opSub:
		a, b := ev.eval(n.args[0]), ev.eval(n.args[1])
		if a.shape.rows != b.shape.rows || a.shape.cols != b.shape.cols {
			verb := map[nodeOp]string{opAdd: "add", opSub: "subtract"}[n.op]
			ev.fail(n, "cannot %s values of shapes %s and %s", verb, a.shape, b.shape)
		}
		sign := map[nodeOp]string{opAdd: " + ", opSub: " - "}[n.op]
		v := ev.newValue(a.shape)
		for k := range v.e {
			v.e[k].operand(a.e[k], n.pos, 1, false)
			v.e[k].emit(sign, n.pos)
			v.e[k].operand(b.e[k], n.pos, 2, false)
			v.e[k].prec = 1
		}
		return v
	case opMul:
		a, b := ev.eval(n.args[0]), ev.eval(n.args[1])
		switch {
		case scalar(a) || scalar(b):
			s := a.shape
			if scalar(a) {
				s = b.shape
			}
			v := ev.newValue(s)
			for k := range v.e {
				x, y := a, b
				ka, kb := k, k
				if scalar(a) {
					ka = 0
				}
				if scalar(b) {
					kb = 0
				}
				v.e[k].operand(x.e[ka], n.pos, 2, false)
				v.e[k].emit("*", n.pos)
				v.e[k].operand(y.e[kb], n.pos, 4, false)
				v.e[k].prec = 2
			}
			return v
		case a.shape.cols != b.shape.rows:
			ev.fail(n, "cannot multiply a %s matrix by a %s matrix (the inner sizes %d and %d differ)", a.shape, b.shape, a.shape.cols, b.shape.rows)
		}
		v := ev.newValue(shape{rows: a.shape.rows, cols: b.shape.cols})
		if ev.shapes {
			return v
		}
		// Each entry repeats a row of a and a column of b: charge that
		// before writing it.
		ev.charge(n, a.shape.rows*b.shape.cols*(a.shape.cols*4)+b.shape.cols*a.size()+a.shape.rows*b.size())
		for i := range a.shape.rows {
			for j := range b.shape.cols {
				f := v.at(i, j)
				for k := range a.shape.cols {
					if k > 0 {
						f.emit(" + ", n.pos)
					}
					f.operand(a.at(i, k), n.pos, 2, false)
					f.emit("*", n.pos)
					f.operand(b.at(k, j), n.pos, 4, false)
				}
				f.prec = 2
				if a.shape.cols > 1 {
					f.prec = 1
				}
			}
		}
		return v
	case opDiv, opPow:
		a, b := ev.eval(n.args[0]), ev.eval(n.args[1])
		if !scalar(b) {
			ev.fail(n, "the %s must be a scalar, not %s", map[nodeOp]string{opDiv: "divisor", opPow: "exponent"}[n.op], b.shape)
		}
		if n.op == opPow && !scalar(a) {
			ev.fail(n, "^ applies to scalars, and this base is %s (write the entries with indices, or a product)", a.shape)
		}
		op := map[nodeOp]string{opDiv: "/", opPow: "^"}[n.op]
		v := ev.newValue(a.shape)
		for k := range v.e {
			if n.op == opDiv {
				v.e[k].operand(a.e[k], n.pos, 2, false)
				v.e[k].emit(op, n.pos)
				v.e[k].operand(b.e[0], n.pos, 4, false)
				v.e[k].prec = 2
			} else {
				v.e[k].operand(a.e[k], n.pos, 5, false)
				v.e[k].emit(op, n.pos)
				v.e[k].operand(b.e[0], n.pos, 4, false)
				v.e[k].prec = 4
			}
		}
		return v
	case opTranspose:
		a := ev.eval(n.args[0])
		v := ev.newValue(shape{rows: a.shape.cols, cols: a.shape.rows})
		if !ev.shapes {
			for i := range a.shape.rows {
				for j := range a.shape.cols {
					v.e[j*a.shape.rows+i] = a.at(i, j)
				}
			}
		}
		return v
	case opMatrix:
		v := ev.newValue(shape{rows: n.i, cols: n.j})
		for k, x := range n.args {
			a := ev.eval(x)
			if !scalar(a) {
				ev.fail(x, "the entries of a matrix written out are scalars, and this one is %s", shapeWords(a.shape))
			}
			if !ev.shapes {
				v.e[k] = a.e[0]
			}
		}
		return v
	case opIndex:
		a := ev.eval(n.args[0])
		i, j := n.i-1, n.j-1
		if n.j == 0 {
			switch {
			case a.shape.cols == 1:
				j = 0
			case a.shape.rows == 1:
				i, j = 0, n.i-1
			default:
				ev.fail(n, "one index selects an entry of a vector, and this value is %s (write [row,column])", a.shape)
			}
		}
		if i >= a.shape.rows || j >= a.shape.cols {
			ev.fail(n, "index out of range: the value is %s", shapeWords(a.shape))
		}
		v := &value{shape: shape{rows: 1, cols: 1}}
		if !ev.shapes {
			v.e = []*frag{a.at(i, j)}
		}
		return v
	}
	ev.fail(n, "internal error: unknown node") // unreachable
	return nil
}

// shapeWords describes a shape for an index message.
func shapeWords(s shape) string {
	switch {
	case s.rows == 1 && s.cols == 1:
		return "a scalar"
	case s.cols == 1:
		return "a vector of length " + strconv.Itoa(s.rows)
	case s.rows == 1:
		return "a row of length " + strconv.Itoa(s.cols)
	}
	return "a " + s.String() + " matrix"
}
