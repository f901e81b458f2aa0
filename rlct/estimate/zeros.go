// Other zeros of K in the box: the final live points grouped along their
// minimum spanning tree; see Zero.

package estimate

import (
	"cmp"
	"math"
	"slices"
)

const (
	// maxZeroPoints caps the number of final live points grouped (an
	// evenly spaced subset in run order beyond it), since the spanning tree
	// costs their number squared.
	maxZeroPoints = 4096
	// segmentChecks is the number of points of a tree edge at which K is
	// evaluated to decide whether the edge links its ends.
	segmentChecks = 7
)

// otherZeros groups the final live points of the runs (see Zero) and returns
// the groups that do not hold the origin, the largest first. K is evaluated
// through reader, and an edge whose segment has K above barrier separates.
func (c *config) otherZeros(runs []*nsRun, reader *kReader, barrier float64) ([]Zero, error) {
	d := c.d
	total := 0
	for _, r := range runs {
		total += len(r.finalK)
	}
	stride := max(1, (total+maxZeroPoints-1)/maxZeroPoints)
	// Node 0 is the origin, or the point of the box nearest to it when the
	// box does not hold it; then the final points (w coordinates).
	lower, upper := c.lower, c.upper
	anchor := make([]float64, d)
	for i := range d {
		anchor[i] = math.Min(math.Max(0, lower[i]), upper[i])
	}
	pts := [][]float64{anchor}
	ks := []float64{0}
	seen := 0
	for _, r := range runs {
		for j, k := range r.finalK {
			if seen%stride == 0 {
				pts = append(pts, r.final[j*d:(j+1)*d])
				ks = append(ks, k)
			}
			seen++
		}
	}
	m := len(pts)
	if m < 2 {
		return nil, nil
	}
	// Distances in coordinates where the box is the unit cube.
	width := make([]float64, d)
	for i := range d {
		width[i] = upper[i] - lower[i]
	}
	dist := func(a, b []float64) float64 {
		var s float64
		for i := range a {
			x := (a[i] - b[i]) / width[i]
			s += x * x
		}
		return s
	}
	// Prim's algorithm from node 0.
	best := make([]float64, m)
	from := make([]int, m)
	done := make([]bool, m)
	for i := range best {
		best[i] = math.Inf(1)
	}
	best[0] = 0
	parent := newUnion(m)
	seg := make([]float64, d)
	for range m {
		next := -1
		for i := range m {
			if !done[i] && (next < 0 || best[i] < best[next]) {
				next = i
			}
		}
		done[next] = true
		if next != 0 {
			linked, err := lowSegment(reader, pts[from[next]], pts[next], seg, barrier)
			if err != nil {
				return nil, err
			}
			if linked {
				parent.join(from[next], next)
			}
		}
		for i := range m {
			if !done[i] {
				if e := dist(pts[next], pts[i]); e < best[i] {
					best[i], from[i] = e, next
				}
			}
		}
	}
	// The groups without the origin, in order of their first point.
	index := map[int]int{}
	var zeros []Zero
	var counts []int
	var smallest []float64 // the smallest K of each group, at Zero.At
	for i := 1; i < m; i++ {
		root := parent.find(i)
		if root == parent.find(0) {
			continue
		}
		g, ok := index[root]
		if !ok {
			g = len(zeros)
			index[root] = g
			zeros = append(zeros, Zero{At: slices.Clone(pts[i]), Lower: slices.Clone(pts[i]),
				Upper: slices.Clone(pts[i]), MaxK: ks[i]})
			counts = append(counts, 0)
			smallest = append(smallest, ks[i])
		}
		z := &zeros[g]
		counts[g]++
		if ks[i] < smallest[g] {
			smallest[g] = ks[i]
			copy(z.At, pts[i])
		}
		z.MaxK = math.Max(z.MaxK, ks[i])
		for j, x := range pts[i] {
			z.Lower[j] = math.Min(z.Lower[j], x)
			z.Upper[j] = math.Max(z.Upper[j], x)
		}
	}
	for g := range zeros {
		zeros[g].Share = float64(counts[g]) / float64(m-1)
	}
	slices.SortStableFunc(zeros, func(a, b Zero) int { return cmp.Compare(b.Share, a.Share) })
	return zeros, nil
}

// lowSegment reports whether K stays at or below barrier at segmentChecks
// evenly spaced inner points of the segment from a to b; seg is scratch.
func lowSegment(reader *kReader, a, b, seg []float64, barrier float64) (bool, error) {
	for t := 1; t <= segmentChecks; t++ {
		f := float64(t) / (segmentChecks + 1)
		for i := range seg {
			seg[i] = a[i] + f*(b[i]-a[i])
		}
		k, err := reader.evalW(seg)
		if err != nil {
			return false, err
		}
		if k > barrier {
			return false, nil
		}
	}
	return true, nil
}

// union is a disjoint-set forest over 0, …, n−1.
type union []int

func newUnion(n int) union {
	u := make(union, n)
	for i := range u {
		u[i] = i
	}
	return u
}

func (u union) find(i int) int {
	for u[i] != i {
		u[i] = u[u[i]]
		i = u[i]
	}
	return i
}

func (u union) join(a, b int) {
	u[u.find(a)] = u.find(b)
}
