package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"labmatch/export"
	"labmatch/fit"
	"labmatch/lab"
)

// tunedFluid is a tuned fluid description and where it came from.
type tunedFluid struct {
	report  *lab.Report // nil when it comes from a tuning file alone
	ds      *fit.Dataset
	results map[fit.PropertyID]fit.Result
	opts    fit.Options
	model   *fit.Model
	source  export.Source
	maxLab  float64 // highest pressure of the report's data, psia
}

// loadTuned builds the tuned model from a report folder (tuned afresh with the best-ranked
// families, or with the families and parameters of a tuning file) or from a tuning file alone.
// On failure it reports the error and returns the exit code (≥ 0).
func loadTuned(arg, tuning string, force, allowFile bool, stderr io.Writer) (*tunedFluid, int) {
	fail := func(err error) (*tunedFluid, int) {
		fmt.Fprintln(stderr, err)
		return nil, exitData
	}
	tool := "labmatch " + version
	if allowFile && tuning == "" && !strings.HasPrefix(arg, "demo:") {
		if st, err := os.Stat(arg); err == nil && st.Mode().IsRegular() {
			tf, err := export.LoadTuning(arg)
			if err != nil {
				return fail(err)
			}
			m, ds, err := tf.Model()
			if err != nil {
				return fail(err)
			}
			res := tf.Results()
			return &tunedFluid{ds: ds, results: res, opts: tf.FitOptions(), model: m, maxLab: tf.Fluid.MaxLabPressure,
				source: export.NewSource(tool, tf.Report, tf.Fingerprint, "from the tuning file "+arg, m, res)}, -1
		}
	}
	r, ds, code := loadDataset(arg, stderr)
	if code >= 0 {
		return nil, code
	}
	tf := &tunedFluid{report: r, ds: ds, maxLab: export.MaxLabPressure(r)}
	origin := "tuned to the report: best-ranked families, default options"
	if tuning != "" {
		file, err := export.LoadTuning(tuning)
		if err != nil {
			return fail(err)
		}
		if err := file.Matches(r, force); err != nil {
			return fail(err)
		}
		tf.opts = file.FitOptions()
		stored := file.Results()
		applied, err := fit.Apply(ds, stored, tf.opts)
		if err != nil {
			return fail(err)
		}
		tf.results = export.WithRecorded(applied, stored)
		origin = "from the tuning file " + tuning
	} else {
		var err error
		if tf.results, err = fit.TuneAll(ds, nil, tf.opts); err != nil {
			return fail(err)
		}
	}
	m, err := fit.NewModel(ds, tf.results, tf.opts)
	if err != nil {
		return fail(err)
	}
	tf.model = m
	tf.source = export.NewSource(tool, ds.Name, r.Fingerprint, origin, m, tf.results)
	return tf, -1
}

// refuseExisting reports an existing output file before any work is done.
func refuseExisting(path string, force bool, stderr io.Writer) bool {
	if path == "" || force {
		return false
	}
	if _, err := os.Lstat(path); err == nil {
		fmt.Fprintf(stderr, "labmatch: %s exists; use --force to overwrite\n", path)
		return true
	}
	return false
}

