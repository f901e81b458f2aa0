package rlct

import (
	"context"
	"errors"
	"fmt"
)

// stopped returns nil while ctx (possibly nil) is live, and an error
// wrapping ctx.Err() once it is done.
func stopped(ctx context.Context) error {
	if ctx == nil {
		return nil
	}
	if err := ctx.Err(); err != nil {
		return fmt.Errorf("rlct: computation stopped: %w", err)
	}
	return nil
}

// isStop reports whether err says that a context stopped the work.
func isStop(err error) bool {
	return errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded)
}
