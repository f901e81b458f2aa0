package main

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/lctkit/lctkit/rlct"
)

// facesCmd prints the Newton polyhedron: vertices, facets and compact faces.
type facesCmd struct {
	Expr string `arg:"" optional:"" help:"K(w), an expression vanishing at the point; - reads it from standard input. Without it the bundled example is described."`
	problemFlags
	jsonFlag

	AfterChanges bool `name:"after-changes" help:"Describe the polyhedron after the last change of coordinates (the core after the reduction, or K after the repair) when the answer came through one."`
}

// Help is shown under the command's usage.
func (c *facesCmd) Help() string {
	return `Prints the Newton polyhedron P(K) behind the bound: its vertices with the
terms of K there (in sum-of-squares form, the coefficient in each generator),
its facets as inequalities, and every compact face with its face polynomial
and nondegeneracy verdict; the principal face, which meets the ray along τ,
is marked with *. Exponents are those of K, so in sum-of-squares form they are
twice those of the generators. With several --at points each is described in
turn; --json then prints an object whose "locals" holds one entry per point.

With --after-changes, when the answer came through a change of coordinates
(the splitting off of regular directions, or the repair of degenerate edges),
the steps are listed first and the polyhedron described is that of the problem
after the last one: the core after the reduction (in its own variables; λ of K
is r/2 more) or K after the repair's last step. In JSON, "after" names it and
"whole" holds the answer for K with its steps ("changes", "reduction",
"repair").

Examples:
  lctkit faces 'x^4 + y^6'
  lctkit faces '(y - x^2)^2'                  # a degenerate edge, with a witness
  lctkit faces --sos 'a*b; a*c' --prior a=1 --json
  lctkit faces '(x-y)^2 + z^4' --after-changes`
}

// Run describes the polyhedron at each point.
func (c *facesCmd) Run(e *env) error {
	s, note, err := c.spec(c.Expr, e)
	if err != nil {
		return err
	}
	opt := c.options()
	opt.AfterChanges = c.AfterChanges
	descs, err := describe(s, opt, e)
	if err != nil {
		return err
	}
	return e.print(&facesAnswer{descs: descs, note: note}, c.JSON)
}

// facesAnswer is what faces prints: the polyhedron at each point.
type facesAnswer struct {
	descs []*rlct.Description
	note  string // says that the bundled example is described (text only)
}

func (a *facesAnswer) writeText(w io.Writer) {
	if a.note != "" {
		fmt.Fprintln(w, a.note)
	}
	for i, d := range a.descs {
		if len(a.descs) > 1 {
			if i > 0 {
				fmt.Fprintln(w)
			}
			fmt.Fprintf(w, "point %d of %d: %s\n", i+1, len(a.descs), pointString(d.Vars, d.Point))
		}
		writeFaces(w, d)
	}
}

// MarshalJSON writes the description at the one point, or at several an
// object whose "locals" holds one per point.
func (a *facesAnswer) MarshalJSON() ([]byte, error) {
	if len(a.descs) == 1 {
		return encodeJSON(a.descs[0])
	}
	return encodeJSON(struct {
		Locals []*rlct.Description `json:"locals"`
	}{a.descs})
}

// describe parses the spec and describes the polyhedron at each of its
// points (the origin when none is given), printing positioned errors.
func describe(s *rlct.Spec, opt *rlct.Options, e *env) ([]*rlct.Description, error) {
	p, err := problem(s, opt, e)
	if err != nil {
		return nil, err
	}
	return rlct.Describe(context.Background(), p, opt)
}

// writeFaces prints one description as text.
func writeFaces(out io.Writer, d *rlct.Description) {
	var buf bytes.Buffer
	writeFacesTo(&buf, d)
	// The tab writer pads the short header lines; drop the trailing blanks.
	for line := range strings.Lines(buf.String()) {
		fmt.Fprintln(out, strings.TrimRight(line, " \n"))
	}
}

