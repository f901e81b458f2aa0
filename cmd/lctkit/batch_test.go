package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
	"time"
)

// batchLine is the part of an output record the tests look at.
type batchLine struct {
	ID     json.RawMessage `json:"id"`
	Line   int             `json:"line"`
	Lambda string          `json:"lambda"`
	Theta  int             `json:"theta"`
	Status string          `json:"status"`
	Locals []struct {
		Lambda string `json:"lambda"`
	} `json:"locals"`
	Error   string   `json:"error"`
	Reasons []string `json:"reasons"`
}

// parseBatch splits batch output into records, failing on anything that
// is not one JSON object per line.
func parseBatch(t *testing.T, out string) []batchLine {
	t.Helper()
	var recs []batchLine
	for i, l := range strings.Split(strings.TrimSuffix(out, "\n"), "\n") {
		if out == "" {
			break
		}
		var r batchLine
		if err := json.Unmarshal([]byte(l), &r); err != nil {
			t.Fatalf("output line %d is not a JSON object: %v\n%s", i+1, err, l)
		}
		recs = append(recs, r)
	}
	return recs
}

func TestBatchMixedInput(t *testing.T) {
	type want struct {
		id     string // raw JSON of the id; "" for none
		lambda string // "" when an error is expected
		theta  int
		status string
		err    string // part of the error message
	}
	cases := []struct {
		line string
		want want
	}{
		// Howald 2001, Multiplier ideals of monomial ideals, Trans. AMS 353:
		// lct(x^2, y^3) = 5/6, halved for squares: λ = 5/12, θ = 1, exact.
		{`{"id": 1, "k": "x^4 + y^6"}`, want{id: `1`, lambda: "5/12", theta: 1, status: "exact"}},
		{``, want{err: "blank line"}},
		// (x−y)² is degenerate on its edge: the Newton value 1 is only an
		// upper bound (the true λ is 1/2 after u = x − y; Watanabe 2009,
		// Algebraic Geometry and Statistical Learning Theory, ch. 2,
		// coordinate invariance).
		{`{"id":12345678901234567890123,"k":"(x-y)^2"}`, want{id: `12345678901234567890123`, lambda: "1/2", theta: 1, status: "exact"}}, // through the reduction u = x − y (hand)
		{`{"id": 3, "k": "x^2"`, want{id: `3`, err: "invalid JSON"}},
		{`not json at all`, want{err: "invalid JSON at byte"}},
		{`{"id": "p", "k": "x^2 + (y*"}`, want{id: `"p"`, err: "k: 1:10: expected operand"}},
		{`{"id": [5], "k": "x^2 + 1"}`, want{id: `[5]`, err: "does not vanish"}},
		{`{"id": 6, "k": "x^2", "weight": 1}`, want{id: `6`, err: `unknown field "weight"`}},
		{`{"id": 7, "k": "(x + y + z)^40"}`, want{id: `7`, err: "more than the limit 100"}},
		{"   \t ", want{err: "blank line"}},
		// Several points: at x = 0, K ~ x² + y² (λ = 1); at x = 1, with
		// u = x − 1, K ~ u⁴ + y² (λ = 1/2·(1/2 + 1) = 3/4, Howald 2001,
		// halved). The minimum is 3/4, θ = 1.
		{`{"id": 8, "k": "x^2*(x-1)^4 + y^2", "at": ["x=0", "x=1"]}`, want{id: `8`, lambda: "3/4", theta: 1, status: "exact"}},
		// Reduced rank regression with H = 1, M = N = 2 at a true map of rank
		// 0: λ = min(M, N)/2 = 1, θ = 2 (Aoyagi & Watanabe 2005, Stochastic
		// complexities of reduced rank regression in Bayesian estimation,
		// Neural Networks 18, main theorem, M + N + H odd; from memory).
		{`{"id": {"shape": "2x2"}, "sos": ["b1*a1", "b1*a2", "b2*a1", "b2*a2"]}`, want{id: `{"shape":"2x2"}`, lambda: "1", theta: 2, status: "exact"}},
		{`{"id": 10, "sos": "x*y; z", "vars": ["x", "y", "z"]}`, want{id: `10`, lambda: "1", theta: 2, status: "exact"}},
		{"{\"id\": 11, \"k\": \"x^2+y^2\"}\r", want{id: `11`, lambda: "1", theta: 1, status: "exact"}},
	}
	var in strings.Builder
	for _, c := range cases {
		in.WriteString(c.line + "\n")
	}
	out, errOut, code := runCLI(t, in.String(), "batch", "--max-terms", "100")
	if code != exitRecords {
		t.Errorf("exit %d, want %d (some records carry errors); stderr:\n%s", code, exitRecords, errOut)
	}
	recs := parseBatch(t, out)
	if len(recs) != len(cases) {
		t.Fatalf("%d output lines for %d input lines:\n%s", len(recs), len(cases), out)
	}
	for i, c := range cases {
		r, w := recs[i], c.want
		if r.Line != i+1 {
			t.Errorf("record %d: line %d, want %d", i+1, r.Line, i+1)
		}
		if string(r.ID) != w.id {
			t.Errorf("line %d: id %s, want %s", i+1, r.ID, w.id)
		}
		if w.err != "" {
			if !strings.Contains(r.Error, w.err) || r.Lambda != "" {
				t.Errorf("line %d: error %q (λ %q), want an error containing %q", i+1, r.Error, r.Lambda, w.err)
			}
			continue
		}
		if r.Error != "" || r.Lambda != w.lambda || r.Theta != w.theta || r.Status != w.status {
			t.Errorf("line %d: got λ %q θ %d %q error %q; want λ %s θ %d %s", i+1, r.Lambda, r.Theta, r.Status, r.Error, w.lambda, w.theta, w.status)
		}
	}
	// The id is echoed digit for digit: never through a float64.
	if !strings.Contains(out, `"id":12345678901234567890123,`) {
		t.Errorf("the big id was not echoed exactly:\n%s", out)
	}
	if !strings.Contains(errOut, "lctkit batch: 14 records, 8 with errors") {
		t.Errorf("summary line missing or wrong:\n%s", errOut)
	}
	if strings.Contains(errOut, "\r") {
		t.Errorf("progress drawn although stderr is not a terminal:\n%q", errOut)
	}
}

