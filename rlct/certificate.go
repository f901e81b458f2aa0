package rlct

import (
	"container/heap"
	"context"
	"errors"
	"fmt"
	"math/big"
	"slices"
	"strconv"
	"strings"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/polyhedron"
)

// Certificate records how the nondegeneracy of K was decided.
//
// Only some compact faces can be degenerate. In polynomial form, a face
// whose terms all have positive coefficients and even exponents is
// positive on the real torus, so a face needs a rule only when it holds an
// unsafe point: a term with a negative coefficient or an odd exponent. In
// sum-of-squares form, a face on which some generator has a single term is
// nondegenerate, so a face needs a rule only when every generator with a
// term there has two or more, that is when it holds the midpoint of two
// terms of one generator: those midpoints are the unsafe points. Bound
// finds the smallest face holding each unsafe point (an exact LP), then
// the faces above it, and decides only those; it never builds the whole
// face lattice unless asked to (Options.AllFaces). It is its own JSON form.
type Certificate struct {
	// Unsafe is the number of unsafe points that could lie on a compact
	// face (those dominating another support point cannot).
	Unsafe int `json:"unsafe_points"`
	// Examined is the number of compact faces decided.
	Examined int `json:"faces_examined"`
	// ByRule counts the examined faces by the rule that decided them
	// (RuleNone for undetermined faces).
	ByRule map[string]int `json:"by_rule,omitempty"`
	// Degenerate and Undetermined count the examined faces with those
	// verdicts.
	Degenerate   int `json:"degenerate"`
	Undetermined int `json:"undetermined"`
	// Complete is true when every compact face that could be degenerate
	// was examined.
	Complete bool `json:"complete"`
	// Stop says why the search ended before it was complete: StopSettled
	// or StopBudget; empty when it was complete.
	Stop string `json:"stopped,omitempty"`
	// Deciding lists the faces that decided the status: the degenerate face
	// with its witness, and the first undetermined faces; empty when the
	// status is Exact.
	Deciding []Face `json:"deciding_faces,omitempty"`
}

// Reasons the certificate search can end early (Certificate.Stop).
const (
	// StopSettled: a degenerate face was found, which settles the status
	// (UpperBound), so the remaining faces were not examined.
	StopSettled = "settled"
	// StopBudget: Options.MaxFaces faces were examined, or the context's
	// deadline passed, before the status was settled.
	StopBudget = "budget"
)

// maxDeciding bounds Certificate.Deciding and the faces described in
// Result.Reasons.
const maxDeciding = 3

// maxUnsafe bounds the unsafe points collected before the search gives up
// with StopBudget; it keeps memory bounded (a few megabytes) for generators
// with very many terms, whose midpoints grow quadratically.
const maxUnsafe = 100_000

// analysis holds what the face checks share.
type analysis struct {
	res   *Result
	polys []*monomial.Poly
	sos   bool
	vars  []string
	opt   *Options
	// weights are Problem.GeneratorWeights (nil: all 1), for printing.
	weights []*big.Rat
}

func newAnalysis(res *Result, polys []*monomial.Poly, sos bool, opt *Options) *analysis {
	return &analysis{res: res, polys: polys, sos: sos, vars: res.Vars, opt: opt}
}

// search is the state of one certificate search.
type search struct {
	an        *analysis
	ctx       context.Context
	cert      *Certificate
	principal *polyhedron.Face
	seen      map[string]bool // faces examined
	queued    map[string]bool // faces whose covers are (to be) examined
	queue     faceQueue
	done      bool // the search must stop (settled or budget)
}

// certify decides the compact faces that could be degenerate and records
// the certificate in an.res; it returns ErrNegative when a face shows that
// K takes negative values near the point.
func (an *analysis) certify(ctx context.Context, principal *polyhedron.Face) error {
	cert := &Certificate{ByRule: map[string]int{}}
	an.res.Certificate = cert
	s := &search{an: an, ctx: ctx, cert: cert, principal: principal, seen: map[string]bool{}, queued: map[string]bool{}}
	if !an.sos {
		if err := an.checkVertexSigns(ctx); err != nil {
			if !isStop(err) {
				return err
			}
			if err := s.interrupted(err); err != nil {
				return err
			}
		}
	}
	var err error
	switch {
	case s.done:
	case an.opt.AllFaces:
		err = s.allFaces()
	default:
		err = s.run()
	}
	if err != nil {
		return err
	}
	s.finish()
	return nil
}

