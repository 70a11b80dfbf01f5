package main

import (
	"fmt"
	"io"
	"math"

	"labmatch/lab"
)

func runCheck(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("check", "labmatch check DIR [--json]",
		"Load a report folder (or demo:<id>) and list its QC findings, grouped by file, worst\nfirst. Exit status 1 when the folder cannot be read or any finding is an error.")
	asJSON := fs.Bool("json", false, "print the findings as a JSON array")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one report folder, got %d arguments", len(pos))
	}
	r, err := loadReport(pos[0])
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	findings := lab.Check(r)
	if *asJSON {
		if findings == nil {
			findings = []lab.Finding{}
		}
		if code := writeJSON(stdout, stderr, findings); code != exitOK {
			return code
		}
	} else {
		fmt.Fprintf(stdout, "%s: %s, %.0f degF, Pb %.0f psia, %.1f API\n", pos[0], r.Fluid.Sample, r.Fluid.Temperature, r.Fluid.Pb, r.Fluid.API)
		printProcessing(stdout, r)
		fmt.Fprintln(stdout)
		lab.FormatFindings(stdout, findings)
	}
	for _, f := range findings {
		if f.Severity == lab.Error {
			return exitData
		}
	}
	return exitOK
}

// printProcessing summarises what the report gives the tuning: the separator basis, the
// CCE's Y-function and implied saturation pressure, and the undersaturated compressibility.
func printProcessing(w io.Writer, r *lab.Report) {
	if b, err := r.SeparatorBasis(); err == nil {
		fmt.Fprintf(w, "separator basis (test %s): Rsb %.0f scf/STB, Bob %.4f rb/STB; DL at Pb: Rsdb %.0f scf/bbl, Bodb %.4f\n",
			b.Test, b.Rsfb, b.Bofb, b.Rsdb, b.Bodb)
	} else {
		fmt.Fprintf(w, "separator basis: %v\n", err)
	}
	if len(r.CCE) == 0 {
		return
	}
	if y, err := lab.FitY(r.Fluid.Pb, r.CCE); err == nil {
		fmt.Fprintf(w, "CCE Y-function: Y = %.4g + %.4g·p (p in psia), r² %.4f over %d points\n", y.A, y.B, y.R2, len(y.Points))
	}
	if e, err := lab.ImpliedPsat(r.Fluid.Pb, r.CCE); err == nil {
		fmt.Fprintf(w, "saturation pressure implied by the CCE: %.0f psia (reported %.0f, %+.2f %%)\n", e.Psat, e.Reported, noNegZero(100*(e.Psat/e.Reported-1), 2))
	}
	if _, fit, err := lab.UndersaturatedCo(r.Fluid.Pb, r.CCE); err == nil {
		note := ""
		if !(fit.Co(r.Fluid.Pb) > 0) || !(fit.Co(fit.Pmax) > 0) {
			note = " (not physical: see cce-co-negative below)"
		}
		fmt.Fprintf(w, "undersaturated co from the CCE: %.3g 1/psi at Pb, %.3g 1/psi at %.0f psia%s\n", fit.Co(r.Fluid.Pb), fit.Co(fit.Pmax), fit.Pmax, note)
	}
}

// noNegZero returns v, or 0 where v rounds to zero at the given decimals, so that "%+.2f" does
// not print "-0.00".
func noNegZero(v float64, decimals int) float64 {
	if math.Abs(v) < 0.5*math.Pow(10, -float64(decimals)) {
		return 0
	}
	return v
}
