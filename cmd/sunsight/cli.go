package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"sort"
	"strings"
	"syscall"

	"codeberg.org/sunsight/sunsight/internal/suggest"
	"codeberg.org/sunsight/sunsight/scenario"

	"github.com/spf13/pflag"
)

// flagSet is the flag parser of every command: GNU long flags (--name value,
// --name=value) anywhere on the line, "--" ending the flags. The long name
// with one dash (-json) is read as --json too, so older command lines keep
// working; single letters (-o, -q) are the short forms.
type flagSet struct {
	*pflag.FlagSet
	// paths are the flags whose value is a path; true where "-" means
	// standard output.
	paths map[string]bool
}

// pathFlags marks the named flags as paths: a value starting with "-" is
// refused (it is the next flag, taken as the value of one whose value was
// forgotten), except "-" itself where dashOK says it means standard output.
func (fs *flagSet) pathFlags(dashOK bool, names ...string) {
	if fs.paths == nil {
		fs.paths = map[string]bool{}
	}
	for _, n := range names {
		if fs.Lookup(n) == nil {
			panic("sunsight: pathFlags: no flag " + n)
		}
		fs.paths[n] = dashOK
	}
}

// checkPaths refuses a path flag whose value looks like a flag.
func (fs *flagSet) checkPaths() error {
	names := make([]string, 0, len(fs.paths))
	for n := range fs.paths {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		f := fs.Lookup(n)
		v := f.Value.String()
		if !f.Changed || !strings.HasPrefix(v, "-") || (v == stdinName && fs.paths[n]) {
			continue
		}
		return usagef("--%s %q: the value looks like a flag, not a path (was the value of --%s left out?); give the path, or ./%s for a name that starts with \"-\"", n, v, n, v)
	}
	return nil
}