func writeFacesTo(w io.Writer, d *rlct.Description) {
	if wh := d.Whole; wh != nil {
		fmt.Fprintf(w, "answer for K: λ = %s   θ = %d   (%s)\n", wh.Lambda.RatString(), wh.Theta, statusWord(wh.Status))
		for _, c := range wh.Changes {
			fmt.Fprintf(w, "  %s\n", c)
		}
		if d.After == "" {
			fmt.Fprint(w, "after the changes nothing is left to describe (the core is 0); below is the polyhedron of K itself\n\n")
		} else {
			fmt.Fprintf(w, "below: %s, in (%s)\n\n", afterTitle(d), strings.Join(d.Vars, ", "))
		}
	}
	status := statusWord(d.Status)
	where := "at the origin"
	if !allZero(d.Point) {
		where = "at " + pointString(d.Vars, d.Point)
	}
	fmt.Fprintf(w, "Newton polyhedron P(K) in (%s), %s", strings.Join(d.Vars, ", "), where)
	if d.Form == "sum-of-squares" {
		fmt.Fprint(w, "; K is a sum of squares, so P(K) = 2·P(g1, …, gr)")
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "λ = %s   θ = %d   (%s)\n", d.Lambda.RatString(), d.Theta, status)
	fmt.Fprintf(w, "the ray along τ = (%s) meets P(K) at t_τ·τ = (%s), t_τ = %s\n",
		ratList(d.Weights), ratList(d.Hit), d.Distance.RatString())

	fmt.Fprintf(w, "\nvertices (%d):\n", len(d.Vertices))
	tw := tabwriter.NewWriter(w, 0, 0, 3, ' ', 0)
	for _, v := range d.Vertices {
		line := fmt.Sprintf("  %s\t%s\tcoefficient %s", vertexList([][]int{v.Exponent}), v.Monomial, v.Coefficient.RatString())
		if v.Generators != nil {
			parts := make([]string, len(v.Generators))
			names := make([]string, len(v.Generators))
			for i, c := range v.Generators {
				parts[i] = c.RatString() + "^2"
				if c.Sign() < 0 || !c.IsInt() {
					parts[i] = "(" + c.RatString() + ")^2"
				}
				names[i] = fmt.Sprintf("g%d", i+1)
			}
			line += fmt.Sprintf("\t= %s from %s", strings.Join(parts, " + "), strings.Join(names, ", "))
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()

	fmt.Fprintf(w, "\nfacets (%d), as a·x >= b:\n", len(d.Facets))
	tw = tabwriter.NewWriter(w, 0, 0, 3, ' ', 0)
	for _, f := range d.Facets {
		kind := "compact"
		if len(f.Rays) > 0 {
			kind = "unbounded along " + strings.Join(f.Rays, ", ")
		}
		fmt.Fprintf(tw, "  %s\t%s\tvertices %s\n", f.Inequality, kind, vertexList(f.Vertices))
	}
	tw.Flush()

	if d.Faces == nil {
		fmt.Fprintln(w, "\ncompact faces: not enumerated (see the reasons)")
	} else {
		fmt.Fprintf(w, "\ncompact faces (%d; * marks the principal face):\n", len(d.Faces))
		tw = tabwriter.NewWriter(w, 0, 0, 3, ' ', 0)
		dim := -1
		for _, f := range d.Faces {
			if f.Dim != dim {
				dim = f.Dim
				fmt.Fprintf(tw, "  dimension %d\t\t\t\n", dim)
			}
			mark := " "
			if f.Principal {
				mark = "*"
			}
			fmt.Fprintf(tw, "  %s %s\t%s\t%s\n", mark, shortVertexList(f.Vertices), shortPolynomial(f.Polynomial, f.Terms), verdictText(f))
		}
		tw.Flush()
	}

	pf := d.Principal
	kind := "compact"
	if !pf.Compact {
		kind = "unbounded along " + strings.Join(pf.Rays, ", ")
	}
	fmt.Fprintf(w, "\nprincipal face: dimension %d, codimension %d = θ, %s, vertices %s, on %s\n",
		pf.Dim, pf.Codim, kind, shortVertexList(pf.Vertices), strings.Replace(rlct.FormatInequality(d.Vars, pf.Normal, pf.RHS), ">=", "=", 1))
	if !pf.Compact {
		fmt.Fprintf(w, "  face polynomial: %s\n", shortPolynomial(pf.Polynomial, pf.Terms))
	}
	switch d.Status {
	case rlct.UpperBound:
		fmt.Fprintln(w, "\nThis is an upper bound, not necessarily the learning coefficient (the true λ is at most this λ, and at equal λ the true θ is at least this θ), because:")
	case rlct.Uncertified:
		fmt.Fprintln(w, "\nThis is not a bound: it may lie below the true learning coefficient, because:")
	}
	if d.Status != rlct.Exact {
		for _, r := range d.Reasons {
			fmt.Fprintf(w, "  - %s\n", r)
		}
	}
	if len(d.Notes) > 0 {
		fmt.Fprintln(w)
	}
	for _, n := range d.Notes {
		fmt.Fprintf(w, "note: %s\n", n)
	}
}

// verdictText is the nondegeneracy column of a compact face.
func verdictText(f rlct.Face) string {
	s := string(f.Verdict)
	if f.Rule != "" && f.Rule != rlct.RuleNone {
		s += " (" + f.Rule
		if f.Reason != "" && f.Verdict == rlct.Nondegenerate {
			s += ": " + f.Reason
		}
		s += ")"
	}
	switch {
	case f.Witness != nil:
		s += fmt.Sprintf(": vanishes at %s, where %s = %s", strings.Join(f.Witness.Point, ", "), f.Witness.Monomial, f.Witness.Root)
	case f.Verdict == rlct.Undetermined && f.Reason != "":
		s += ": " + f.Reason
	}
	return s
}
