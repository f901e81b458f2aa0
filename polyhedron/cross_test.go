package polyhedron

import (
	"bufio"
	"context"
	"fmt"
	"math/big"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func randomPoints(rng *rand.Rand, d, n, maxExp int) [][]int {
	pts := make([][]int, n)
	for k := range pts {
		pts[k] = make([]int, d)
		for i := range pts[k] {
			pts[k][i] = rng.IntN(maxExp + 1)
		}
	}
	return pts
}

func dotInt(a []*big.Int, v []int) *big.Int {
	s := new(big.Int)
	for i := range a {
		s.Add(s, new(big.Int).Mul(a[i], big.NewInt(int64(v[i]))))
	}
	return s
}

func dotRat(a []*big.Int, x []*big.Rat) *big.Rat {
	s := new(big.Rat)
	for i := range a {
		s.Add(s, new(big.Rat).Mul(new(big.Rat).SetInt(a[i]), x[i]))
	}
	return s
}

// normalRank is the rank of the normals of the given facets.
func normalRank(fs []Facet, idx []int, d int) int {
	var rows [][]int64
	for _, k := range idx {
		rows = append(rows, intsOf(fs[k].Normal))
	}
	return rankInt(rows, d)
}

// faceByFacets computes the face holding x in its relative interior from the
// facet list alone: the facets tight at x cut out the face; its vertices and
// rays are those common to all of them, and its dimension is d minus the rank
// of their normals (common practice).
func faceByFacets(fs []Facet, verts [][]int, d int, x []*big.Rat) (vs, rays []int, dim int) {
	var tight []int
	for k, f := range fs {
		if dotRat(f.Normal, x).Cmp(new(big.Rat).SetInt(f.RHS)) == 0 {
			tight = append(tight, k)
		}
	}
	for j, v := range verts {
		if v == nil {
			continue // a point that is no vertex
		}
		ok := true
		for _, k := range tight {
			if dotInt(fs[k].Normal, v).Cmp(fs[k].RHS) != 0 {
				ok = false
				break
			}
		}
		if ok {
			vs = append(vs, j)
		}
	}
	for i := 0; i < d; i++ {
		ok := true
		for _, k := range tight {
			if fs[k].Normal[i].Sign() != 0 {
				ok = false
				break
			}
		}
		if ok {
			rays = append(rays, i)
		}
	}
	return vs, rays, d - normalRank(fs, tight, d)
}

// checkFacets verifies the facet list of n against the definition: every
// input point satisfies every inequality, each inequality is tight on a set
// of vertices and rays of affine rank d−1 (so it is a facet), its Vertices
// and Rays fields match, there are no duplicates, and each vertex is a
// vertex: the facets through it have normals of rank d, while every other
// Pareto-minimal point has tight normals of rank < d.
func checkFacets(t *testing.T, n *Newton, points [][]int) []Facet {
	t.Helper()
	d := n.Dim()
	fs, err := n.Facets(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	seen := map[string]bool{}
	for k, f := range fs {
		key := fmt.Sprint(f.Normal, f.RHS)
		if seen[key] {
			t.Errorf("duplicate facet %s", key)
		}
		seen[key] = true
		for _, a := range f.Normal {
			if a.Sign() < 0 {
				t.Errorf("facet %d has a negative normal entry", k)
			}
		}
		for _, p := range points {
			if dotInt(f.Normal, p).Cmp(f.RHS) < 0 {
				t.Errorf("point %v violates facet %v >= %v", p, f.Normal, f.RHS)
			}
		}
		var tv, tr []int
		for j, v := range vertexSeq(t, n) {
			if dotInt(f.Normal, v).Cmp(f.RHS) == 0 {
				tv = append(tv, j)
			}
		}
		for i, a := range f.Normal {
			if a.Sign() == 0 {
				tr = append(tr, i)
			}
		}
		if !slices.Equal(tv, f.Vertices) || !slices.Equal(tr, f.Rays) {
			t.Errorf("facet %v: Vertices %v Rays %v, want %v %v", f.Normal, f.Vertices, f.Rays, tv, tr)
		}
		if dim := n.faceDim(tv, tr); dim != d-1 {
			t.Errorf("facet %v >= %v is tight on a face of dimension %d, want %d", f.Normal, f.RHS, dim, d-1)
		}
	}
	for _, p := range mustMinimal(t, n) {
		var tight []int
		for k, f := range fs {
			if dotInt(f.Normal, p).Cmp(f.RHS) == 0 {
				tight = append(tight, k)
			}
		}
		isV := slices.ContainsFunc(mustVertices(t, n), func(v []int) bool { return slices.Equal(v, p) })
		// A vertex lies on at least d facets. The coordinate inequalities
		// x_i >= 0 count only when they are facets of P (they are in the
		// list then); a vertex with v_i = 0 for which x_i >= 0 is not a
		// facet still meets d facets of other kinds.
		if isV && len(tight) < d {
			t.Errorf("vertex %v lies on %d facets, want >= %d", p, len(tight), d)
		}
		if r := normalRank(fs, tight, d); (r == d) != isV {
			t.Errorf("point %v: vertex = %v but the facets through it have normal rank %d (%d facets)", p, isV, r, len(tight))
		}
	}
	return fs
}

func TestRandomCrossCheck(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	trials := 300
	if testing.Short() {
		trials = 60
	}
	for trial := 0; trial < trials; trial++ {
		d := 1 + rng.IntN(5)
		np := 1 + rng.IntN(14)
		points := randomPoints(rng, d, np, 1+rng.IntN(6))
		name := fmt.Sprintf("trial%d", trial)
		n, err := New(d, points)
		if err != nil {
			t.Fatal(err)
		}
		fs := checkFacets(t, n, points)
		lat, err := n.CompactFaces(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		checkLattice(t, n, fs, lat)
		for k := 0; k < 3; k++ {
			tau := make([]*big.Rat, d)
			for i := range tau {
				tau[i] = big.NewRat(int64(1+rng.IntN(5)), int64(1+rng.IntN(3)))
			}
			h, err := n.Distance(context.Background(), tau)
			if err != nil {
				t.Fatal(err)
			}
			checkHit(t, n, points, tau, h)
			// t_τ = max over facets of b/(a·τ) (facets with b > 0; those with
			// b = 0 give 0): the largest t with t·τ on or outside a facet's
			// hyperplane; common practice.
			if want := facetDistance(fs, tau); h.T.Cmp(want) != 0 {
				t.Errorf("%s %v τ=%v: t = %v, facets give %v", name, points, tau, h.T, want)
			}
			checkFace(t, n, fs, lat, h.Point, h.Face)
			// FaceAt at the same point must agree.
			f2, err := n.FaceAt(context.Background(), h.Point)
			if err != nil {
				t.Errorf("FaceAt(hit point): %v", err)
			} else if !slices.Equal(f2.Vertices, h.Face.Vertices) || !slices.Equal(f2.Rays, h.Face.Rays) || f2.Dim != h.Face.Dim {
				t.Errorf("FaceAt disagrees with Distance")
			}
		}
		// FaceAt at vertices, at vertex + unit steps, and interior/outside points.
		for j, v := range vertexSeq(t, n) {
			x := make([]*big.Rat, d)
			for i := range x {
				x[i] = big.NewRat(int64(v[i]), 1)
			}
			f, err := n.FaceAt(context.Background(), x)
			if err != nil {
				t.Fatalf("FaceAt(vertex %v): %v", v, err)
			}
			checkFace(t, n, fs, lat, x, f)
			if !slices.Equal(f.Vertices, []int{j}) || len(f.Rays) != 0 || f.Dim != 0 {
				t.Errorf("FaceAt(vertex %v) = %v", v, f.Vertices)
			}
			i := rng.IntN(d)
			x[i] = new(big.Rat).Add(x[i], big.NewRat(int64(1+rng.IntN(3)), 2))
			if f, err := n.FaceAt(context.Background(), x); err == nil {
				checkFace(t, n, fs, lat, x, f)
			} else {
				// x must then be interior: strictly inside every facet.
				for _, fc := range fs {
					if dotRat(fc.Normal, x).Cmp(new(big.Rat).SetInt(fc.RHS)) <= 0 {
						t.Errorf("FaceAt(%v) failed (%v) but x is on facet %v", x, err, fc.Normal)
					}
				}
			}
		}
		out := make([]*big.Rat, d)
		for i := range out {
			out[i] = big.NewRat(-1, 1)
		}
		if _, err := n.FaceAt(context.Background(), out); err == nil {
			t.Errorf("FaceAt(outside point) returned no error")
		}
	}
}

// checkFace compares a face with the one computed from the facets at x, and
// checks its normal and dimension independently.
func checkFace(t *testing.T, n *Newton, fs []Facet, lat *Lattice, x []*big.Rat, f *Face) {
	t.Helper()
	d := n.Dim()
	vs, rays, dim := faceByFacets(fs, vertexSlice(t, n), d, x)
	if !slices.Equal(vs, f.Vertices) || !slices.Equal(rays, f.Rays) || dim != f.Dim {
		t.Errorf("face at %v: got vertices %v rays %v dim %d, facets give %v %v %d", x, f.Vertices, f.Rays, f.Dim, vs, rays, dim)
		return
	}
	if got := n.faceDim(f.Vertices, f.Rays); got != dim {
		t.Errorf("affine rank of vertices+rays %d, facet rank gives %d", got, dim)
	}
	// The normal must expose exactly this face.
	for j, v := range vertexSeq(t, n) {
		c := dotInt(f.Normal, v).Cmp(f.RHS)
		if c < 0 || (c == 0) != slices.Contains(f.Vertices, j) {
			t.Errorf("face normal %v >= %v does not expose vertices %v", f.Normal, f.RHS, f.Vertices)
			break
		}
	}
	for i, a := range f.Normal {
		if a.Sign() < 0 || (a.Sign() == 0) != slices.Contains(f.Rays, i) {
			t.Errorf("face normal %v does not match rays %v", f.Normal, f.Rays)
		}
	}
	if f.Compact() {
		k := slices.IndexFunc(lat.Faces, func(g *Face) bool { return slices.Equal(g.Vertices, f.Vertices) })
		if k < 0 || lat.Faces[k].Dim != f.Dim {
			t.Errorf("compact face %v (dim %d) not in the lattice", f.Vertices, f.Dim)
		}
	}
}

// checkLattice compares the compact faces with a brute-force enumeration
// over all vertex subsets (closure under the facets), for few vertices, and
// checks inclusions and normals.
func checkLattice(t *testing.T, n *Newton, fs []Facet, lat *Lattice) {
	t.Helper()
	d := n.Dim()
	nv := len(mustVertices(t, n))
	if len(lat.Faces) != len(lat.Sub) {
		t.Fatalf("lattice has %d faces and %d Sub lists", len(lat.Faces), len(lat.Sub))
	}
	for k, f := range lat.Faces {
		if k > 0 {
			p := lat.Faces[k-1]
			if p.Dim > f.Dim || (p.Dim == f.Dim && slices.Compare(p.Vertices, f.Vertices) >= 0) {
				t.Errorf("lattice order broken at %d", k)
			}
		}
		for _, a := range f.Normal {
			if a.Sign() <= 0 {
				t.Errorf("compact face %v has normal %v", f.Vertices, f.Normal)
			}
		}
		var tv []int
		for j, v := range vertexSeq(t, n) {
			c := dotInt(f.Normal, v).Cmp(f.RHS)
			if c < 0 {
				t.Errorf("face normal violated")
			}
			if c == 0 {
				tv = append(tv, j)
			}
		}
		if !slices.Equal(tv, f.Vertices) {
			t.Errorf("face normal %v exposes %v, face has %v", f.Normal, tv, f.Vertices)
		}
		if got := n.faceDim(f.Vertices, nil); got != f.Dim {
			t.Errorf("face %v dim %d, affine rank %d", f.Vertices, f.Dim, got)
		}
		for _, s := range lat.Sub[k] {
			g := lat.Faces[s]
			if g.Dim != f.Dim-1 {
				t.Errorf("sub-face of wrong dimension")
			}
			for _, j := range g.Vertices {
				if !slices.Contains(f.Vertices, j) {
					t.Errorf("sub-face %v not contained in %v", g.Vertices, f.Vertices)
				}
			}
		}
		// Every face of dimension Dim−1 contained in f must be listed.
		for s, g := range lat.Faces {
			if g.Dim == f.Dim-1 && isSubset(g.Vertices, f.Vertices) && !slices.Contains(lat.Sub[k], s) {
				t.Errorf("Sub of %v misses %v", f.Vertices, g.Vertices)
			}
		}
	}
	if nv > 10 {
		return
	}
	// Brute force: a vertex set S is a compact face iff S equals the set of
	// vertices on all facets containing S and no ray lies on all of them.
	vi := vertexIndexList(t, n) // faces list indices into Points()
	var want [][]int
	for mask := 1; mask < 1<<nv; mask++ {
		var s []int
		for j := 0; j < nv; j++ {
			if mask&(1<<j) != 0 {
				s = append(s, vi[j])
			}
		}
		var tight []int
		for k, f := range fs {
			if isSubset(s, f.Vertices) {
				tight = append(tight, k)
			}
		}
		var cl []int
		for _, j := range vi {
			if !slices.ContainsFunc(tight, func(k int) bool { return !slices.Contains(fs[k].Vertices, j) }) {
				cl = append(cl, j)
			}
		}
		hasRay := false
		for i := 0; i < d; i++ {
			if !slices.ContainsFunc(tight, func(k int) bool { return fs[k].Normal[i].Sign() != 0 }) {
				hasRay = true
			}
		}
		if slices.Equal(cl, s) && !hasRay {
			want = append(want, s)
		}
	}
	var got [][]int
	for _, f := range lat.Faces {
		got = append(got, f.Vertices)
	}
	slices.SortFunc(want, slices.Compare)
	slices.SortFunc(got, slices.Compare)
	if !slices.EqualFunc(got, want, slices.Equal) {
		t.Errorf("compact faces %v, brute force %v", got, want)
	}
}

// facetDistance returns max over facets of b/(a·τ) (0 when every b is 0):
// the Newton distance computed from the facets alone.
func facetDistance(fs []Facet, tau []*big.Rat) *big.Rat {
	want := new(big.Rat)
	for _, f := range fs {
		q := new(big.Rat).Quo(new(big.Rat).SetInt(f.RHS), dotRat(f.Normal, tau))
		if q.Cmp(want) > 0 {
			want = q
		}
	}
	return want
}

func isSubset(a, b []int) bool {
	for _, x := range a {
		if !slices.Contains(b, x) {
			return false
		}
	}
	return true
}

// writeExt writes P in the V-representation format read by lrs and cdd:
// the vertices (leading 1) and the d unit rays (leading 0).
func writeExt(path string, d int, verts [][]int) error {
	var b strings.Builder
	fmt.Fprintf(&b, "newton\nV-representation\nbegin\n%d %d rational\n", len(verts)+d, d+1)
	for _, v := range verts {
		b.WriteString("1")
		for _, x := range v {
			fmt.Fprintf(&b, " %d", x)
		}
		b.WriteString("\n")
	}
	for i := 0; i < d; i++ {
		b.WriteString("0")
		for k := 0; k < d; k++ {
			if k == i {
				b.WriteString(" 1")
			} else {
				b.WriteString(" 0")
			}
		}
		b.WriteString("\n")
	}
	b.WriteString("end\n")
	return os.WriteFile(path, []byte(b.String()), 0o644)
}

// readIne parses an H-representation (rows "c a_1 … a_d" meaning
// c + a·x >= 0) and returns the facets as normalised strings "a >= b",
// dropping the trivial row with a = 0.
func readIne(text string) ([]string, error) {
	var out []string
	sc := bufio.NewScanner(strings.NewReader(text))
	in := false
	header := false
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		switch {
		case line == "begin":
			in, header = true, true
			continue
		case line == "end":
			in = false
			continue
		case !in || line == "" || strings.HasPrefix(line, "*"):
			continue
		case header:
			header = false
			continue
		}
		fields := strings.Fields(line)
		rs := make([]*big.Rat, len(fields))
		for i, f := range fields {
			r, ok := new(big.Rat).SetString(f)
			if !ok {
				return nil, fmt.Errorf("bad entry %q", f)
			}
			rs[i] = r
		}
		// scale the row to integers (cdd may print fractions)
		ai, bi := scaleToInts(rs[1:], rs[0])
		vals := append([]*big.Int{bi}, ai...)
		a, b := primitive(vals[1:], new(big.Int).Neg(vals[0]))
		zero := true
		for _, x := range a {
			if x.Sign() != 0 {
				zero = false
			}
		}
		if !zero {
			out = append(out, fmt.Sprint(a, ">=", b))
		}
	}
	slices.Sort(out)
	return out, nil
}

func facetStrings(fs []Facet) []string {
	var out []string
	for _, f := range fs {
		out = append(out, fmt.Sprint(f.Normal, ">=", f.RHS))
	}
	slices.Sort(out)
	return out
}

// TestAgainstReferenceTools compares the facet sets with the exact
// enumerations of lrs (lrslib) and scdd_gmp (cddlib) on the same V-form.
func TestAgainstReferenceTools(t *testing.T) {
	tools := []struct {
		name string
		run  func(dir, file string) (string, error)
	}{
		{"lrs", func(dir, file string) (string, error) {
			out, err := exec.Command("lrs", file).Output()
			return string(out), err
		}},
		{"scdd_gmp", func(dir, file string) (string, error) {
			cmd := exec.Command("scdd_gmp", filepath.Base(file))
			cmd.Dir = dir
			if _, err := cmd.Output(); err != nil {
				return "", err
			}
			b, err := os.ReadFile(file + ".ine")
			return string(b), err
		}},
	}
	rng := rand.New(rand.NewPCG(7, 11))
	type inst struct {
		d   int
		pts [][]int
	}
	var cases []inst
	for k := 0; k < 12; k++ {
		d := 2 + rng.IntN(4)
		cases = append(cases, inst{d, randomPoints(rng, d, 4+rng.IntN(12), 6)})
	}
	cases = append(cases, inst{3, [][]int{{1, 1, 2}, {2, 2, 1}}})
	for _, tool := range tools {
		t.Run(tool.name, func(t *testing.T) {
			if _, err := exec.LookPath(tool.name); err != nil {
				t.Skipf("%s not on PATH (Debian: apt-get install lrslib libcdd-tools)", tool.name)
			}
			for k, c := range cases {
				n, err := New(c.d, c.pts)
				if err != nil {
					t.Fatal(err)
				}
				dir := t.TempDir()
				file := filepath.Join(dir, "p.ext")
				if err := writeExt(file, c.d, mustVertices(t, n)); err != nil {
					t.Fatal(err)
				}
				text, err := tool.run(dir, file)
				if err != nil {
					t.Fatalf("%s: %v", tool.name, err)
				}
				want, err := readIne(text)
				if err != nil {
					t.Fatal(err)
				}
				fs, err := n.Facets(context.Background())
				if err != nil {
					t.Fatal(err)
				}
				if got := facetStrings(fs); !slices.Equal(got, want) {
					t.Errorf("case %d: facets\n%v\n%s gives\n%v", k, got, tool.name, want)
				}
			}
		})
	}
}
