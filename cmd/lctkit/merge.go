package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"slices"
	"strconv"
)

// mergeCmd merges the outputs of batch shards into the unsharded output.
type mergeCmd struct {
	Files []string `arg:"" help:"Batch outputs to merge (the shards of one sweep); - reads standard input."`
}

// Help is shown under the command's usage.
func (c *mergeCmd) Help() string {
	return `Merges the outputs of "batch --shard i/n" runs into the output of one unsharded
run: the records of all files, sorted by their "line" field. Every record is
written back byte for byte as it was read (ids with any number of digits, key
order and spacing included); only the "line" field is read to sort them.

It refuses a record without a positive integer "line" field, and two records
with the same line (shards that overlap, or a file given twice).

Example:
  lctkit batch --shard 0/2 sweep.jsonl > part0.jsonl
  lctkit batch --shard 1/2 sweep.jsonl > part1.jsonl
  lctkit merge part0.jsonl part1.jsonl > answers.jsonl`
}

// mergedRecord is one output line and the input line it answers.
type mergedRecord struct {
	line int
	data []byte
}

// Run reads every file, sorts the records and writes them.
func (c *mergeCmd) Run(e *env) error {
	var recs []mergedRecord
	for _, name := range c.Files {
		var r io.Reader = e.stdin
		if name != "-" {
			f, err := os.Open(name)
			if err != nil {
				return err
			}
			defer f.Close()
			r = f
		}
		rs, err := readRecords(r, name)
		if err != nil {
			return err
		}
		recs = append(recs, rs...)
	}
	slices.SortStableFunc(recs, func(a, b mergedRecord) int { return a.line - b.line })
	for i := 1; i < len(recs); i++ {
		if recs[i].line == recs[i-1].line {
			return fmt.Errorf("two records answer line %d: do the shards overlap, or is a file given twice?", recs[i].line)
		}
	}
	w := bufio.NewWriter(e.stdout)
	for _, r := range recs {
		w.Write(r.data)
		w.WriteByte('\n')
	}
	return w.Flush()
}

// readRecords reads the non-blank lines of r, each a JSON object with a
// top-level "line" field; name is used in messages.
func readRecords(r io.Reader, name string) ([]mergedRecord, error) {
	var out []mergedRecord
	lr := &lineReader{r: bufio.NewReader(r), max: maxRecordLine}
	keep := func(int) bool { return false }
	for {
		data, n, err := lr.next(keep)
		if errors.Is(err, io.EOF) {
			return out, nil
		}
		if err != nil {
			return nil, fmt.Errorf("%s:%d: %w", name, n, err)
		}
		if len(bytes.TrimSpace(data)) == 0 {
			continue
		}
		line, err := recordLine(data)
		if err != nil {
			return nil, fmt.Errorf("%s:%d: %w", name, n, err)
		}
		out = append(out, mergedRecord{line, bytes.Clone(data)})
	}
}

// recordLine returns the top-level "line" field of a JSON object, reading
// the other fields' values as raw bytes without interpreting them.
func recordLine(data []byte) (int, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	if t, err := dec.Token(); err != nil || t != json.Delim('{') {
		return 0, errors.New("not a JSON object")
	}
	for dec.More() {
		t, err := dec.Token()
		if err != nil {
			return 0, fmt.Errorf("not a JSON object: %w", err)
		}
		key, _ := t.(string)
		var raw json.RawMessage
		if err := dec.Decode(&raw); err != nil {
			return 0, fmt.Errorf("not a JSON object: %w", err)
		}
		if key != "line" {
			continue
		}
		n, err := strconv.Atoi(string(raw))
		if err != nil || n < 1 {
			return 0, fmt.Errorf(`the "line" field %s is not a positive integer`, raw)
		}
		return n, nil
	}
	return 0, errors.New(`no "line" field (is this the output of lctkit batch?)`)
}
