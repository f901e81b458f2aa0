package instances

import (
	"bytes"
	"fmt"
	"slices"
	"strings"
	"testing"
)

func TestSizes(t *testing.T) {
	tests := []struct {
		in   Instance
		d, n int
	}{
		// ((BA)_ij)² has one monomial per i, j and unordered pair k <= l:
		// M·N·H(H+1)/2 of them, all distinct (they record i, j, k, l).
		{LowRank(3, 3, 3), 18, 54},
		{LowRank(4, 4, 3), 24, 96},
		{LowRank(2, 2, 2), 8, 12},
		// monomials of degree D in d variables: C(D+d−1, d−1)
		{Degree(3, 20), 3, 231},
		{Degree(8, 5), 8, 792},
		{Degree(10, 10), 10, 92378}, // C(19, 9)
		{Random(6, 1000, Seed), 6, 1000},
		{Dense(10, 100, Seed), 10, 100},
	}
	for _, tc := range tests {
		if tc.in.D != tc.d || len(tc.in.Points) != tc.n {
			t.Errorf("%s: d = %d, N = %d, want %d, %d", tc.in.Name, tc.in.D, len(tc.in.Points), tc.d, tc.n)
		}
		seen := map[string]bool{}
		for _, p := range tc.in.Points {
			key := fmt.Sprint(p)
			if strings.HasPrefix(tc.in.Name, "lowrank") || strings.HasPrefix(tc.in.Name, "degree") {
				if seen[key] {
					t.Errorf("%s: duplicate point %v", tc.in.Name, p)
				}
			}
			seen[key] = true
			if strings.HasPrefix(tc.in.Name, "random") {
				nz := 0
				for _, x := range p {
					if x != 0 {
						nz++
						if x > 12 {
							t.Errorf("exponent %d > 12", x)
						}
					}
				}
				if nz < 2 || nz > 4 {
					t.Errorf("random point %v has %d nonzeros", p, nz)
				}
			}
		}
	}
	if !slices.EqualFunc(Random(6, 50, Seed).Points, Random(6, 50, Seed).Points, slices.Equal) {
		t.Errorf("Random is not deterministic")
	}
}

func TestReadWrite(t *testing.T) {
	in := LowRank(2, 2, 2)
	var buf bytes.Buffer
	if err := Write(&buf, in); err != nil {
		t.Fatal(err)
	}
	out, err := Read(&buf)
	if err != nil {
		t.Fatal(err)
	}
	if out.Name != in.Name || out.D != in.D || !slices.EqualFunc(out.Points, in.Points, slices.Equal) {
		t.Errorf("round trip changed the instance")
	}
	for _, bad := range []struct{ text, want string }{
		{"# x\n2\n", "line 2"},
		{"2 1\n1 2 3\n", "line 2"},
		{"2 2\n1 2\n", "header announces 2"},
		{"2 1\n1 x\n", "line 2"},
	} {
		_, err := Read(strings.NewReader(bad.text))
		if err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("Read(%q): err = %v, want mention of %q", bad.text, err, bad.want)
		}
	}
}
