package main

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"runtime"
	"runtime/debug"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"github.com/lctkit/lctkit/monomial"
	"github.com/lctkit/lctkit/rlct"
)

// maxRecordLine is the longest input line batch accepts (64 MiB); a longer
// line gives an error record and reading goes on at the next line. It is a
// variable for tests.
var maxRecordLine = 64 << 20

// batchGCPercent is the garbage collector target during a batch run.
const batchGCPercent = 400

// batchCmd bounds many problems given as JSON lines.
type batchCmd struct {
	File      string        `arg:"" optional:"" default:"-" help:"JSON lines input, one problem per line; - or nothing reads standard input."`
	Workers   int           `help:"Records computed at once (default: all cores, GOMAXPROCS)." placeholder:"N"`
	Shard     string        `help:"Answer only the lines L with (L−1) mod n = i, for 0 ≤ i < n (the first line belongs to shard 0/n); other lines give no output." placeholder:"i/n"`
	Timeout   time.Duration `help:"Give up on a record after this long (0: never), e.g. 10s or 1m." placeholder:"10s"`
	MaxTerms  int           `help:"Most terms an expansion may have (0: the library default, 2,000,000)." placeholder:"N"`
	MaxFaces  int           `name:"max-faces" help:"Most compact faces the certificate of one record examines before it stops with an upper bound (default 20000)." placeholder:"N"`
	Brief     bool          `help:"Leave out the faces (the principal face and the faces that decided the status); λ, θ, status, summary, reasons and the certificate's counts stay."`
	NoChanges bool          `name:"no-changes" help:"Make no change of coordinates (no reduction, no repair): each record gets the Newton value of K itself, as bound --no-reduce gives."`

	shardIndex, shardCount int
}

// Help is shown under the command's usage.
func (c *batchCmd) Help() string {
	return `Reads one problem per line as a JSON object and writes one JSON object per
input line, in input order, to standard output: what "bound --json" prints,
with "id" (the input's id, verbatim) and "line" (the input line number, from 1)
added in front.

Input fields:
  id     any JSON value, echoed back unchanged (numbers keep every digit)
  k      K as an expression, or
  sos    generators ["g1", "g2"] of K = g1^2 + g2^2 + … (or one string "g1; g2")
  prior  "x=1,y=1/2" (optional)
  at     "x=0,y=1/3" or a list of such points (optional)
  order  series truncation degree, an integer, or "auto" (the default:
         raise the order until the omitted terms are certified)
  vars   "x,y,z" or ["x", "y", "z"] (optional)
  model  a model description (see lctkit model --help), one string or a list
         of its lines, instead of k or sos; only id and order may go with it
Any other field is an error. A record with a model gets its name in "model".

Every input line gives exactly one output line, whatever happens. A line that
cannot be answered (malformed JSON, an unknown field, a parse error, K not
vanishing, a term limit, a timeout) gives {"id": …, "line": N, "error": "…"},
with the id when it could be read, and the run goes on. A blank line (only
white space) gives {"line": N, "error": "blank line"}. A line longer than
64 MiB gives an error record and reading resumes after it.

"status" is "exact", "upper-bound" or "uncertified" (a value from a truncated
series that is not known to bound the truth: it may lie below it), and
"summary" says in words what it claims. Only the faces that could be degenerate
are examined, and the search stops at the first degenerate face, so a record
stays small whatever the size of K. --brief also leaves out the principal face
and the faces that decided the status.

Records are computed on --workers goroutines and written in input order as
each one is ready (at most 16 records per worker are held in memory), so the
output can be followed while the run goes on, and an interrupted run keeps
every record written. --shard i/n splits one input among n runs (on n machines, say): the
outputs of shards 0/n, 1/n, …, (n−1)/n together hold every line exactly once,
and sorting their concatenation by "line" gives the unsharded output.

--no-changes turns off the changes of coordinates (the splitting off of regular
directions and the repair of degenerate edges), so every record gets the
Newton value of K as given, as "bound --no-reduce" does.

--timeout limits each record, from reading it to its answer. When it passes
while faces are being examined, the record gets its value with status
"upper-bound" and the reason "budget reached"; when it passes earlier (building
the Newton polyhedron), the record gives the error "timed out after 10s" (for
--timeout 10s). Parsing and expanding K are not interrupted (--max-terms bounds
them), so a record stuck there ends late, and is still reported as timed out.

A progress line is drawn on standard error when it is a terminal, and a summary
line is always printed there at the end.

Exit status: 0 every record answered; 3 some records carry an error; 2 usage
error (a bad flag); 1 the input could not be read (or the output written).

Examples:
  lctkit batch problems.jsonl > answers.jsonl
  echo '{"id": 1, "k": "x^4 + y^6"}' | lctkit batch
  lctkit batch --shard 0/4 --timeout 30s --max-terms 100000 problems.jsonl`
}