// run examines the compact faces holding an unsafe point: the smallest face
// holding each, then upwards through the faces containing them, smallest
// dimension first.
func (s *search) run() error {
	an := s.an
	unsafe, ok, err := an.unsafePoints(s.ctx)
	if err != nil {
		return s.interrupted(err)
	}
	s.cert.Unsafe = len(unsafe)
	// The principal face is examined first (one face, and it often
	// settles the status); the faces above it are climbed only when it
	// holds an unsafe point, like every other face.
	if s.principal.Compact() {
		if err := s.visit(s.principal, false); err != nil || s.done {
			return err
		}
	}
	if !ok {
		s.stop(StopBudget)
		return nil
	}
	for _, u := range unsafe {
		if err := s.check(); err != nil || s.done {
			return err
		}
		f, err := an.res.newton.CompactFaceAt(s.ctx, u.point())
		if err != nil {
			return s.interrupted(err)
		}
		if f == nil {
			continue
		}
		if err := s.visit(f, true); err != nil || s.done {
			return err
		}
	}
	for s.queue.Len() > 0 {
		if err := s.check(); err != nil || s.done {
			return err
		}
		g := heap.Pop(&s.queue).(*polyhedron.Face)
		covers, err := an.res.newton.Covers(s.ctx, g)
		if err != nil {
			return s.interrupted(err)
		}
		for _, f := range covers {
			if err := s.visit(f, true); err != nil || s.done {
				return err
			}
		}
	}
	s.cert.Complete = true
	return nil
}

// allFaces examines every compact face (Options.AllFaces). When the faces
// cannot be enumerated within the limits, it falls back to run, so that the
// status never depends on the option.
func (s *search) allFaces() error {
	an := s.an
	lattice, err := an.res.newton.CompactFaces(s.ctx)
	if err != nil {
		if isStop(err) {
			return s.interrupted(err)
		}
		an.res.Reasons = append(an.res.Reasons, fmt.Sprintf("the full list of compact faces was not produced (%v); the faces that could be degenerate were examined instead", err))
		an.opt = &Options{MaxFaces: an.opt.MaxFaces, Limits: an.opt.Limits}
		return s.run()
	}
	unsafe, _, err := an.unsafePoints(s.ctx)
	if err != nil {
		return s.interrupted(err)
	}
	s.cert.Unsafe = len(unsafe)
	for _, f := range lattice.Faces {
		if err := s.check(); err != nil {
			return err
		}
		if s.done {
			return nil
		}
		if err := s.visit(f, false); err != nil {
			return err
		}
	}
	s.cert.Complete = !s.done
	return nil
}

// check returns an error when the context was cancelled, and ends the
// search (StopBudget) when its deadline passed or the face budget is spent.
func (s *search) check() error {
	err := s.ctx.Err()
	switch {
	case errors.Is(err, context.DeadlineExceeded):
		s.stop(StopBudget)
	case err != nil:
		return stopped(s.ctx)
	case s.cert.Examined >= s.an.opt.maxFaces():
		s.stop(StopBudget)
	}
	return nil
}

// interrupted turns an error of a polyhedron operation into the search's
// outcome: a passed deadline ends the search like a spent budget; anything
// else is returned.
func (s *search) interrupted(err error) error {
	if errors.Is(err, context.DeadlineExceeded) && s.ctx.Err() != nil {
		s.stop(StopBudget)
		return nil
	}
	return err
}

func (s *search) stop(why string) {
	if !s.done {
		s.done = true
		s.cert.Stop = why
	}
}

// visit examines face f once and, when climb is set, queues it once so
// that the faces above it are examined too.
func (s *search) visit(f *polyhedron.Face, climb bool) error {
	key := faceKey(f)
	if climb && !s.queued[key] {
		s.queued[key] = true
		heap.Push(&s.queue, f)
	}
	if s.seen[key] {
		return nil
	}
	if err := s.check(); err != nil || s.done {
		return err
	}
	s.seen[key] = true
	fr, err := s.an.examine(s.ctx, f)
	if err != nil {
		if isStop(err) {
			return s.interrupted(err)
		}
		return err
	}
	fr.Principal = f.Equal(s.principal)
	if s.an.opt.AllFaces {
		s.an.res.Faces = append(s.an.res.Faces, *fr)
	}
	if fr.Principal {
		s.an.res.Principal.Verdict, s.an.res.Principal.Rule = fr.Verdict, fr.Rule
		s.an.res.Principal.Witness, s.an.res.Principal.Reason = fr.Witness, fr.Reason
	}
	cert := s.cert
	cert.Examined++
	cert.ByRule[fr.Rule]++
	switch fr.Verdict {
	case Degenerate:
		cert.Degenerate++
		s.keep(fr)
		if !s.an.opt.AllFaces {
			s.stop(StopSettled)
		}
	case Undetermined:
		cert.Undetermined++
		s.keep(fr)
	}
	return nil
}

