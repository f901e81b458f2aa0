package monomial

import (
	"errors"
	"fmt"
	"math/big"
)

// Config controls Parse.
type Config struct {
	Vars   []string
	Order  int
	Limits Limits
}

// Expansion is what Parse returns.
type Expansion struct {
	Poly      *Poly
	Order     int
	Truncated bool
}

// Error is a parse error with a position.
type Error struct {
	Offset, Line, Col int
	Msg               string
}

func (e *Error) Error() string { return fmt.Sprintf("%d:%d: %s", e.Line, e.Col, e.Msg) }

// ErrorList is a list of parse errors.
type ErrorList []*Error

func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

var errTODO = errors.New("monomial: parser not implemented yet")

// Parse is being written.
func Parse(src string, cfg Config) (*Expansion, error) { return nil, errTODO }

// ParseList is being written.
func ParseList(src string, cfg Config) ([]*Expansion, error) { return nil, errTODO }

// ParseRat is being written.
func ParseRat(s string) (*big.Rat, error) {
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		return nil, errTODO
	}
	return r, nil
}

// ParseBindings is being written.
func ParseBindings(s string) (names []string, values []*big.Rat, err error) { return nil, nil, errTODO }
