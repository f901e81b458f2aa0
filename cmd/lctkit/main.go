// Command lctkit bounds and, when it can certify them, computes learning
// coefficients (the real log canonical threshold λ and its multiplicity θ)
// through the Newton polyhedron. It is a thin layer over the packages
// monomial, polyhedron and rlct: each command parses its flags, calls the
// library and formats the answer.
//
// Exit codes:
//
//	0  success
//	1  the input was read but could not be answered (a bad expression, K not
//	   vanishing at the point, a limit exceeded, …)
//	2  usage error (unknown command or flag, malformed flag value)
//	3  batch: the run finished but some records carry an error
package main

import (
	"errors"
	"fmt"
	"io"
	"os"

	"github.com/alecthomas/kong"
)

// version is the program version printed by --version.
var version = "0.1.0"

// Exit codes; see the package comment.
const (
	exitOK      = 0
	exitFailed  = 1
	exitUsage   = 2
	exitRecords = 3
)

// cli is the command tree.
type cli struct {
	Version kong.VersionFlag `help:"Print the version and exit."`

	Bound   boundCmd   `cmd:"" help:"Bound the learning coefficient λ and multiplicity θ of K; exact when certified."`
	Expand  expandCmd  `cmd:"" help:"Expand an expression into its exact canonical polynomial."`
	Penalty penaltyCmd `cmd:"" help:"Print the asymptotic penalty λ·log n − (θ−1)·log log n beside the regular one."`
	Faces   facesCmd   `cmd:"" help:"Print the Newton polyhedron: vertices, facets, compact faces with their verdicts, the principal face."`
	Draw    drawCmd    `cmd:"" help:"Draw the Newton polyhedron of K in 2 or 3 variables as an SVG picture."`
	Batch   batchCmd   `cmd:"" help:"Bound many problems given as JSON lines, on all cores, answers in input order; shardable."`

	Estimate estimateCmd `cmd:"" help:"Estimate λ and θ numerically (nested sampling; an estimate, not a proof) beside the Newton bound."`
}

// env is what commands read from and write to; tests replace it.
type env struct {
	stdin          io.Reader
	stdout, stderr io.Writer
	// stderrTerminal is true when stderr is an interactive terminal, which
	// turns on progress lines.
	stderrTerminal bool
}

// exitError carries an exit code out of a command after its message has
// been printed; err, when set, is the error that was shown.
type exitError struct {
	code int
	err  error
}

func (e exitError) Error() string { return fmt.Sprintf("exit status %d", e.code) }

// kongExit is the panic value used to stop kong from calling os.Exit.
type kongExit struct{ code int }

func main() {
	os.Exit(run(os.Args[1:], &env{stdin: os.Stdin, stdout: os.Stdout, stderr: os.Stderr, stderrTerminal: isTerminal(os.Stderr)}))
}

// run executes one command line and returns the exit code.
func run(args []string, e *env) (code int) {
	var c cli
	parser, err := kong.New(&c,
		kong.Name("lctkit"),
		kong.Description("Learning coefficients of singular models through the Newton polyhedron: exact upper bounds, and exact values when certified."),
		kong.UsageOnError(),
		kong.Writers(e.stdout, e.stderr),
		kong.Vars{"version": "lctkit " + version},
		kong.Exit(func(code int) { panic(kongExit{code}) }),
	)
	if err != nil {
		fmt.Fprintln(e.stderr, "lctkit:", err)
		return exitFailed
	}
	defer func() {
		if r := recover(); r != nil {
			k, ok := r.(kongExit)
			if !ok {
				panic(r)
			}
			code = k.code
			if code == 1 { // kong reports usage errors as 1
				code = exitUsage
			}
		}
	}()
	ctx, err := parser.Parse(args)
	if err != nil {
		fmt.Fprintln(e.stderr, "lctkit:", err)
		var pe *kong.ParseError
		if errors.As(err, &pe) && pe.Context != nil {
			_ = pe.Context.PrintUsage(true)
		}
		return exitUsage
	}
	if err := ctx.Run(e); err != nil {
		var ee exitError
		if errors.As(err, &ee) {
			return ee.code
		}
		fmt.Fprintln(e.stderr, "lctkit:", err)
		return exitFailed
	}
	return exitOK
}

// isTerminal reports whether f is a character device (a terminal).
func isTerminal(f *os.File) bool {
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}
