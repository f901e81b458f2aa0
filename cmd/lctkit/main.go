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
	"slices"
	"strings"

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
	Model   modelCmd   `cmd:"" help:"Build K from a model description (regression, discrete, mixture) exactly and bound it."`
	Expand  expandCmd  `cmd:"" help:"Expand an expression into its exact canonical polynomial."`
	Penalty penaltyCmd `cmd:"" help:"Print the asymptotic penalty λ·log n − (θ−1)·log log n beside the regular one."`
	Faces   facesCmd   `cmd:"" help:"Print the Newton polyhedron: vertices, facets, compact faces with their verdicts, the principal face."`
	Draw    drawCmd    `cmd:"" help:"Draw the Newton polyhedron of K in 2 or 3 variables as an SVG picture."`
	Batch   batchCmd   `cmd:"" help:"Bound many problems given as JSON lines, on all cores, answers in input order; shardable."`
	Merge   mergeCmd   `cmd:"" help:"Merge the outputs of batch shards into one, sorted by line, every record kept byte for byte."`

	Estimate estimateCmd `cmd:"" help:"Estimate λ and θ numerically (nested sampling; an estimate, not a proof) beside the Newton bound."`
	Choose   chooseCmd   `cmd:"" help:"Choose among candidate models by the singular BIC (Drton & Plummer 2017) beside the BIC; marks scores that rest on bounds."`
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
	ctx, err := parser.Parse(expressionsLast(parser, args))
	if err != nil {
		fmt.Fprintln(e.stderr, "lctkit:", err)
		var pe *kong.ParseError
		if errors.As(err, &pe) && pe.Context != nil {
			_ = pe.Context.PrintUsage(true)
		}
		return exitUsage
	}
	if err := ctx.Run(e); err != nil {
		if wantsJSON(ctx) {
			writeJSONError(e, err)
		}
		var ee exitError
		if errors.As(err, &ee) {
			return ee.code
		}
		fmt.Fprintln(e.stderr, "lctkit:", err)
		var ue usageError
		if errors.As(err, &ue) {
			return exitUsage
		}
		return exitFailed
	}
	return exitOK
}

// expressionsLast lets arguments start with '-' where they are not flags.
// An expression argument such as '-x^2 + y^4' is moved after a final "--",
// where kong reads every argument as positional (the order of the
// positional arguments is kept); a flag value such as --lambda -1 or
// --sos '-a*b' is joined to its flag (--lambda=-1). A flag is "--name",
// "--name=value" or a declared short flag ("-h", "-o"); a flag that takes a
// value and is followed by another flag is left alone, so kong reports the
// missing value.
func expressionsLast(parser *kong.Kong, args []string) []string {
	long := map[string]string{} // flags that take a value → their long form
	short := map[string]bool{"-h": true}
	var visit func(n *kong.Node)
	visit = func(n *kong.Node) {
		for _, f := range n.Flags {
			if !f.IsBool() && !f.IsCounter() {
				long["--"+f.Name] = "--" + f.Name
				if f.Short != 0 {
					long["-"+string(f.Short)] = "--" + f.Name
				}
			}
			if f.Short != 0 {
				short["-"+string(f.Short)] = true
			}
		}
		for _, c := range n.Children {
			visit(c)
		}
	}
	visit(parser.Model.Node)
	isFlag := func(a string) bool { return strings.HasPrefix(a, "--") || short[a] }
	var out, moved []string
	for i := 0; i < len(args); i++ {
		a := args[i]
		switch name, valued := long[a]; {
		case a == "--":
			out = append(out, args[i:]...)
			i = len(args)
		case valued && i+1 < len(args) && strings.HasPrefix(args[i+1], "-") && args[i+1] != "-" && !isFlag(args[i+1]):
			out = append(out, name+"="+args[i+1])
			i++
		case valued && i+1 < len(args) && !isFlag(args[i+1]):
			out = append(out, a, args[i+1])
			i++
		case isFlag(a) || a == "-" || !strings.HasPrefix(a, "-"):
			out = append(out, a)
		default:
			moved = append(moved, a)
		}
	}
	if len(moved) == 0 {
		return out
	}
	if !slices.Contains(out, "--") {
		out = append(out, "--")
	}
	return append(out, moved...)
}

// isTerminal reports whether f is a character device (a terminal).
func isTerminal(f *os.File) bool {
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}