func runTables(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("tables", "labmatch tables DIR|TUNING_FILE [--tuning F] [--format csv|deck] [--units field|metric]\n                       [--pmax P] [--step P | --points N] [--salinity S] [--out F] [--force]",
		`Black-oil tables at reservoir temperature from the tuned model: saturated rows (pressure,
Rs, Bo, co, oil viscosity and density, Z, Bg, gas viscosity, and the formation water) from
atmospheric pressure to --pmax, Pb always a row, each with its undersaturated branch to
--pmax. The top row gets one point a step above it; a row whose oil the tuned families
cannot describe above its bubble point (such as the dead oil) is left without one and noted.
Rows above the tuned Pb are oils with more gas than the report's, from the tuned
solution-gas pair continued, and are marked as extrapolated.

DIR (or demo:<id>) is tuned afresh with the best-ranked families and default options, or
takes the families and parameters of --tuning F; a TUNING_FILE alone (written by
tune --save) also works.

Formation water from published correlations at reservoir temperature: McCain's Bw and
viscosity, Osif's compressibility, McCain's surface density; the deck's water table (PVTW)
is referred to the tuned Pb.

--format csv: one CSV file with "name [unit]" headers, as in report files.
--format deck: an include file for the PROPS section of a black-oil deck (PVTO, PVDG, PVTW,
DENSITY) in FIELD or METRIC units; the writer refuses a table that breaks a rule the
simulator enforces and names the row.

Defaults: --pmax the larger of 1.5·Pb and the highest lab pressure; 30 saturated pressures;
salinity 30000 ppm (3 wt %); output to standard output.`)
	tuning := fs.String("tuning", "", "use the families and parameters of tuning file `F` (with DIR)")
	format := fs.String("format", "csv", "file `layout`: csv (a table with name [unit] headers) or deck (a PROPS include file)")
	units := fs.String("units", "field", "unit `system`: field (psia, scf/STB, rb/STB; deck FIELD) or metric (bara, sm3/sm3, m3/sm3; deck METRIC)")
	pmax := fs.String("pmax", "", "highest saturated `pressure`, e.g. 6000psia or 400bara (default: the larger of 1.5·Pb and the highest lab pressure)")
	step := fs.String("step", "", "`spacing` of the saturated pressures, e.g. 250psi or 20bar (default: --points)")
	points := fs.Int("points", export.DefaultPoints, "`number` of evenly spaced saturated pressures from atmospheric to --pmax; Pb is added")
	salinity := fs.String("salinity", "30000ppm", "formation-water `salinity` (NaCl equivalent): ppm or wt%, e.g. 30000ppm or 3wt%; a plain number is ppm")
	out := fs.String("out", "", "write to file `F` (default: standard output)")
	force := fs.Bool("force", false, "overwrite an existing --out file; apply a --tuning file made from other report files")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one report folder or tuning file, got %d arguments", len(pos))
	}
	f, err := export.ParseFormat(*format)
	if err != nil {
		return usageError(fs, stderr, "--format %q: want csv or deck", *format)
	}
	u, err := export.ParseUnits(*units)
	if err != nil {
		return usageError(fs, stderr, "--units %q: want field or metric", *units)
	}
	var opts export.TableOptions
	if *pmax != "" {
		if opts.PMax, err = lab.ParseValue(lab.Pressure, *pmax); err != nil {
			return usageError(fs, stderr, "--pmax: %v", err)
		}
	}
	stepSet, pointsSet := false, false
	fs.Visit(func(fl *flag.Flag) {
		stepSet = stepSet || fl.Name == "step"
		pointsSet = pointsSet || fl.Name == "points"
	})
	if stepSet && pointsSet {
		return usageError(fs, stderr, "give --step or --points, not both")
	}
	if *step != "" {
		if opts.Step, err = parsePressureStep(*step); err != nil {
			return usageError(fs, stderr, "--step: %v", err)
		}
	} else {
		if *points < 2 || *points > export.MaxPoints {
			return usageError(fs, stderr, "--points %d: want 2 to %d", *points, export.MaxPoints)
		}
		opts.Points = *points
	}
	if opts.Salinity, err = parseSalinity(*salinity); err != nil {
		return usageError(fs, stderr, "--salinity: %v", err)
	}
	if refuseExisting(*out, *force, stderr) {
		return exitData
	}
	tf, code := loadTuned(pos[0], *tuning, *force, true, stderr)
	if code >= 0 {
		return code
	}
	opts.MaxLabPressure = tf.maxLab
	t, err := export.BuildTable(tf.model, tf.source, opts)
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	if *out == "" {
		data, err := export.RenderTable(t, f, u)
		if err != nil {
			return tablesError(err, pos[0], stderr)
		}
		if _, err := stdout.Write(data); err != nil {
			fmt.Fprintln(stderr, "labmatch:", err)
			return exitData
		}
		return exitOK
	}
	if err := export.SaveTable(*out, t, f, u, *force); err != nil {
		return tablesError(err, pos[0], stderr)
	}
	branch := 0
	for _, r := range t.Rows {
		branch += len(r.Branch)
	}
	pu := u.UnitSet().Pressure
	pb, err := lab.FromField(lab.Pressure, pu, t.Pb)
	if err != nil {
		fmt.Fprintln(stderr, "labmatch:", err)
		return exitData
	}
	fmt.Fprintf(stdout, "%s written: %s, %s units, %d saturated rows with %d undersaturated, Pb %.1f %s\n", *out, f, u, len(t.Rows), branch, pb, pu)
	for _, w := range t.Warnings {
		fmt.Fprintln(stdout, "outside the data:", w.Text(u))
	}
	fmt.Fprintln(stdout, "Correlation results are estimates; check them against the lab report and local practice.")
	return exitOK
}

