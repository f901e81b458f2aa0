package main

import (
	"encoding/json"
	"strings"
	"testing"
)

func TestFacesText(t *testing.T) {
	tests := []struct {
		args  []string
		lines []string // each must appear, after collapsing runs of blanks
	}{
		{
			// P = conv{(4,0),(0,6)} + R²₊: facets 3x + 2y ≥ 12, x ≥ 0, y ≥ 0
			// (by hand); λ = 5/12, θ = 1, exact (Howald 2001, Trans. AMS
			// 353, halved for squares).
			[]string{"x^4 + y^6"},
			[]string{
				"λ = 5/12 θ = 1 (exact)",
				"meets P(K) at t_τ·τ = (12/5, 12/5), t_τ = 12/5",
				"vertices (2):",
				"(0,6) y^6 coefficient 1",
				"(4,0) x^4 coefficient 1",
				"facets (3), as a·x >= b:",
				"3*x + 2*y >= 12 compact vertices (0,6) (4,0)",
				"x >= 0 unbounded along y vertices (0,6)",
				"y >= 0 unbounded along x vertices (4,0)",
				"compact faces (3; * marks the principal face):",
				"dimension 0",
				"(0,6) y^6 nondegenerate (vertex)",
				"* (0,6) (4,0) y^6 + x^4 nondegenerate (even-positive-terms)",
				"principal face: dimension 1, codimension 1 = θ, compact, vertices (0,6) (4,0), on 3*x + 2*y = 12",
			},
		},
		{
			// (y − x²)² in (x, y): the edge (0,2)–(4,0) is degenerate,
			// vanishing where y = x², so 3/4 is only an upper bound (by hand).
			[]string{"(y - x^2)^2", "--vars", "x,y"},
			[]string{
				"λ = 3/4 θ = 1 (upper bound)",
				"x + 2*y >= 4 compact vertices (0,2) (4,0)",
				"* (0,2) (4,0) x^4 - 2*x^2*y + y^2 degenerate (edge-sturm): vanishes at x=1, y=1, where x^2*y^-1 = 1",
				"This is an upper bound, not necessarily the learning coefficient (the true λ is at most this λ, and at equal λ the true θ is at least this θ), because:",
			},
		},
		{
			// (2x − 2y)² + (3x)²: the vertex x² of K has coefficient
			// 2² + 3² = 13 (by hand).
			[]string{"--sos", "2*x - 2*y; 3*x"},
			[]string{
				"K is a sum of squares, so P(K) = 2·P(g1, …, gr)",
				"(2,0) x^2 coefficient 13 = 2^2 + 3^2 from g1, g2",
				"(0,2) y^2 coefficient 4 = (-2)^2 + 0^2 from g1, g2",
				"x + y >= 2 compact vertices (0,2) (2,0)",
			},
		},
		{
			// x² in (x, y): the principal face is the unbounded edge x = 2.
			[]string{"x^2", "--vars", "x,y"},
			[]string{
				"principal face: dimension 1, codimension 1 = θ, unbounded along y, vertices (2,0), on x = 2",
				"face polynomial: x^2",
			},
		},
		{
			// Two points: one section each.
			[]string{"x^2*(x-1)^2 + y^2", "--at", "x=0", "--at", "x=1"},
			[]string{"point 1 of 2: x=0,y=0", "point 2 of 2: x=1,y=0", "Newton polyhedron P(K) in (x, y), at x=1,y=0"},
		},
	}
	for _, tt := range tests {
		out, errOut, code := runCLI(t, "", append([]string{"faces"}, tt.args...)...)
		if code != exitOK {
			t.Errorf("%v: exit %d: %s", tt.args, code, errOut)
			continue
		}
		var collapsed []string
		for _, l := range strings.Split(out, "\n") {
			if strings.TrimRight(l, " ") != l {
				t.Errorf("%v: trailing blanks in %q", tt.args, l)
			}
			collapsed = append(collapsed, strings.Join(strings.Fields(l), " "))
		}
		for _, want := range tt.lines {
			found := false
			for _, l := range collapsed {
				if strings.Contains(l, want) {
					found = true
				}
			}
			if !found {
				t.Errorf("%v: no line with %q in\n%s", tt.args, want, out)
			}
		}
	}
}

