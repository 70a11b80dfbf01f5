package main

import (
	"fmt"
	"io"
	"os"

	"github.com/charmbracelet/lipgloss"
	"github.com/charmbracelet/x/term"
	"github.com/muesli/termenv"

	"labmatch/lab"
	"labmatch/samples"
	"labmatch/tui"
)

// isTerminal reports whether w is a terminal (the workbench needs one).
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	return ok && term.IsTerminal(f.Fd())
}

// runOpen is "labmatch open DIR [--tuning F]": the workbench on a report folder.
func runOpen(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("open", "labmatch open DIR [--tuning F] [--force]",
		"Open the workbench on a report folder (or demo:<id>). A report that cannot be read shows\nits error on screen with file, line and column. Keys: ? in the workbench.")
	tuning := fs.String("tuning", "", "apply the families and parameters of tuning file `F`")
	force := fs.Bool("force", false, "apply a --tuning file made from other report files")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one report folder, got %d arguments", len(pos))
	}
	dir := pos[0]
	return runWorkbench(dir, func() (*lab.Report, error) { return loadReport(dir) }, *tuning, *force, stdout, stderr)
}

// runWorkbench opens the workbench when stdout is a terminal.
func runWorkbench(name string, load func() (*lab.Report, error), tuning string, force bool, stdout, stderr io.Writer) int {
	if !isTerminal(stdout) {
		fmt.Fprintln(stderr, "labmatch open: the workbench needs a terminal; for scripts use check, rank and tune")
		return exitUsage
	}
	noColor := os.Getenv("NO_COLOR") != ""
	r := lipgloss.NewRenderer(stdout)
	if noColor {
		// NO_COLOR drops colour, not emphasis: keep bold and inverted (reverse) text.
		r.SetColorProfile(termenv.ANSI)
	}
	opts := append([]tui.Option{tui.WithReport(name, load), tui.WithTuningFile(tuning, force),
		tui.WithRenderer(r, noColor), tui.WithTool("labmatch " + version)}, workbenchExporters()...)
	err := tui.Run(opts...)
	if err != nil {
		fmt.Fprintln(stderr, "labmatch:", err)
		return exitData
	}
	return exitOK
}

// runDefault is plain "labmatch": the workbench on the built-in demo report in a terminal,
// else the summary that scripts and CI read.
func runDefault(stdout, stderr io.Writer) int {
	if !isTerminal(stdout) {
		return runDemo(stdout, stderr)
	}
	return runWorkbench("demo:"+samples.Default, func() (*lab.Report, error) { return samples.Load(samples.Default) }, "", false, stdout, stderr)
}
