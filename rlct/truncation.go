package rlct

import (
	"fmt"
	"math/big"

	"github.com/lctkit/lctkit/polyhedron"
)

// checkTruncation certifies that the terms a series truncated at total degree
// D left out cannot change the answer, and records reasons when it cannot.
//
// Every omitted term has total degree at least D+1, so for a weight vector
// y ≥ 0 its value y·x is at least (D+1)·min_i y_i. The work happens in the
// coordinates of the polyhedron that was built (P(K), or P(I) in
// sum-of-squares form, where the generators were truncated).
//
//   - Principal face. The optimal supporting hyperplanes at t_τ·τ are the
//     normals of the facets that contain the principal face (they generate its
//     normal cone). If (D+1)·min_i a_i > b for each such facet a·x ≥ b, every
//     omitted term lies strictly above all of them, so t_τ, the principal face
//     and θ are those of the full K.
//   - All compact faces. If moreover every omitted point lies in P ((D+1)·min a
//     ≥ b for every facet) and strictly above every compact face ((D+1)·min a >
//     b for its strictly positive normal), the full K has the same polyhedron,
//     compact faces and face polynomials, so the nondegeneracy verdicts hold
//     for it too.
func (an *analysis) checkTruncation(order int, principal *polyhedron.Face, facets []polyhedron.Facet, lat *polyhedron.Lattice, ferr error) *TruncationReport {
	res := an.res
	tr := &TruncationReport{Order: order, NeededOrder: -1}
	if ferr != nil {
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d and the facets needed to check that the omitted terms cannot lower the value could not be enumerated (%v): the value is certified only for the truncated K, not as a bound for the full K", order, ferr))
		return tr
	}
	verts := res.newton.Vertices()
	noOrder := false
	needPrincipal := 0 // smallest D with the principal condition
	var zeroVar string
	for _, f := range facets {
		if !facetContains(f, principal, verts) {
			continue
		}
		m, at := minEntry(f.Normal)
		if m.Sign() == 0 {
			noOrder = true
			zeroVar = an.vars[at]
			continue
		}
		// (D+1)·m > b  ⟺  D ≥ floor(b/m).
		needPrincipal = max(needPrincipal, int(new(big.Int).Quo(f.RHS, m).Int64()))
	}
	needFaces := 0
	facesNoOrder := false
	for _, f := range facets {
		m, _ := minEntry(f.Normal)
		if m.Sign() == 0 {
			if f.RHS.Sign() > 0 {
				facesNoOrder = true
			}
			continue
		}
		// (D+1)·m ≥ b  ⟺  D ≥ ceil(b/m) − 1.
		q, r := new(big.Int).QuoRem(f.RHS, m, new(big.Int))
		need := int(q.Int64()) - 1
		if r.Sign() > 0 {
			need++
		}
		needFaces = max(needFaces, need)
	}
	for _, f := range lat.Faces {
		m, _ := minEntry(f.Normal)
		if m.Sign() == 0 {
			facesNoOrder = true // cannot happen for a compact face
			continue
		}
		needFaces = max(needFaces, int(new(big.Int).Quo(f.RHS, m).Int64()))
	}
	needFaces = max(needFaces, needPrincipal)
	tr.Principal = !noOrder && order >= needPrincipal
	tr.Faces = tr.Principal && !facesNoOrder && order >= needFaces
	if !noOrder && !facesNoOrder {
		tr.NeededOrder = needFaces
	}
	switch {
	case noOrder:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d and no truncation order can certify it: a supporting hyperplane at the principal face gives no weight to %s, so omitted terms in the other variables could lower the value; the value is certified only for the truncated K, not as a bound for the full K", order, zeroVar))
	case !tr.Principal:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d, too low to certify that the omitted terms cannot lower the value (order %d would suffice); the value is certified only for the truncated K, not as a bound for the full K", order, needPrincipal))
	case !tr.Faces && facesNoOrder:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d: the value is a valid bound for the full K, but omitted terms could add compact faces whose nondegeneracy is unknown, and no truncation order can rule that out", order))
	case !tr.Faces:
		res.Reasons = append(res.Reasons, fmt.Sprintf(
			"K is a series truncated at degree %d: the value is a valid bound for the full K, but omitted terms could add compact faces whose nondegeneracy is unknown (order %d would rule that out)", order, needFaces))
	}
	return tr
}

// facetContains reports whether facet f contains face g: every vertex of g
// lies on f and f gives no weight to the rays of g.
func facetContains(f polyhedron.Facet, g *polyhedron.Face, verts [][]int) bool {
	dot := new(big.Int)
	t := new(big.Int)
	for _, j := range g.Vertices {
		dot.SetInt64(0)
		for i, a := range f.Normal {
			dot.Add(dot, t.Mul(a, big.NewInt(int64(verts[j][i]))))
		}
		if dot.Cmp(f.RHS) != 0 {
			return false
		}
	}
	for _, i := range g.Rays {
		if f.Normal[i].Sign() != 0 {
			return false
		}
	}
	return true
}

// minEntry returns the smallest entry of a and its index.
func minEntry(a []*big.Int) (*big.Int, int) {
	m, at := a[0], 0
	for i, x := range a {
		if x.Cmp(m) < 0 {
			m, at = x, i
		}
	}
	return m, at
}