func TestBatchAllFine(t *testing.T) {
	out, errOut, code := runCLI(t, `{"k": "x^2"}`, "batch") // no final newline
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	recs := parseBatch(t, out)
	if len(recs) != 1 || recs[0].Line != 1 || recs[0].ID != nil || recs[0].Lambda != "1/2" {
		t.Errorf("got %s", out)
	}
	out, _, code = runCLI(t, "", "batch")
	if code != exitOK || out != "" {
		t.Errorf("empty input: exit %d, output %q", code, out)
	}
	out, _, code = runCLI(t, "\ufeff{\"id\": 1, \"k\": \"x^2\"}\r\n{\"id\": 2, \"k\": \"y^2\"}\r\n", "batch")
	if recs := parseBatch(t, out); code != exitOK || len(recs) != 2 || recs[1].Lambda != "1/2" {
		t.Errorf("byte order mark and CRLF: exit %d, output %s", code, out)
	}
}

// sweepInput returns n records of the low-rank family, some repeated
// shapes and a few bad lines, for the comparisons between runs.
func sweepInput(n int) string {
	rng := rand.New(rand.NewPCG(7, 11))
	var b strings.Builder
	for i := range n {
		switch {
		case i%17 == 5:
			b.WriteString("\n")
		case i%23 == 9:
			fmt.Fprintf(&b, `{"id": %d, "k": "x^2 +"}`+"\n", i)
		default:
			rec := randomLowRank(rng, i, sweepShapes)
			line, _ := json.Marshal(rec)
			b.Write(line)
			b.WriteByte('\n')
		}
	}
	return b.String()
}