// options are the library options of every record.
func (c *batchCmd) options() *rlct.Options {
	return &rlct.Options{MaxFaces: c.MaxFaces, NoReduction: c.NoChanges, NoRepair: c.NoChanges}
}

// Validate checks the flags before Run.
func (c *batchCmd) Validate() error {
	if c.Workers < 0 {
		return errors.New("--workers must be positive")
	}
	if c.Timeout < 0 {
		return errors.New("--timeout must not be negative")
	}
	if c.MaxTerms < 0 {
		return errors.New("--max-terms must not be negative")
	}
	if c.MaxFaces < 0 {
		return errors.New("--max-faces must not be negative")
	}
	c.shardIndex, c.shardCount = 0, 1
	if c.Shard != "" {
		i, n, err := parseShard(c.Shard)
		if err != nil {
			return fmt.Errorf("--shard: %w", err)
		}
		c.shardIndex, c.shardCount = i, n
	}
	return nil
}

// parseShard reads "i/n" with 0 ≤ i < n.
func parseShard(s string) (i, n int, err error) {
	a, b, ok := strings.Cut(s, "/")
	if ok {
		i, err = strconv.Atoi(strings.TrimSpace(a))
		if err == nil {
			n, err = strconv.Atoi(strings.TrimSpace(b))
		}
	}
	if !ok || err != nil {
		return 0, 0, fmt.Errorf("%q is not of the form i/n", s)
	}
	if n < 1 || i < 0 || i >= n {
		return 0, 0, fmt.Errorf("%q: want n ≥ 1 and 0 ≤ i < n", s)
	}
	return i, n, nil
}

// batchItem is one input line on its way to a worker.
type batchItem struct {
	line int
	data []byte
	err  error // set when the line could not be taken (too long)
}

// batchAnswer is one output line, encoded, and whether it is an error.
type batchAnswer struct {
	json   []byte
	failed bool
}

// batchReply is one output line: the id and line number, then the result
// or the error.
type batchReply struct {
	ID   json.RawMessage `json:"id,omitempty"`
	Line int             `json:"line"`
	// Model is the name of the model, for a record that gives a model
	// description.
	Model string `json:"model,omitempty"`
	result
}

