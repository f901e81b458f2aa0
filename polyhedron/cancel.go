package polyhedron

import (
	"context"
	"fmt"
)

// contextErr returns nil while ctx (possibly nil) is live, and an error
// wrapping ctx.Err() once it is done.
func contextErr(ctx context.Context) error {
	if ctx == nil {
		return nil
	}
	if err := ctx.Err(); err != nil {
		return fmt.Errorf("polyhedron: enumeration stopped: %w", err)
	}
	return nil
}
