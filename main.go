// Command labmatch checks a laboratory PVT report, converts its differential-liberation data
// to separator conditions, scores and tunes the published black-oil correlations against it,
// and exports the tuned fluid description. See README.md and DESIGN.md §6.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"strings"
)

// Exit codes (DESIGN.md §6).
const (
	exitOK    = 0
	exitData  = 1
	exitUsage = 2
)

// version is the tool version written into tuning files and reports.
const version = "0.1.0"

// command is one subcommand: its name, one-line summary, usage line and entry point.
type command struct {
	name    string
	summary string
	usage   string
	run     func(args []string, stdout, stderr io.Writer) int
}

func commands() []command {
	return []command{
		{"open", "open the workbench on a report folder",
			"labmatch open DIR [--tuning F]", runOpen},
		{"samples", "list the built-in demo reports, or write them out as folders",
			"labmatch samples [--out DIR] [--force]", runSamples},
		{"check", "load a report folder and list its QC findings (exit 1 on any error)",
			"labmatch check DIR [--json]", runCheck},
		{"calc", "evaluate the correlations once for an oil or a gas",
			"labmatch calc oil|gas [flags]", runCalc},
		{"rank", "score every correlation family, published and tuned, on a report",
			"labmatch rank DIR [--json]", runRank},
		{"tune", "tune the chosen families to a report and print parameters and statistics",
			"labmatch tune DIR [--pb ID ...] [--json] [--save F] [--tuning F]", runTune},
		{"tables", "black-oil tables (CSV, or a simulator deck) from the tuned model",
			"labmatch tables DIR|TUNING_FILE [--format csv|deck] [--units field|metric] [--out F]", runTables},
		{"report", "a self-contained HTML report with SVG plots",
			"labmatch report DIR [--tuning F] [--out F.html]", runReport},
		{"survey", "rank and tune every family over a regional PVT database, with cross-validation", "labmatch survey FILE [--folds K] [--seed N] [--refit] [--json] [--out F.csv]", runSurvey},
	}
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// run dispatches to a subcommand and returns the process exit code.
func run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		return runDefault(stdout, stderr)
	}
	switch args[0] {
	case "-h", "--help", "-help", "help":
		usage(stdout)
		return exitOK
	case "--version", "version":
		fmt.Fprintln(stdout, "labmatch", version)
		return exitOK
	}
	for _, c := range commands() {
		if c.name == args[0] {
			return c.run(args[1:], stdout, stderr)
		}
	}
	fmt.Fprintf(stderr, "labmatch: unknown command %q\n\n", args[0])
	usage(stderr)
	return exitUsage
}

func usage(w io.Writer) {
	fmt.Fprint(w, `labmatch: check a lab PVT report and tune black-oil correlations to it.

Usage:
  labmatch                 the workbench on the built-in demo report (in a terminal;
                           otherwise a summary of it)
`)
	for _, c := range commands() {
		fmt.Fprintf(w, "  %-24s %s\n", c.name, c.summary)
	}
	fmt.Fprint(w, `
Run "labmatch COMMAND --help" for a command's flags.
Units: flags accept a unit after the number (2000psia, 150bar, 93degC, 107sm3/sm3);
a plain number is in field units (psia, degF, scf/STB, rb/STB, cP).

Correlation results are estimates, valid only near the data they were fitted to. Check them
against the lab report and local practice; facility, well-control and reserves decisions rest
with qualified engineers and local regulations.
`)
}

// parseFlags parses flags and positional arguments in any order ("check DIR --json" and
// "check --json DIR" both work). It returns the positional arguments, or an exit code ≥ 0
// when parsing ended the command (help asked for, or a usage error already reported).
func parseFlags(fs *flag.FlagSet, args []string, stdout, stderr io.Writer) ([]string, int) {
	fs.SetOutput(io.Discard)
	var pos []string
	for {
		err := fs.Parse(args)
		if errors.Is(err, flag.ErrHelp) {
			fs.SetOutput(stdout)
			fs.Usage()
			return nil, exitOK
		}
		if err != nil {
			fmt.Fprintf(stderr, "labmatch %s: %v\n", fs.Name(), err)
			fs.SetOutput(stderr)
			fs.Usage()
			return nil, exitUsage
		}
		if fs.NArg() == 0 {
			return pos, -1
		}
		pos = append(pos, fs.Arg(0))
		args = fs.Args()[1:]
	}
}

// newFlagSet makes a flag set whose usage prints the command's usage line and flags.
func newFlagSet(name, usageLine, about string) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.Usage = func() {
		w := fs.Output()
		fmt.Fprintf(w, "Usage: %s\n\n%s\n", usageLine, strings.TrimSpace(about))
		first := true
		fs.VisitAll(func(f *flag.Flag) {
			if first {
				fmt.Fprintln(w, "\nFlags:")
				first = false
			}
			name, use := flag.UnquoteUsage(f)
			fmt.Fprintf(w, "  --%s", f.Name)
			if name != "" {
				fmt.Fprintf(w, " %s", name)
			}
			fmt.Fprintf(w, "\n        %s", use)
			if f.DefValue != "" && f.DefValue != "false" && f.DefValue != "0" {
				fmt.Fprintf(w, " (default %s)", f.DefValue)
			}
			fmt.Fprintln(w)
		})
	}
	return fs
}

// usageError reports a usage mistake with the command's usage and returns exit 2.
func usageError(fs *flag.FlagSet, stderr io.Writer, format string, a ...any) int {
	fmt.Fprintf(stderr, "labmatch %s: %s\n", fs.Name(), fmt.Sprintf(format, a...))
	fs.SetOutput(stderr)
	fs.Usage()
	return exitUsage
}