func TestBatchWorkersAgree(t *testing.T) {
	in := sweepInput(150)
	one, _, code1 := runCLI(t, in, "batch", "--workers", "1")
	four, _, code4 := runCLI(t, in, "batch", "--workers", "4")
	if code1 != exitRecords || code4 != exitRecords {
		t.Fatalf("exit %d and %d, want %d", code1, code4, exitRecords)
	}
	if one != four {
		t.Errorf("--workers 1 and --workers 4 differ")
	}
	if got := len(parseBatch(t, one)); got != 150 {
		t.Errorf("%d records for 150 lines", got)
	}
}

func TestBatchShards(t *testing.T) {
	in := sweepInput(100)
	whole, _, _ := runCLI(t, in, "batch", "--workers", "2")
	var got []string
	seen := map[int]int{}
	for i := range 3 {
		out, errOut, _ := runCLI(t, in, "batch", "--shard", fmt.Sprintf("%d/3", i))
		for _, r := range parseBatch(t, out) {
			seen[r.Line]++
			if (r.Line-1)%3 != i {
				t.Errorf("shard %d/3 answered line %d", i, r.Line)
			}
		}
		got = append(got, strings.SplitAfter(strings.TrimSuffix(out, "\n"), "\n")...)
		if !strings.Contains(errOut, fmt.Sprintf("(shard %d/3 of 100 lines)", i)) {
			t.Errorf("shard summary: %s", errOut)
		}
	}
	for l := 1; l <= 100; l++ {
		if seen[l] != 1 {
			t.Errorf("line %d answered %d times by the shards", l, seen[l])
		}
	}
	lineOf := func(s string) int {
		var r batchLine
		_ = json.Unmarshal([]byte(s), &r)
		return r.Line
	}
	slices.SortStableFunc(got, func(a, b string) int { return lineOf(a) - lineOf(b) })
	for i := range got {
		got[i] = strings.TrimSuffix(got[i], "\n")
	}
	if strings.Join(got, "\n")+"\n" != whole {
		t.Errorf("the shards' outputs sorted by line differ from the whole run")
	}
}

func TestBatchUsageErrors(t *testing.T) {
	for _, args := range [][]string{
		{"batch", "--shard", "3/3"},
		{"batch", "--shard", "-1/2"},
		{"batch", "--shard", "1/0"},
		{"batch", "--shard", "a/b"},
		{"batch", "--shard", "1"},
		{"batch", "--workers", "-2"},
		{"batch", "--timeout", "-1s"},
		{"batch", "--timeout", "soon"},
		{"batch", "--max-terms", "-5"},
	} {
		_, errOut, code := runCLI(t, `{"k": "x^2"}`, args...)
		if code != exitUsage {
			t.Errorf("%v: exit %d, want %d; stderr:\n%s", args, code, exitUsage, errOut)
		}
	}
	_, errOut, code := runCLI(t, "", "batch", "/nonexistent/problems.jsonl")
	if code != exitFailed || !strings.Contains(errOut, "no such file") {
		t.Errorf("missing file: exit %d, stderr %s", code, errOut)
	}
}

// failingReader returns its data and then an error.
type failingReader struct {
	data io.Reader
}

func (r *failingReader) Read(p []byte) (int, error) {
	n, err := r.data.Read(p)
	if err == io.EOF {
		return n, errors.New("device unplugged")
	}
	return n, err
}