// newFlagSet returns the parser of the named command. It prints nothing
// itself: parse returns every problem as an error that runMain prints once.
func newFlagSet(name string) *flagSet {
	fs := pflag.NewFlagSet(name, pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.Usage = func() {}
	fs.SortFlags = true
	return &flagSet{FlagSet: fs}
}

// parse reads args and returns the positional arguments. On --help it
// prints the command's help on stdout and returns errHelpShown.
func (fs *flagSet) parse(args []string, stdout io.Writer) ([]string, error) {
	err := fs.Parse(longDash(fs.FlagSet, args))
	if errors.Is(err, pflag.ErrHelp) {
		printCommandHelp(stdout, commands[fs.Name()], fs)
		return nil, errHelpShown
	}
	if err != nil {
		return nil, usagef("%v%s; run 'sunsight %s --help' for the flags", err, flagHint(fs.FlagSet, err), fs.Name())
	}
	if err := fs.checkPaths(); err != nil {
		return nil, err
	}
	return fs.Args(), nil
}

// flagHint is the flag the user probably meant when err reports an unknown
// long flag (" (did you mean "--units"?)"), or "".
func flagHint(fs *pflag.FlagSet, err error) string {
	name, ok := strings.CutPrefix(err.Error(), "unknown flag: --")
	if !ok {
		return ""
	}
	var names []string
	fs.VisitAll(func(f *pflag.Flag) { names = append(names, "--"+f.Name) })
	return suggest.Hint("--"+name, names)
}

// longDash rewrites -name and -name=value into --name and --name=value when
// name is a long flag of fs (or help), leaving values, short flags and
// everything after "--" alone.
func longDash(fs *pflag.FlagSet, args []string) []string {
	out := make([]string, 0, len(args))
	for i := 0; i < len(args); i++ {
		a := args[i]
		if a == "--" {
			return append(out, args[i:]...)
		}
		name := a
		if strings.HasPrefix(a, "--") {
			name = a[2:]
		} else if strings.HasPrefix(a, "-") && len(a) > 2 {
			name = a[1:]
		} else {
			out = append(out, a)
			continue
		}
		name, _, hasValue := strings.Cut(name, "=")
		f := fs.Lookup(name)
		if f == nil && name != "help" {
			out = append(out, a)
			continue
		}
		if !strings.HasPrefix(a, "--") {
			a = "-" + a
		}
		out = append(out, a)
		// A flag that takes a value consumes the next argument as is.
		if f != nil && !hasValue && f.NoOptDefVal == "" && i+1 < len(args) {
			i++
			out = append(out, args[i])
		}
	}
	return out
}

// wantArgs checks the number of positional arguments against the command's
// usage line.
func wantArgs(name string, pos []string, lo, hi int) error {
	if len(pos) >= lo && (hi < 0 || len(pos) <= hi) {
		return nil
	}
	c := commands[name]
	if len(pos) < lo {
		return usagef("missing argument; usage: sunsight %s %s", name, c.args)
	}
	return usagef("unexpected argument %q; usage: sunsight %s %s", pos[hi], name, c.args)
}

// stdinName is the file argument that reads standard input.
const stdinName = "-"

// describeFile names a file argument in messages.
func describeFile(path string) string {
	if path == stdinName {
		return "(standard input)"
	}
	return path
}

// stdin is read where a file argument is "-" (a variable for the tests).
var stdin io.Reader = os.Stdin

// maxScenarioBytes bounds a scenario file: a real one is a few kilobytes.
const maxScenarioBytes = 1 << 20

// readInput reads a file argument ("-" is standard input), refusing one larger
// than limit bytes before reading it all.
func readInput(path string, limit int64, what string) ([]byte, error) {
	var r io.Reader
	if path == stdinName {
		r = stdin
	} else {
		f, err := os.Open(path)
		if err != nil {
			if errors.Is(err, os.ErrNotExist) {
				return nil, usagef("%s: %s does not exist; give the path of a %s (or - for standard input)", what, path, what)
			}
			return nil, usagef("%s: %v", what, err)
		}
		defer f.Close()
		if st, err := f.Stat(); err == nil && st.IsDir() {
			return nil, usagef("%s: %s is a folder; give the path of a %s", what, path, what)
		}
		r = f
	}
	data, err := io.ReadAll(io.LimitReader(r, limit+1))
	if err != nil {
		return nil, usagef("%s: reading %s: %v", what, describeFile(path), err)
	}
	if int64(len(data)) > limit {
		return nil, usagef("%s: %s is larger than %d bytes, the limit for a %s; is it the right file?", what, describeFile(path), limit, what)
	}
	return data, nil
}

// loadScenario reads, checks and resolves a scenario file ("-" is standard
// input, whose relative paths are taken from the working folder). Every
// error line names the file.
func loadScenario(path string) (*scenario.Scenario, error) {
	data, err := readInput(path, maxScenarioBytes, "scenario file")
	if err != nil {
		return nil, err
	}
	dir := "."
	if path != stdinName {
		dir = filepath.Dir(path)
	}
	if dir, err = filepath.Abs(dir); err != nil {
		return nil, err
	}
	s, err := scenario.Parse(data, dir)
	if err != nil {
		return nil, usageError{scenarioError(describeFile(path), err)}
	}
	return s, nil
}

// maxErrorLines bounds the scenario errors printed at once.
const maxErrorLines = 20

// scenarioError prefixes every line of a scenario error with the file name
// and prints at most maxErrorLines of them.
func scenarioError(file string, err error) error {
	lines := strings.Split(err.Error(), "\n")
	n := len(lines)
	if n > maxErrorLines {
		lines = lines[:maxErrorLines]
	}
	for i, l := range lines {
		lines[i] = file + ": " + strings.TrimPrefix(l, "scenario: ")
	}
	if n > maxErrorLines {
		lines = append(lines, fmt.Sprintf("%s: … and %d more problems (fix these first)", file, n-maxErrorLines))
	}
	return errors.New(strings.Join(lines, "\n"))
}

// noDefault hides the default of flags whose zero value means "not given"
// (a NaN would otherwise print as "(default NaN)").
func noDefault(fs *flagSet, names ...string) {
	for _, n := range names {
		fs.Lookup(n).DefValue = "0" // the zero value, which the help leaves out
	}
}

// errInterrupted is the error of a command stopped by a signal before it
// wrote its outputs.
var errInterrupted = errors.New("interrupted: no output written")

// interrupted is errInterrupted when err comes from an interrupt (the
// context of interruptContext cancelled), else err.
func interrupted(err error) error {
	if errors.Is(err, context.Canceled) {
		return errInterrupted
	}
	return err
}

// interruptContext is cancelled by Ctrl-C (SIGINT), SIGTERM (what batch
// schedulers send) or SIGHUP (the terminal closed): the work stops, its
// temporary files are removed, no partial output is written.
func interruptContext() (context.Context, context.CancelFunc) {
	return signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM, syscall.SIGHUP)
}
