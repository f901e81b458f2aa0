package main

import (
	"context"
	"fmt"
	"os"
	"strings"

	"github.com/lctkit/lctkit/rlct"
	"github.com/lctkit/lctkit/rlct/picture"
)

// drawCmd writes a picture of the Newton polyhedron as SVG.
type drawCmd struct {
	Expr string `arg:"" optional:"" help:"K(w), an expression vanishing at the point; - reads it from standard input. Without it the bundled example is drawn."`
	problemFlags
	Output string `short:"o" required:"" help:"The SVG file to write; - writes to standard output." placeholder:"FILE.svg"`

	AfterChanges bool `name:"after-changes" help:"Draw the polyhedron after the last change of coordinates (the core after the reduction, or K after the repair) when the answer came through one."`
}

// Help is shown under the command's usage.
func (c *drawCmd) Help() string {
	return `Draws the Newton polyhedron P(K) of K in 2 or 3 variables as an SVG picture:
the shaded polyhedron cut off at the frame (arrows show where it continues),
its vertices labelled with the monomials of K, the ray from the origin along
τ with the point t_τ·τ where it meets P(K), the principal face drawn thick,
degenerate faces dotted, and a caption with λ, θ and whether the value is
exact or an upper bound. Three variables are drawn in a fixed oblique
projection. For more variables use lctkit faces. With --after-changes, when the
answer came through a change of coordinates, the polyhedron drawn is that of
the problem after the last change (the core after the reduction, or K after
the repair), and the caption gives that problem's λ and θ.

Examples:
  lctkit draw 'x^4 + y^6' -o x4y6.svg
  lctkit draw '(y - x^2)^2' -o degenerate.svg
  lctkit draw 'x^2*y^2 + z^2' -o space.svg
  lctkit draw '(y - x^2)^2' --after-changes -o repaired.svg`
}

// Run computes the polyhedron and writes the picture.
func (c *drawCmd) Run(e *env) error {
	s, _, err := c.spec(c.Expr, e)
	if err != nil {
		return err
	}
	if len(s.At) > 1 {
		return usageError{fmt.Errorf("draw pictures one point at a time; got %d --at points, so draw each separately (lctkit faces lists them all)", len(s.At))}
	}
	p, err := problem(s, c.options(), e)
	if err != nil {
		return err
	}
	vars := p.Vars()
	if n := len(vars); n < picture.MinVars || n > picture.MaxVars {
		hint := ""
		if n < picture.MinVars {
			hint = " (add a dimension with --vars, for example --vars " + vars[0] + ",y)"
		}
		return fmt.Errorf("draw supports %d or %d variables, and K has %d (%s)%s; lctkit faces lists the Newton polyhedron in any dimension",
			picture.MinVars, picture.MaxVars, n, strings.Join(vars, ", "), hint)
	}
	opt := c.options()
	opt.AfterChanges = c.AfterChanges
	ds, err := rlct.Describe(context.Background(), p, opt)
	if err != nil {
		return err
	}
	title := pictureTitle(s)
	if d := ds[0]; d.After != "" {
		if n := len(d.Vars); n < picture.MinVars || n > picture.MaxVars {
			return fmt.Errorf("after the %s the problem has %d variables (%s), and draw supports %d or %d; lctkit faces --after-changes lists its polyhedron",
				d.After, n, strings.Join(d.Vars, ", "), picture.MinVars, picture.MaxVars)
		}
		title = afterTitle(d) + " of " + title
	} else if d.Whole != nil {
		title += " (after the reduction the core is 0; K itself is drawn)"
	}
	svg, err := picture.SVG(ds[0], title)
	if err != nil {
		return err
	}
	if c.Output == "-" {
		_, err := e.stdout.Write(svg)
		return err
	}
	if err := os.WriteFile(c.Output, svg, 0o644); err != nil {
		return fmt.Errorf("writing the picture: %w", err)
	}
	return nil
}

// afterTitle names the problem a description with After set is that of.
func afterTitle(d *rlct.Description) string {
	if d.After == "reduction" {
		return "the core after the reduction"
	}
	return "K after the repair"
}

// pictureTitle names K the way the user wrote it.
func pictureTitle(s *rlct.Spec) string {
	if len(s.SOS) > 0 {
		gens := strings.FieldsFunc(strings.Join(s.SOS, ";"), func(r rune) bool { return r == ';' || r == '\n' })
		var parts []string
		for _, g := range gens {
			if g = strings.TrimSpace(g); g != "" {
				parts = append(parts, "("+g+")²")
			}
		}
		return "K = " + strings.Join(parts, " + ")
	}
	return "K = " + s.K
}
