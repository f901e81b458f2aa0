package main

import (
	"fmt"
	"io"
	"strings"
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

// splitNames splits "x,y,z" into names; empty input gives nil.
func splitNames(s string) ([]string, error) {
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	var out []string
	for _, f := range strings.Split(s, ",") {
		f = strings.TrimSpace(f)
		if f == "" {
			return nil, fmt.Errorf("empty variable name in %q", s)
		}
		out = append(out, f)
	}
	return out, nil
}