// parsePressureStep reads a pressure difference such as "250", "250psi", "20bar" or "2MPa"
// in psi. Gauge and absolute units give the same difference.
func parsePressureStep(s string) (float64, error) {
	s = strings.TrimSpace(s)
	v, unit, err := splitNumber(s)
	if err != nil {
		return 0, err
	}
	switch strings.ToLower(unit) {
	case "", "psi":
		unit = "psia"
	}
	hi, err := lab.ToField(lab.Pressure, unit, v)
	if err != nil {
		return 0, err
	}
	lo, _ := lab.ToField(lab.Pressure, unit, 0)
	d := hi - lo
	if !(d > 0) {
		return 0, fmt.Errorf("%q: want a positive pressure difference such as 250psi or 20bar", s)
	}
	return d, nil
}

// parseSalinity reads a salinity in ppm ("30000ppm", or a plain number) or weight percent
// ("3wt%", "3%") and returns wt %.
func parseSalinity(s string) (float64, error) {
	v, unit, err := splitNumber(strings.TrimSpace(s))
	if err != nil {
		return 0, err
	}
	switch strings.ToLower(strings.ReplaceAll(unit, " ", "")) {
	case "", "ppm", "mg/kg":
		v /= 1e4
	case "wt%", "%", "wt.%", "weight%":
	default:
		return 0, fmt.Errorf("%q: unit %q, want ppm or wt%% (e.g. 30000ppm or 3wt%%)", s, unit)
	}
	if !(v >= 0 && v <= 26.4) {
		return 0, fmt.Errorf("%q is %g wt %%; want 0 to 26.4 wt %% (NaCl saturates near 26.4 %%)", s, v)
	}
	return v, nil
}

// splitNumber splits "250psi" into 250 and "psi": the longest prefix that parses as a number.
func splitNumber(s string) (float64, string, error) {
	for i := len(s); i > 0; i-- {
		if v, err := strconv.ParseFloat(s[:i], 64); err == nil {
			return v, strings.TrimSpace(s[i:]), nil
		}
	}
	return 0, "", fmt.Errorf("%q is not a number", s)
}

// tablesError reports a failed table export; a deck refused for a simulator rule gets a hint
// on what to change.
func tablesError(err error, arg string, stderr io.Writer) int {
	fmt.Fprintln(stderr, err)
	if errors.Is(err, export.ErrRule) {
		fmt.Fprintf(stderr, "hint: the tuned model, not the table, breaks the rule: tune the property named above at a shallower depth or with another family, save it and make the deck from that tuning, e.g.\n  labmatch tune %s --depth multiplier --save tuning.json\n  labmatch tables %s --tuning tuning.json --format deck\n", arg, arg)
	}
	return exitData
}