// keep records a face that decides the status.
func (s *search) keep(fr *Face) {
	if len(s.cert.Deciding) < maxDeciding {
		s.cert.Deciding = append(s.cert.Deciding, *fr)
	}
}

// finish writes the reasons for a status other than Exact.
func (s *search) finish() {
	cert, res := s.cert, s.an.res
	failed := 0
	for _, fr := range cert.Deciding {
		failed++
		switch fr.Verdict {
		case Degenerate:
			res.Reasons = append(res.Reasons, fmt.Sprintf("the face with vertices %s is degenerate: its face polynomial %s vanishes at %s in the real torus",
				formatVertices(fr.Vertices), fr.Polynomial, strings.Join(fr.Witness.Point, ", ")))
		case Undetermined:
			res.Reasons = append(res.Reasons, fmt.Sprintf("the face with vertices %s could not be decided: %s", formatVertices(fr.Vertices), fr.Reason))
		}
	}
	if more := cert.Degenerate + cert.Undetermined - failed; more > 0 {
		res.Reasons = append(res.Reasons, fmt.Sprintf("%d more of the %d examined faces are degenerate or undetermined", more, cert.Examined))
	}
	if cert.Stop == StopBudget {
		res.Reasons = append(res.Reasons, fmt.Sprintf("undetermined: budget reached: the search stopped after examining %d compact faces, before every face that could be degenerate was decided (raise the face budget or the time allowed)", cert.Examined))
	}
}

// examine decides one compact face: it first looks for a torus point where
// the face polynomial is negative (polynomial form), which makes K negative
// near the point and is an error, then applies the rules.
func (an *analysis) examine(ctx context.Context, f *polyhedron.Face) (*Face, error) {
	parts := an.parts(f)
	fr := an.report(f, parts)
	exposes, err := an.res.newton.Exposes(ctx, f)
	if err != nil {
		return nil, err
	}
	if !exposes || !f.Compact() {
		// The face polynomials are read off with the face's normal; if
		// that normal does not cut out exactly this face, no verdict
		// built on them can be trusted.
		fr.Verdict, fr.Rule = Undetermined, RuleNone
		fr.Reason = "internal check failed: the face's normal does not expose exactly its vertices"
		return &fr, nil
	}
	fc := &faceCase{face: f, parts: parts, sos: an.sos, vars: an.vars, verts: an.res.newton.Points()}
	if !an.sos {
		if neg := negativePoint(fc); neg != nil {
			return nil, fmt.Errorf("%w: the face polynomial %s of the face with vertices %s is %s at %s, so K is negative along w_i = s^{a_i}·(that point) for small s > 0, with a = (%s) the face's normal",
				ErrNegative, fr.Polynomial, formatVertices(fr.Vertices), neg.value.RatString(), neg.pointString(an.vars), intList(f.Normal))
		}
	}
	decideFace(fc, &fr)
	return &fr, nil
}

// checkVertexSigns rejects K (polynomial form) with a vertex term that is
// negative or has an odd exponent: along a curve w = s·t^a that picks out
// the vertex, the term dominates, and flipping the sign of a variable with
// an odd exponent (or a negative coefficient) makes K negative arbitrarily
// close to the point. Only unsafe terms are looked up, so this costs
// nothing for a K whose terms are all even-positive.
func (an *analysis) checkVertexSigns(ctx context.Context) error {
	var unsafe []monomial.Exponent
	for e, c := range an.polys[0].All() {
		if c.Sign() < 0 || !allEven(e) {
			unsafe = append(unsafe, e)
		}
	}
	if len(unsafe) == 0 {
		return nil
	}
	verts, err := an.res.newton.Vertices(ctx)
	if err != nil {
		return err
	}
	isVertex := make(map[string]bool, len(verts))
	for _, v := range verts {
		isVertex[intsKey(v)] = true
	}
	for _, e := range unsafe {
		if !isVertex[intsKey(e)] {
			continue
		}
		c := an.polys[0].Coefficient(e)
		term := monomial.Monomial(an.vars, e, c).String()
		if c.Sign() < 0 {
			return fmt.Errorf("%w: the term %s at a vertex of the Newton polyhedron has a negative coefficient", ErrNegative, term)
		}
		for i, x := range e {
			if x%2 != 0 {
				return fmt.Errorf("%w: the term %s at a vertex of the Newton polyhedron has an odd power of %s", ErrNegative, term, an.vars[i])
			}
		}
	}
	return nil
}

