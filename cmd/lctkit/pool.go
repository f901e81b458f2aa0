package main

import "sync"

// orderedMap applies work to the items that next produces, on workers
// goroutines, and hands the results to emit in the order the items were
// produced. At most window items are between next and emit at any time
// (produced, being worked on, or finished and waiting for an earlier one),
// so memory stays bounded however long the input is, and a slow item holds
// up at most window−1 later ones.
//
// next returns ok == false at the end of the input. An error from next
// ends production: the items already produced are still worked on and
// emitted, and then the error is returned. An error from emit stops
// production and emission and is returned once the workers are idle.
// next and emit run on one goroutine each, never concurrently with
// themselves; emit runs on the caller's goroutine. workers and window must
// be at least 1 (a caller mistake panics).
func orderedMap[T, R any](workers, window int, next func() (T, bool, error), work func(item T) R, emit func(R) error) error {
	if workers < 1 || window < 1 {
		panic("orderedMap: workers and window must be positive")
	}
	type job struct {
		seq  int
		item T
	}
	type done struct {
		seq int
		res R
	}
	slots := make(chan struct{}, window) // one token per item in flight
	jobs := make(chan job)
	results := make(chan done, workers)
	stop := make(chan struct{})

	var nextErr error // written by the producer before it closes jobs
	go func() {
		defer close(jobs)
		for seq := 0; ; seq++ {
			select {
			case slots <- struct{}{}:
			case <-stop:
				return
			}
			item, ok, err := next()
			if err != nil {
				nextErr = err
				return
			}
			if !ok {
				return
			}
			select {
			case jobs <- job{seq, item}:
			case <-stop:
				return
			}
		}
	}()

	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			for j := range jobs {
				results <- done{j.seq, work(j.item)}
			}
		})
	}
	go func() {
		wg.Wait()
		close(results)
	}()

	// Reorder: the items in flight have sequence numbers in
	// [emitted, emitted+window), so a ring of window entries holds them.
	ring := make([]R, window)
	ready := make([]bool, window)
	emitted := 0
	var emitErr error
	for d := range results {
		if emitErr != nil {
			continue // drain until the workers are done
		}
		k := d.seq % window
		ring[k], ready[k] = d.res, true
		for ready[emitted%window] {
			k := emitted % window
			res := ring[k]
			var zero R
			ring[k], ready[k] = zero, false
			emitted++
			<-slots
			if err := emit(res); err != nil {
				emitErr = err
				close(stop)
				break
			}
		}
	}
	if emitErr != nil {
		return emitErr
	}
	return nextErr
}