func TestFacesJSON(t *testing.T) {
	out, errOut, code := runCLI(t, "", "faces", "x^2*y^2 + z^2", "--json")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	var rep struct {
		Lambda   string   `json:"lambda"`
		Theta    int      `json:"theta"`
		Status   string   `json:"status"`
		Hit      []string `json:"hit_point"`
		Vertices []struct {
			Exponent    []int  `json:"exponent"`
			Monomial    string `json:"monomial"`
			Coefficient string `json:"coefficient"`
		} `json:"vertices"`
		Facets []struct {
			Normal     []string `json:"normal"`
			RHS        string   `json:"rhs"`
			Inequality string   `json:"inequality"`
			Rays       []string `json:"rays"`
		} `json:"facets"`
		Faces []struct {
			Dim       int    `json:"dim"`
			Principal bool   `json:"principal"`
			Verdict   string `json:"verdict"`
		} `json:"nondegeneracy"`
		Principal struct {
			Dim   int `json:"dim"`
			Codim int `json:"codim"`
		} `json:"principal_face"`
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	// x²y² + z²: λ = 1/2 + 1/2 and θ = 2 (common practice: λ adds over
	// separate variables, and x²y² has λ = 1/2 with θ = 2); the facets are
	// x, y, z ≥ 0, x + z ≥ 2, y + z ≥ 2 and the ray meets the edge at
	// (1,1,1) (by hand).
	if rep.Lambda != "1" || rep.Theta != 2 || rep.Status != "exact" || strings.Join(rep.Hit, ",") != "1,1,1" {
		t.Errorf("λ %s θ %d %s hit %v", rep.Lambda, rep.Theta, rep.Status, rep.Hit)
	}
	if len(rep.Vertices) != 2 || rep.Vertices[1].Monomial != "x^2*y^2" || rep.Vertices[1].Coefficient != "1" {
		t.Errorf("vertices %+v", rep.Vertices)
	}
	var ineqs []string
	for _, f := range rep.Facets {
		ineqs = append(ineqs, f.Inequality)
	}
	if got := strings.Join(ineqs, "; "); got != "z >= 0; y >= 0; y + z >= 2; x >= 0; x + z >= 2" {
		t.Errorf("facets %s", got)
	}
	if len(rep.Faces) != 3 || !rep.Faces[2].Principal || rep.Faces[2].Dim != 1 || rep.Principal.Codim != 2 {
		t.Errorf("faces %+v, principal %+v", rep.Faces, rep.Principal)
	}

	out, _, code = runCLI(t, "", "faces", "x^2*(x-1)^2 + y^2", "--at", "x=0", "--at", "x=1", "--json")
	var multi struct {
		Locals []struct {
			Point []string `json:"point"`
		} `json:"locals"`
	}
	if err := json.Unmarshal([]byte(out), &multi); err != nil || code != exitOK {
		t.Fatalf("exit %d, %v\n%s", code, err, out)
	}
	if len(multi.Locals) != 2 || strings.Join(multi.Locals[1].Point, ",") != "1,0" {
		t.Errorf("locals %+v", multi.Locals)
	}

	out, _, code = runCLI(t, "", "faces", "x^2 + 1", "--json")
	if code != exitFailed || !strings.Contains(out, `"error":"rlct: K does not vanish at the point`) {
		t.Errorf("exit %d, output %s", code, out)
	}
}

// TestFacesAfterChanges: faces --after-changes describes the problem after
// the last change of coordinates and lists the answer for K with its steps.
// Values by hand: (x−y)² + z⁴ has the core z⁴ after u = x − y (λ = 1/4,
// and 1/2 + 1/4 for K); y²(x−y)² + x⁶ becomes y²x² + (x+y)⁶ after
// x → x + y, whose ray along (1, 1) meets the vertex (2, 2): λ = 1/2,
// θ = 2; (x−y)² reduces to a core 0, so K itself is described, with its
// Newton value 1 (the ray meets the edge x + y = 2 at t = 1) beside the
// answer 1/2 for K.
func TestFacesAfterChanges(t *testing.T) {
	for _, tc := range []struct {
		expr          string
		after         string
		vars          string
		lambda        string
		theta         int
		whole, wholeS string // λ and status of the answer for K, "" when no change
	}{
		{"(x-y)^2 + z^4", "reduction", "z", "1/4", 1, "3/4", "exact"},
		{"y^2*(x-y)^2 + x^6", "repair", "y,x", "1/2", 2, "1/2", "exact"},
		{"(x-y)^2", "", "x,y", "1", 1, "1/2", "exact"},
		{"x^4 + y^6", "", "x,y", "5/12", 1, "", ""},
	} {
		t.Run(tc.expr, func(t *testing.T) {
			out, errOut, code := runCLI(t, "", "faces", tc.expr, "--after-changes", "--json")
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			var d struct {
				After  string   `json:"after"`
				Vars   []string `json:"variables"`
				Lambda string   `json:"lambda"`
				Theta  int      `json:"theta"`
				Whole  *struct {
					Lambda  string   `json:"lambda"`
					Status  string   `json:"status"`
					Changes []string `json:"changes"`
				} `json:"whole"`
			}
			if err := json.Unmarshal([]byte(out), &d); err != nil {
				t.Fatalf("%v\n%s", err, out)
			}
			if d.After != tc.after || strings.Join(d.Vars, ",") != tc.vars || d.Lambda != tc.lambda || d.Theta != tc.theta {
				t.Errorf("after %q in %v: λ %s θ %d, want %q in %s: λ %s θ %d", d.After, d.Vars, d.Lambda, d.Theta, tc.after, tc.vars, tc.lambda, tc.theta)
			}
			switch {
			case tc.whole == "" && d.Whole != nil:
				t.Errorf("whole %+v, want none", d.Whole)
			case tc.whole != "" && d.Whole == nil:
				t.Errorf("no whole answer")
			case tc.whole != "" && (d.Whole.Lambda != tc.whole || d.Whole.Status != tc.wholeS || len(d.Whole.Changes) == 0):
				t.Errorf("whole %+v, want λ %s (%s) with changes", d.Whole, tc.whole, tc.wholeS)
			}
			text, _, _ := runCLI(t, "", "faces", tc.expr, "--after-changes")
			if tc.whole != "" && !strings.HasPrefix(text, "answer for K: λ = "+tc.whole) {
				t.Errorf("text does not start with the answer for K:\n%s", text)
			}
		})
	}
}

// TestNoChangeFlags: --no-reduce gives the Newton value of K itself;
// --no-repair keeps the reduction and turns off the repair. Values by
// hand: (x−y)² + z⁴ has the Newton value 5/4 (the ray along (1,1,1) meets
// the face through (2,0,0), (0,2,0), (0,0,4) at t = 4/5; the edge
// (x − y)² is degenerate, so an upper bound) and 3/4 after u = x − y;
// y²(x−y)² + x⁶ has no quadratic part to split off and needs the repair
// (x → x + y) for its exact 1/2, θ = 2; without it the Newton value is the
// same pair, only an upper bound (the edge y²(y − x)² is degenerate).
func TestNoChangeFlags(t *testing.T) {
	for _, tc := range []struct {
		expr, flag      string
		lambda          string
		theta           int
		status          string
		reduced, repair bool
	}{
		{"(x-y)^2 + z^4", "--no-reduce", "5/4", 1, "upper-bound", false, false},
		{"(x-y)^2 + z^4", "--no-repair", "3/4", 1, "exact", true, false},
		{"y^2*(x-y)^2 + x^6", "--no-repair", "1/2", 2, "upper-bound", false, false},
		{"y^2*(x-y)^2 + x^6", "--no-reduce", "1/2", 2, "upper-bound", false, false},
		{"y^2*(x-y)^2 + x^6", "", "1/2", 2, "exact", false, true},
	} {
		t.Run(tc.expr+" "+tc.flag, func(t *testing.T) {
			args := []string{"bound", tc.expr, "--json"}
			if tc.flag != "" {
				args = append(args, tc.flag)
			}
			out, errOut, code := runCLI(t, "", args...)
			if code != exitOK {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			var r struct {
				Lambda    string `json:"lambda"`
				Theta     int    `json:"theta"`
				Status    string `json:"status"`
				Reduction any    `json:"reduction"`
				Repair    any    `json:"repair"`
			}
			if err := json.Unmarshal([]byte(out), &r); err != nil {
				t.Fatalf("%v\n%s", err, out)
			}
			if r.Lambda != tc.lambda || r.Theta != tc.theta || r.Status != tc.status || (r.Reduction != nil) != tc.reduced || (r.Repair != nil) != tc.repair {
				t.Errorf("λ %s θ %d %s reduced %v repaired %v, want λ %s θ %d %s reduced %v repaired %v",
					r.Lambda, r.Theta, r.Status, r.Reduction != nil, r.Repair != nil, tc.lambda, tc.theta, tc.status, tc.reduced, tc.repair)
			}
		})
	}
}