func TestBatchReadError(t *testing.T) {
	var out, errOut bytes.Buffer
	in := &failingReader{strings.NewReader("{\"id\": 1, \"k\": \"x^2\"}\n{\"id\": 2, \"k\": \"y^2\"}\n")}
	code := run([]string{"batch"}, &env{stdin: in, stdout: &out, stderr: &errOut})
	if code != exitFailed {
		t.Errorf("exit %d, want %d", code, exitFailed)
	}
	if recs := parseBatch(t, out.String()); len(recs) != 2 {
		t.Errorf("the records read before the error were not all written:\n%s", out.String())
	}
	if !strings.Contains(errOut.String(), "device unplugged") || !strings.Contains(errOut.String(), "line 3") {
		t.Errorf("stderr: %s", errOut.String())
	}
}

func TestBatchTimeout(t *testing.T) {
	// The generators x_i² + x_j² (i < j ≤ 12) have two terms each, so every
	// one of the 4,095 compact faces of their polyhedron must be examined
	// and none can stop the search early: seconds of work, against well
	// under a millisecond for the other records. The deadline ends the
	// search: the record keeps its value (λ = 12/4 = 3, worked by hand: P(I)
	// is the simplex spanned by the 2·e_i) with status upper-bound and the
	// budget reason, and the run does not wait for the search to finish.
	var gens []string
	for i := 1; i <= 12; i++ {
		for j := i + 1; j <= 12; j++ {
			gens = append(gens, fmt.Sprintf("x%d^2 + x%d^2", i, j))
		}
	}
	slow, _ := json.Marshal(map[string]any{"id": "slow", "sos": gens})
	in := `{"id": 1, "k": "x^4 + y^6"}` + "\n" + string(slow) + "\n" + `{"id": 3, "k": "x^2 + y^4"}` + "\n"
	start := time.Now()
	out, errOut, code := runCLI(t, in, "batch", "--timeout", "300ms", "--workers", "2")
	if code != exitOK {
		t.Errorf("exit %d, want %d; stderr %s", code, exitOK, errOut)
	}
	recs := parseBatch(t, out)
	if len(recs) != 3 {
		t.Fatalf("%d records:\n%s", len(recs), out)
	}
	if recs[1].Status != "upper-bound" || recs[1].Lambda != "3" || string(recs[1].ID) != `"slow"` ||
		!strings.Contains(strings.Join(recs[1].Reasons, " "), "budget reached") {
		t.Errorf("slow record: %+v", recs[1])
	}
	// Howald 2001, Trans. AMS 353, halved: 5/12 and 3/4.
	if recs[0].Lambda != "5/12" || recs[2].Lambda != "3/4" {
		t.Errorf("fast records: %+v, %+v", recs[0], recs[2])
	}
	// Not a speed target: only a search that ignores its deadline misses it.
	if elapsed := time.Since(start); elapsed > 20*time.Second {
		t.Errorf("the run took %v with a 300ms timeout", elapsed)
	}
}

func TestBatchLongLines(t *testing.T) {
	// A valid line of several megabytes is read whole.
	bigID := strings.Repeat("w", 3<<20)
	in := fmt.Sprintf(`{"id": "%s", "k": "x^2"}`+"\n"+`{"id": 2, "k": "y^4"}`+"\n", bigID)
	out, _, code := runCLI(t, in, "batch")
	recs := parseBatch(t, out)
	if code != exitOK || len(recs) != 2 || string(recs[0].ID) != `"`+bigID+`"` || recs[1].Lambda != "1/4" {
		t.Fatalf("exit %d, %d records", code, len(recs))
	}

	// A line over the limit gives an error record and reading goes on.
	defer func(m int) { maxRecordLine = m }(maxRecordLine)
	maxRecordLine = 1 << 20
	in = `{"id": 1, "k": "x^2"}` + "\n" + `{"id": "` + strings.Repeat("w", 2<<20) + `", "k": "x^2"}` + "\n" + `{"id": 3, "k": "y^2"}`
	out, _, code = runCLI(t, in, "batch")
	recs = parseBatch(t, out)
	if code != exitRecords || len(recs) != 3 {
		t.Fatalf("exit %d, %d records:\n%.300s", code, len(recs), out)
	}
	if recs[1].Line != 2 || recs[1].Error != "line too long: line 2 is longer than the limit of 1 MiB" || recs[2].Lambda != "1/2" {
		t.Errorf("got %+v and %+v", recs[1], recs[2])
	}
}