// unsafePoint is an unsafe point sum/den: a term (den 1) or the midpoint of
// two terms (den 2).
type unsafePoint struct {
	sum []int
	den int64
}

func (u unsafePoint) point() []*big.Rat { return ratVector(u.sum, u.den) }

// unsafePoints returns the points that can make a face polynomial vanish
// on the torus (see Certificate), restricted to those that could lie on a
// compact face; ok is false when there are more than maxUnsafe.
func (an *analysis) unsafePoints(ctx context.Context) (pts []unsafePoint, ok bool, err error) {
	// A point of a compact face dominates no other point of P, so an unsafe
	// term must be Pareto-minimal, and so must both ends of a midpoint. The
	// minimal points are looked up only when there is a candidate.
	var minimal map[string]bool
	isMinimal := func(e []int) bool {
		if minimal == nil {
			minimal = map[string]bool{}
			var ms [][]int
			if ms, err = an.res.newton.Minimal(ctx); err != nil {
				return false
			}
			for _, m := range ms {
				minimal[intsKey(m)] = true
			}
		}
		return minimal[intsKey(e)]
	}
	if !an.sos {
		for e, c := range an.polys[0].All() {
			if c.Sign() > 0 && allEven(e) || !isMinimal(e) {
				continue
			}
			if len(pts) >= maxUnsafe {
				return pts, false, err
			}
			pts = append(pts, unsafePoint{[]int(e), 1})
		}
		return pts, true, err
	}
	seen := map[string]bool{}
	sum := make([]int, len(an.vars))
	for _, g := range an.polys {
		if g.Len() < 2 {
			continue
		}
		var ends []monomial.Exponent
		for e := range g.All() {
			if isMinimal(e) {
				ends = append(ends, e)
			}
		}
		for i := range ends {
			for j := i + 1; j < len(ends); j++ {
				for k := range sum {
					sum[k] = ends[i][k] + ends[j][k]
				}
				key := intsKey(sum)
				if seen[key] {
					continue
				}
				if len(pts) >= maxUnsafe {
					return pts, false, err
				}
				seen[key] = true
				pts = append(pts, unsafePoint{slices.Clone(sum), 2})
			}
		}
	}
	return pts, true, err
}

// ratVector returns e/den as rationals.
func ratVector(e []int, den int64) []*big.Rat {
	out := make([]*big.Rat, len(e))
	for i, x := range e {
		out[i] = big.NewRat(int64(x), den)
	}
	return out
}

// intsKey is a map key for an integer vector.
func intsKey(v []int) string {
	var b strings.Builder
	for i, x := range v {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString(strconv.Itoa(x))
	}
	return b.String()
}

// faceKey identifies a face by its vertices and rays.
func faceKey(f *polyhedron.Face) string {
	return intsKey(f.Vertices) + "|" + intsKey(f.Rays)
}

func intList(a []*big.Int) string {
	parts := make([]string, len(a))
	for i, x := range a {
		parts[i] = x.String()
	}
	return strings.Join(parts, ", ")
}

// faceQueue orders faces by dimension, smallest first, so that the search
// climbs the faces above the unsafe points level by level.
type faceQueue []*polyhedron.Face

func (q faceQueue) Len() int           { return len(q) }
func (q faceQueue) Less(i, j int) bool { return q[i].Dim < q[j].Dim }
func (q faceQueue) Swap(i, j int)      { q[i], q[j] = q[j], q[i] }
func (q *faceQueue) Push(x any)        { *q = append(*q, x.(*polyhedron.Face)) }
func (q *faceQueue) Pop() any {
	old := *q
	f := old[len(old)-1]
	*q = old[:len(old)-1]
	return f
}