// Run reads, computes and writes the records.
func (c *batchCmd) Run(e *env) error {
	// A batch keeps a small live heap (a window of records) but allocates
	// fast, so the default GC target makes the collector take most of a
	// core and the workers cannot scale. A larger target keeps peak
	// memory in tens of MB (measured: 37 MB for 10,000 low-rank records
	// with two workers) and lets two workers run 1.7× faster than one,
	// against 1.1× at the default. GOGC in the environment still wins.
	if os.Getenv("GOGC") == "" {
		defer debug.SetGCPercent(debug.SetGCPercent(batchGCPercent))
	}
	in := e.stdin
	name := "standard input"
	if c.File != "-" {
		f, err := os.Open(c.File)
		if err != nil {
			return err // exit 1: the input cannot be read
		}
		defer f.Close()
		in, name = f, c.File
	}
	workers := c.Workers
	if workers == 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	lines := &lineReader{r: bufio.NewReaderSize(in, 64<<10), max: maxRecordLine}
	skip := func(n int) bool { return (n-1)%c.shardCount != c.shardIndex }
	next := func() (batchItem, bool, error) {
		for {
			data, n, err := lines.next(skip)
			if err == io.EOF {
				return batchItem{}, false, nil
			}
			if err != nil && !errors.Is(err, errLineTooLong) {
				return batchItem{}, false, fmt.Errorf("reading %s at line %d: %w", name, n, err)
			}
			if skip(n) {
				continue
			}
			return batchItem{line: n, data: data, err: err}, true, nil
		}
	}

	var done, failed atomic.Int64
	start := time.Now()
	stopProgress := c.progress(e, start, &done, &failed)
	emit := func(a batchAnswer) error {
		if _, err := e.stdout.Write(a.json); err != nil {
			return fmt.Errorf("writing the output: %w", err)
		}
		done.Add(1)
		if a.failed {
			failed.Add(1)
		}
		return nil
	}
	err := orderedMap(workers, 16*workers, next, c.answer, emit)
	stopProgress()

	elapsed := time.Since(start)
	n, nf := done.Load(), failed.Load()
	shard := ""
	if c.shardCount > 1 {
		shard = fmt.Sprintf(" (shard %d/%d of %d lines)", c.shardIndex, c.shardCount, lines.count)
	}
	fmt.Fprintf(e.stderr, "lctkit batch: %d records%s, %d with errors, in %s (%.0f records/s)\n",
		n, shard, nf, elapsed.Round(time.Millisecond), float64(n)/max(elapsed.Seconds(), 1e-9))
	if err != nil {
		return err
	}
	if nf > 0 {
		return exitError{code: exitRecords}
	}
	return nil
}

// progress starts redrawing a progress line on stderr four times a second
// when stderr is a terminal, and returns the function that clears it.
func (c *batchCmd) progress(e *env, start time.Time, done, failed *atomic.Int64) func() {
	if !e.stderrTerminal {
		return func() {}
	}
	quit := make(chan struct{})
	var wg sync.WaitGroup
	wg.Go(func() {
		tick := time.NewTicker(250 * time.Millisecond)
		defer tick.Stop()
		for {
			select {
			case <-quit:
				fmt.Fprint(e.stderr, "\r\x1b[K")
				return
			case <-tick.C:
				n := done.Load()
				fmt.Fprintf(e.stderr, "\r\x1b[Klctkit batch: %d records, %d with errors, %.0f records/s",
					n, failed.Load(), float64(n)/time.Since(start).Seconds())
			}
		}
	})
	return func() {
		close(quit)
		wg.Wait()
	}
}

// answer computes one record and encodes its output line. It never fails:
// every problem becomes an error record.
func (c *batchCmd) answer(it batchItem) (a batchAnswer) {
	reply := batchReply{Line: it.line}
	defer func() {
		if r := recover(); r != nil { // a bug, not bad input: keep the run going
			reply.result = result{Error: fmt.Sprintf("internal error (please report it): %v", r)}
		}
		if reply.Error != "" {
			a.failed = true
		}
		b, err := encodeJSON(&reply)
		if err != nil { // cannot happen: the id was validated
			reply.ID = nil
			reply.result = result{Error: "cannot encode the answer: " + err.Error()}
			b, _ = encodeJSON(&reply)
			a.failed = true
		}
		a.json = append(b, '\n')
	}()
	reply.result = c.solve(it, &reply.ID, &reply.Model)
	return a
}