func TestBatchProgressOnTerminal(t *testing.T) {
	var out, errOut bytes.Buffer
	in := sweepInput(20)
	code := run([]string{"batch"}, &env{stdin: strings.NewReader(in), stdout: &out, stderr: &errOut, stderrTerminal: true})
	if code != exitRecords {
		t.Errorf("exit %d", code)
	}
	// The progress line is cleared with \r at the end, and the summary
	// follows on a line of its own.
	if !strings.Contains(errOut.String(), "\r") || !strings.Contains(errOut.String(), "lctkit batch: 20 records") {
		t.Errorf("stderr %q", errOut.String())
	}
}

func TestLineReader(t *testing.T) {
	tests := []struct {
		in   string
		max  int
		want []string // "!" marks a line that is too long
	}{
		{"", 10, nil},
		{"\n", 10, []string{""}},
		{"a", 10, []string{"a"}},
		{"a\n", 10, []string{"a"}},
		{"a\r\nb\r\n", 10, []string{"a", "b"}},
		{"a\n\nb", 10, []string{"a", "", "b"}},
		{"0123456789\n01234567890\nx", 10, []string{"0123456789", "!", "x"}},
		{"0123456789\r\n", 10, []string{"0123456789"}},
		{strings.Repeat("z", 100) + "\nshort\n", 10, []string{"!", "short"}},
	}
	for _, tt := range tests {
		// A 16-byte buffer (bufio's minimum) makes the long lines span reads.
		lr := &lineReader{r: bufio.NewReaderSize(strings.NewReader(tt.in), 16), max: tt.max}
		var got []string
		for {
			data, n, err := lr.next(func(int) bool { return false })
			if err == io.EOF {
				break
			}
			if n != len(got)+1 {
				t.Errorf("%q: line number %d, want %d", tt.in, n, len(got)+1)
			}
			if errors.Is(err, errLineTooLong) {
				got = append(got, "!")
				continue
			}
			if err != nil {
				t.Fatal(err)
			}
			got = append(got, string(data))
		}
		if !slices.Equal(got, tt.want) {
			t.Errorf("%q: got %q, want %q", tt.in, got, tt.want)
		}
	}
	// Skipped lines are counted but not kept, whatever their length.
	lr := &lineReader{r: bufio.NewReaderSize(strings.NewReader("a\n"+strings.Repeat("z", 100)+"\nc\n"), 16), max: 10}
	var kept []string
	for {
		data, n, err := lr.next(func(n int) bool { return n == 2 })
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatal(err)
		}
		if n == 2 && data != nil {
			t.Errorf("skipped line returned %q", data)
		}
		if data != nil {
			kept = append(kept, string(data))
		}
	}
	if !slices.Equal(kept, []string{"a", "c"}) || lr.count != 3 {
		t.Errorf("kept %q after %d lines", kept, lr.count)
	}
}

func TestOrderedMap(t *testing.T) {
	for _, tc := range []struct{ workers, window, n int }{{1, 1, 50}, {3, 1, 50}, {4, 5, 300}, {8, 64, 1000}} {
		var inFlight, peak atomic.Int64
		var mu sync.Mutex
		i := 0
		next := func() (int, bool, error) {
			if i == tc.n {
				return 0, false, nil
			}
			i++
			v := inFlight.Add(1)
			mu.Lock()
			peak.Store(max(peak.Load(), v))
			mu.Unlock()
			return i, true, nil
		}
		work := func(x int) int {
			time.Sleep(time.Duration((x*7919)%5) * 10 * time.Microsecond) // out of order
			return x * x
		}
		var got []int
		emit := func(y int) error {
			inFlight.Add(-1)
			got = append(got, y)
			return nil
		}
		if err := orderedMap(tc.workers, tc.window, next, work, emit); err != nil {
			t.Fatal(err)
		}
		if len(got) != tc.n {
			t.Fatalf("%+v: %d results", tc, len(got))
		}
		for k, y := range got {
			if y != (k+1)*(k+1) {
				t.Fatalf("%+v: result %d is %d, want %d", tc, k, y, (k+1)*(k+1))
			}
		}
		if peak.Load() > int64(tc.window) {
			t.Errorf("%+v: %d items in flight, window %d", tc, peak.Load(), tc.window)
		}
	}
}

