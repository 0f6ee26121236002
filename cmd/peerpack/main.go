// Command peerpack turns an indicator dataset and a Markdown brief into a
// print-ready PDF pack on how one institution compares with its peers.
//
// This file only wires subcommands, flags and exit codes; the work is in
// internal/build and the packages it calls.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"syscall"

	"peerpack/internal/limits"
	"peerpack/internal/yamlx"
)

// Exit codes.
const (
	exitOK    = 0
	exitInput = 1 // bad input or failed build
	exitUsage = 2 // wrong usage
)

type command struct {
	name    string
	summary string
	usage   string
	run     func(ctx context.Context, env *env, args []string) int
}

// env carries the process's streams so commands are testable.
type env struct {
	stdout, stderr io.Writer
	quiet, verbose bool
	limits         limits.Limits
}

// limitFlag collects repeated --limit name=value[,name=value] flags.
type limitFlag struct{ lim *limits.Limits }

func (f limitFlag) String() string { return "" }

func (f limitFlag) Set(v string) error {
	l, err := f.lim.Parse(v)
	if err != nil {
		return err
	}
	*f.lim = l
	return nil
}

func (e *env) infof(format string, args ...any) {
	if !e.quiet {
		fmt.Fprintf(e.stderr, format, args...)
	}
}

func (e *env) debugf(format string, args ...any) {
	if e.verbose {
		fmt.Fprintf(e.stderr, format, args...)
	}
}

func (e *env) errorf(format string, args ...any) {
	fmt.Fprintf(e.stderr, "peerpack: "+format, args...)
}

var commands []*command

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	code := run(ctx, &env{stdout: os.Stdout, stderr: os.Stderr}, os.Args[1:])
	stop()
	os.Exit(code)
}

func run(ctx context.Context, e *env, args []string) (code int) {
	defer func() {
		if r := recover(); r != nil {
			e.errorf("internal error: %v\nThis is a bug in peerpack; please report it with the command you ran.\n", r)
			code = exitInput
		}
	}()
	if len(args) == 0 {
		usage(e.stderr)
		return exitUsage
	}
	name := args[0]
	switch name {
	case "-h", "--help", "-help":
		usage(e.stdout)
		return exitOK
	case "--version", "-version":
		name = "version"
	}
	for _, c := range commands {
		if c.name == name {
			return c.run(ctx, e, args[1:])
		}
	}
	e.errorf("unknown command %q\n", name)
	if s := nearestCommand(name); s != "" {
		fmt.Fprintf(e.stderr, "Did you mean %q?\n", s)
	}
	fmt.Fprintf(e.stderr, "Run 'peerpack help' for the list of commands.\n")
	return exitUsage
}

func usage(w io.Writer) {
	fmt.Fprintf(w, `peerpack builds a print-ready PDF briefing pack on how one institution
compares with its peers, from an indicator dataset and a Markdown brief.

Usage:
  peerpack <command> [arguments]

Commands:
`)
	for _, c := range commands {
		fmt.Fprintf(w, "  %-9s %s\n", c.name, c.summary)
	}
	fmt.Fprintf(w, `
Run 'peerpack help <command>' or 'peerpack <command> -h' for details and examples.
Exit codes: 0 ok, 1 bad input or failed build, 2 wrong usage.
`)
}

// newFlags makes a flag set that prints the command's usage on -h and never
// exits by itself.
func newFlags(c *command, e *env) *flag.FlagSet {
	fs := flag.NewFlagSet(c.name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.BoolVar(&e.quiet, "quiet", false, "print only errors")
	fs.BoolVar(&e.verbose, "verbose", false, "print each stage as it runs")
	e.limits = limits.Default()
	fs.Var(limitFlag{&e.limits}, "limit", "raise or lower an input limit, name=value[,name=value] (repeatable; see 'peerpack help limits')")
	return fs
}

// parseArgs parses flags placed before, between or after the positional
// arguments ("build brief.md -o pack.pdf" and "build -o pack.pdf brief.md"
// both work), which Go's flag package alone does not do.
func parseArgs(c *command, e *env, fs *flag.FlagSet, args []string) ([]string, int, bool) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				printCommandHelp(e.stdout, c, fs)
				return nil, exitOK, false
			}
			e.errorf("%s: %v\n", c.name, err)
			fmt.Fprintf(e.stderr, "Run 'peerpack %s -h' for usage.\n", c.name)
			return nil, exitUsage, false
		}
		rest := fs.Args()
		if len(rest) == 0 {
			return pos, exitOK, true
		}
		if rest[0] == "--" {
			return append(pos, rest[1:]...), exitOK, true
		}
		pos = append(pos, rest[0])
		args = rest[1:]
	}
}

func printCommandHelp(w io.Writer, c *command, fs *flag.FlagSet) {
	fmt.Fprintf(w, "%s\n\n%s\n", c.summary, c.usage)
	fmt.Fprintf(w, "\nFlags:\n")
	fs.SetOutput(w)
	fs.VisitAll(func(f *flag.Flag) {
		name, u := flag.UnquoteUsage(f)
		if name != "" {
			name = " " + name
		}
		fmt.Fprintf(w, "  --%s%s\n      %s\n", f.Name, name, u)
	})
	fs.SetOutput(io.Discard)
}

func nearestCommand(s string) string {
	names := make([]string, len(commands))
	for i, c := range commands {
		names[i] = c.name
	}
	return yamlx.Nearest(s, names)
}
