package main

import (
	"fmt"
	"io"
)

// maxInput bounds what is read from standard input (256 MiB).
const maxInput = 256 << 20

// readExpr returns arg, or standard input when arg is "-".
func readExpr(arg string, e *env) (string, error) {
	if arg != "-" {
		return arg, nil
	}
	b, err := io.ReadAll(io.LimitReader(e.stdin, maxInput+1))
	if err != nil {
		return "", fmt.Errorf("reading standard input: %w", err)
	}
	if len(b) > maxInput {
		return "", fmt.Errorf("standard input is larger than %d MiB", maxInput>>20)
	}
	return string(b), nil
}