func TestOrderedMapErrors(t *testing.T) {
	// An error from next: what was produced is still emitted, in order.
	i := 0
	next := func() (int, bool, error) {
		if i == 5 {
			return 0, false, errors.New("read failed")
		}
		i++
		return i, true, nil
	}
	var got []int
	err := orderedMap(3, 4, next, func(x int) int { return x }, func(x int) error { got = append(got, x); return nil })
	if err == nil || err.Error() != "read failed" || !slices.Equal(got, []int{1, 2, 3, 4, 5}) {
		t.Errorf("error %v, emitted %v", err, got)
	}

	// An error from emit stops the run, even on an endless input.
	j := 0
	endless := func() (int, bool, error) { j++; return j, true, nil }
	count := 0
	err = orderedMap(2, 8, endless, func(x int) int { return x }, func(x int) error {
		count++
		if x == 10 {
			return errors.New("disk full")
		}
		return nil
	})
	if err == nil || err.Error() != "disk full" || count != 10 {
		t.Errorf("error %v after %d emits", err, count)
	}
}

// Shards merged by "lctkit merge" give the unsharded output byte for byte,
// including an id of 30 digits that a float would round.
func TestMergeShards(t *testing.T) {
	const bigID = "123456789012345678901234567890"
	var in strings.Builder
	in.WriteString(`{"id": ` + bigID + `, "k": "x^4 + y^6"}` + "\n")
	for i := 2; i <= 9; i++ {
		fmt.Fprintf(&in, `{"id": {"line": %d}, "k": "x^%d + y^2"}`+"\n", 100-i, 2*i)
	}
	in.WriteString("{\"id\": \"bad\", \"k\": \"x^2 +\"}\n")
	whole, _, _ := runCLI(t, in.String(), "batch")
	dir := t.TempDir()
	var parts []string
	for i := range 3 {
		out, _, _ := runCLI(t, in.String(), "batch", "--shard", fmt.Sprintf("%d/3", i))
		name := filepath.Join(dir, fmt.Sprintf("part%d.jsonl", i))
		if err := os.WriteFile(name, []byte(out), 0o644); err != nil {
			t.Fatal(err)
		}
		parts = append(parts, name)
	}
	merged, errOut, code := runCLI(t, "", append([]string{"merge"}, parts[2], parts[0], parts[1])...)
	if code != exitOK || merged != whole {
		t.Fatalf("exit %d (%s); merged output differs from the unsharded one:\n%s\nwant:\n%s", code, errOut, merged, whole)
	}
	if !strings.Contains(merged, `"id":`+bigID+`,`) {
		t.Errorf("the 30-digit id was not kept: %s", merged)
	}
	// Overlapping shards and foreign lines are refused.
	if _, errOut, code := runCLI(t, "", "merge", parts[0], parts[0]); code != exitFailed || !strings.Contains(errOut, "two records answer line 1") {
		t.Errorf("a file given twice: exit %d, %s", code, errOut)
	}
	if _, errOut, code := runCLI(t, `{"lambda": "1"}`+"\n", "merge", "-"); code != exitFailed || !strings.Contains(errOut, `-:1: no "line" field`) {
		t.Errorf("a record without line: exit %d, %s", code, errOut)
	}
}
