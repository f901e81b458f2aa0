package main

import (
	"bytes"
	"fmt"
	"io"
	"strconv"
	"testing"
)

// BenchmarkBatch runs `lctkit batch --brief` in-process over records of
// the examples/lowrank family (fresh draws, fixed seed) with one and two
// workers, and reports records per second. The ratio of the two shows how
// well the reorder window keeps both workers busy.
//
//	go test ./cmd/lctkit -run '^$' -bench Batch/records=10000 -benchtime 1x
func BenchmarkBatch(b *testing.B) {
	for _, size := range []int{1000, 10000} {
		input := lowRankInput(size, 2)
		for _, workers := range []int{1, 2} {
			b.Run(fmt.Sprintf("records=%d/workers=%d", size, workers), func(b *testing.B) {
				b.ReportAllocs()
				args := []string{"batch", "--brief", "--workers", strconv.Itoa(workers)}
				for b.Loop() {
					var errOut bytes.Buffer
					e := &env{stdin: bytes.NewReader(input), stdout: io.Discard, stderr: &errOut}
					if code := run(args, e); code != exitOK {
						b.Fatalf("exit %d: %s", code, errOut.String())
					}
				}
				b.ReportMetric(float64(size)*float64(b.N)/b.Elapsed().Seconds(), "records/s")
			})
		}
	}
}