// solve answers one record; it sets *id as soon as the id is known, and
// *name to the model's name for a record with a model description.
func (c *batchCmd) solve(it batchItem, id *json.RawMessage, name *string) result {
	if it.err != nil {
		return result{Error: it.err.Error()}
	}
	if it.line == 1 { // a byte order mark, as some editors write
		it.data = bytes.TrimPrefix(it.data, []byte("\ufeff"))
	}
	if len(bytes.TrimSpace(it.data)) == 0 {
		return result{Error: "blank line"}
	}
	ctx := context.Background()
	if c.Timeout > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, c.Timeout)
		defer cancel()
	}
	rec, err := rlct.DecodeRecord(it.data)
	*id = rec.ID
	if err != nil {
		return result{Error: err.Error()}
	}
	rec.Spec.Limits = monomial.Limits{MaxTerms: c.MaxTerms}
	var r *rlct.Result
	if rec.Model != "" {
		r, err = boundModel(ctx, rec, c.MaxTerms, c.options(), name)
	} else {
		_, r, err = rec.Spec.Bound(ctx, c.options())
	}
	if err != nil && ctx.Err() != nil {
		return result{Error: "timed out after " + c.Timeout.String()}
	}
	if err != nil {
		msg := err.Error()
		if hint := settingHint(err, recordHints); hint != "" {
			msg += " (" + hint + ")"
		}
		return result{Error: msg}
	}
	if c.Brief {
		r = withoutFaces(r)
	}
	return result{Result: r}
}

// withoutFaces returns a copy of r, and of its local results, without the
// faces: the principal face, the full face list and the faces that decided
// the certificate.
func withoutFaces(r *rlct.Result) *rlct.Result {
	b := *r
	b.Principal = rlct.Face{}
	b.Faces = nil
	if r.Certificate != nil {
		cert := *r.Certificate
		cert.Deciding = nil
		b.Certificate = &cert
	}
	b.Locals = nil
	for _, l := range r.Locals {
		b.Locals = append(b.Locals, withoutFaces(l))
	}
	return &b
}

// errLineTooLong is returned by lineReader.next for a line over its limit.
var errLineTooLong = errors.New("line too long")

// lineReader splits its input into lines of any length up to max bytes,
// without the "\n" or "\r\n" that ends them; a last line without "\n"
// counts. It reads through bufio.Reader.ReadSlice, so its buffer need not
// hold a whole line.
type lineReader struct {
	r     *bufio.Reader
	max   int
	count int // lines returned so far
}

// next returns the next line and its number (from 1), io.EOF at the end,
// or an error wrapping errLineTooLong (with the number) for a line over
// the limit, whose rest is skipped. When skip(number) is true the line is
// read past and nil is returned for it, whatever its length.
func (lr *lineReader) next(skip func(int) bool) (data []byte, number int, err error) {
	number = lr.count + 1
	keep := !skip(number)
	var buf []byte
	size := 0 // bytes read for this line, its end included
	for {
		chunk, err := lr.r.ReadSlice('\n')
		size += len(chunk)
		if keep && size <= lr.max+2 { // room for "\r\n"
			buf = append(buf, chunk...)
		}
		if err == bufio.ErrBufferFull {
			continue
		}
		if err == io.EOF && size == 0 {
			return nil, lr.count, io.EOF
		}
		if err != nil && err != io.EOF {
			return nil, number, err
		}
		break
	}
	lr.count = number
	if !keep {
		return nil, number, nil
	}
	buf = bytes.TrimSuffix(buf, []byte("\n"))
	buf = bytes.TrimSuffix(buf, []byte("\r"))
	if size > lr.max+2 || len(buf) > lr.max {
		return nil, number, fmt.Errorf("%w: line %d is longer than the limit of %s", errLineTooLong, number, byteSize(lr.max))
	}
	if buf == nil {
		buf = []byte{}
	}
	return buf, number, nil
}

// byteSize writes n bytes as "64 MiB", "10 KiB" or "100 bytes".
func byteSize(n int) string {
	switch {
	case n >= 1<<20 && n%(1<<20) == 0:
		return fmt.Sprintf("%d MiB", n>>20)
	case n >= 1<<10 && n%(1<<10) == 0:
		return fmt.Sprintf("%d KiB", n>>10)
	}
	return fmt.Sprintf("%d bytes", n)
}
