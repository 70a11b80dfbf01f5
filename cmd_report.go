package main

import (
	"fmt"
	"io"

	"labmatch/export"
)

func runReport(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("report", "labmatch report DIR [--tuning F] [--units field|metric] [--out F.html] [--force]",
		`Write one self-contained HTML file (no script, no external reference; printable and
readable on a phone): the fluid summary, the QC findings, the ranking tables with the
leave-one-out errors, the tuned parameters with intervals and depths, for each tuned
property an SVG plot (lab points, published and tuned curves, excluded points, Pb), its
depth ladder and residuals, the tuned fluid at a few pressures, the cautions, the report
fingerprint, the tool version and the date.

DIR (or demo:<id>) is tuned afresh with the best-ranked families and default options, or
takes the families, parameters and options of --tuning F. Default output: standard output.

--units metric shows every number, table and plot axis in bara, °C, sm3/sm3, m3/sm3,
mPa·s, kg/m3 and 1/bar (default field: psia, °F, scf/STB, rb/STB, cP, lbm/ft3, 1/psi). The
tuning parameters stay as the fit engine defines them: multipliers and bends are ratios,
refitted coefficients belong to the published equations in field units, and a shift is
given in its field unit with the metric equivalent beside it. The QC findings, the no-fit
remarks, the fluid-type rule and the leave-one-out notes are quoted in field units, as the
checks word them.`)
	tuning := fs.String("tuning", "", "use the families, parameters and options of tuning file `F`")
	units := fs.String("units", "field", "unit `system` of every number and axis: field (psia, °F, scf/STB) or metric (bara, °C, sm3/sm3)")
	out := fs.String("out", "", "write the report to `F.html` (default: standard output)")
	force := fs.Bool("force", false, "overwrite an existing --out file; apply a --tuning file made from other report files")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one report folder, got %d arguments", len(pos))
	}
	u, err := export.ParseUnits(*units)
	if err != nil {
		return usageError(fs, stderr, "--units %q: want field or metric", *units)
	}
	if refuseExisting(*out, *force, stderr) {
		return exitData
	}
	tf, code := loadTuned(pos[0], *tuning, *force, false, stderr)
	if code >= 0 {
		return code
	}
	in := export.ReportInput{Tool: tf.source.Tool, Report: tf.report, Dataset: tf.ds, Results: tf.results,
		Options: tf.opts, Model: tf.model, Origin: tf.source.Origin, Units: u}
	if *out == "" {
		if err := export.WriteReport(stdout, in); err != nil {
			fmt.Fprintln(stderr, err)
			return exitData
		}
		return exitOK
	}
	if err := export.SaveReport(*out, in, *force); err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	fmt.Fprintf(stdout, "report written: %s (%d tuned properties)\n", *out, len(tf.results))
	fmt.Fprintln(stdout, "Correlation results are estimates; check them against the lab report and local practice.")
	return exitOK
}
