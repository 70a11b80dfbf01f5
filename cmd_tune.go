package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"sort"
	"strings"
	"text/tabwriter"

	"labmatch/export"
	"labmatch/fit"
	"labmatch/lab"
	"labmatch/samples"
)

// loadReport reads a report folder, or a built-in demo report named "demo:<id>".
func loadReport(arg string) (*lab.Report, error) {
	if id, ok := strings.CutPrefix(arg, "demo:"); ok {
		return samples.Load(id)
	}
	return lab.ReadFolder(arg)
}

// optionFlags are the tuning options shared by rank and tune.
type optionFlags struct {
	fs                     *flag.FlagSet
	depth, mode, loss, ppc *string
	huber                  *float64
}

func addOptionFlags(fs *flag.FlagSet) optionFlags {
	return optionFlags{
		fs:    fs,
		depth: fs.String("depth", "auto", "tuning `depth` of every property: published, multiplier, shape, refit, or auto (the rung with the smallest leave-one-out error)"),
		mode:  fs.String("mode", "", "older name of --depth: multiplier, or multiplier+shift (= shape)"),
		loss:  fs.String("loss", "relative", "objective: relative, absolute or huber"),
		huber: fs.Float64("huber-delta", 0.02, "relative error where the huber loss turns linear (with --loss huber)"),
		ppc:   fs.String("ppc", "", "force the pseudo-critical `method` of the z families: sutton or standing (default: both, ranked by the DL's Z)"),
	}
}

func (o optionFlags) options() (fit.Options, error) {
	opts := fit.Options{Loss: fit.Loss(*o.loss), HuberDelta: *o.huber, PseudoCritical: *o.ppc}
	switch d := fit.Depth(*o.depth); d {
	case "auto", "":
	case fit.DepthPublished, fit.DepthMultiplier, fit.DepthShape, fit.DepthRefit:
		opts.Depth = d
	default:
		return opts, fmt.Errorf("--depth %q: want published, multiplier, shape, refit or auto", *o.depth)
	}
	switch *o.mode {
	case "":
	case "multiplier":
		opts.Depth = fit.DepthMultiplier
	case "multiplier+shift":
		opts.Depth = fit.DepthShape
	default:
		return opts, fmt.Errorf("--mode %q: want multiplier or multiplier+shift (or use --depth)", *o.mode)
	}
	if *o.mode != "" && *o.depth != "auto" {
		return opts, fmt.Errorf("--mode is the older name of --depth: give one of them")
	}
	switch opts.Loss {
	case fit.Relative, fit.Absolute, fit.Huber:
	default:
		return opts, fmt.Errorf("--loss %q: want relative, absolute or huber", *o.loss)
	}
	if *o.ppc != "" && *o.ppc != "sutton" && *o.ppc != "standing" {
		return opts, fmt.Errorf("--ppc %q: want sutton or standing", *o.ppc)
	}
	if !(*o.huber > 0 && *o.huber < 1) {
		return opts, fmt.Errorf("--huber-delta %g: want a relative error between 0 and 1, e.g. 0.02", *o.huber)
	}
	set := false
	o.fs.Visit(func(f *flag.Flag) { set = set || f.Name == "huber-delta" })
	if set && opts.Loss != fit.Huber {
		return opts, fmt.Errorf("--huber-delta is the threshold of --loss huber; the %s loss has none", opts.Loss)
	}
	return opts, nil
}

func runRank(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("rank", "labmatch rank DIR [--depth D] [--loss L] [--ppc M] [--json]",
		"Score every correlation family of every property against the report, as published and as\ntuned at its chosen depth (--depth), best first: by the leave-one-out AARE of that depth (to\n0.01 %; the tuned AARE where a property has too few points for one), then tuned AARE, then\nfewer cautions (used outside its original data; a multiplier far from 1), then published\nAARE, then id. Live-oil viscosity families are scored with the measured dead-oil viscosity\nand viscosity at Pb (published values where the report has none). DIR may be demo:<id> for a\nbuilt-in report.")
	asJSON := fs.Bool("json", false, "print JSON")
	of := addOptionFlags(fs)
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one report folder, got %d arguments", len(pos))
	}
	opts, err := of.options()
	if err != nil {
		return usageError(fs, stderr, "%v", err)
	}
	_, ds, code := loadDataset(pos[0], stderr)
	if code >= 0 {
		return code
	}
	rk := fit.Rank(ds, opts)
	if *asJSON {
		out := map[string]any{"report": ds.Name, "properties": rk, "notes": nonNil(ds.Notes)}
		return writeJSON(stdout, stderr, out)
	}
	fmt.Fprintf(stdout, "%s — families ranked by leave-one-out AARE at their %s depth (separator basis)\n", ds.Name, depthWord(opts))
	for _, p := range fit.Properties {
		es, ok := rk[p]
		if !ok {
			continue
		}
		fmt.Fprintf(stdout, "\n%s (%s)\n", propertyTitle(p), plural(len(ds.Points[p]), "point"))
		tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "  #\tfamily\tdepth\tAARE published %\tAARE tuned %\tAARE leave-one-out %\tmultiplier\tremarks")
		for i, e := range es {
			if e.Failed != "" {
				fmt.Fprintf(tw, "  %d\t%s\t-\t-\t-\t-\t-\tcannot be evaluated: %s\n", i+1, e.Family, e.Failed)
				continue
			}
			var remarks []string
			if !e.InRange {
				remarks = append(remarks, "OUTSIDE its data: "+strings.Join(e.OutOfRange, "; "))
			}
			remarks = append(remarks, e.Flags...)
			fmt.Fprintf(tw, "  %d\t%s\t%s\t%.2f\t%.2f\t%s\t%.3f\t%s\n", i+1, e.Family, e.Depth, *e.AAREPublished, *e.AARETuned, pct(e.AARELOO), *e.Multiplier, strings.Join(remarks, "; "))
		}
		tw.Flush()
	}
	printNotes(stdout, ds.Notes)
	return exitOK
}

// loadDataset reads a report and builds its tuning dataset; on failure it reports the error
// and returns the exit code (≥ 0).
func loadDataset(arg string, stderr io.Writer) (*lab.Report, *fit.Dataset, int) {
	r, err := loadReport(arg)
	if err != nil {
		fmt.Fprintln(stderr, err)
		return nil, nil, exitData
	}
	ds, err := fit.NewDataset(r)
	if err != nil {
		fmt.Fprintln(stderr, err)
		return nil, nil, exitData
	}
	// A QC error does not stop the tuning (the engineer may know better), but it is said, as
	// a mistyped stage otherwise shows only as a poor fit.
	for _, f := range lab.Check(r) {
		if f.Severity != lab.Error {
			continue
		}
		where := f.File
		if f.Row > 0 {
			where = fmt.Sprintf("%s line %d", f.File, f.Row)
		}
		fmt.Fprintf(stderr, "warning: QC error in %s (%s): %s; the data are used as read (labmatch check lists every finding)\n", where, f.Code, f.Message)
	}
	if ds.Name == "" {
		ds.Name = arg
	}
	return r, ds, -1
}

// depthWord names the depth in headings: "chosen" or the forced one.
func depthWord(o fit.Options) string {
	if o.Depth == "" {
		return "chosen"
	}
	return string(o.Depth)
}

// pct prints an optional percentage, "n/a" when absent.
func pct(v *float64) string {
	if v == nil {
		return "n/a"
	}
	return fmt.Sprintf("%.2f", *v)
}

func propertyTitle(p fit.PropertyID) string {
	switch p {
	case fit.Pb:
		return "pb — bubble point and solution GOR"
	case fit.Bo:
		return "bo — saturated oil FVF"
	case fit.Co:
		return "co — undersaturated oil compressibility"
	case fit.MuDead:
		return "mu_dead — dead-oil viscosity"
	case fit.MuSat:
		return "mu_sat — saturated oil viscosity"
	case fit.MuUnder:
		return "mu_under — undersaturated oil viscosity"
	case fit.Z:
		return "z — gas Z-factor"
	}
	return string(p)
}

// plural writes "1 point", "5 points".
func plural(n int, word string) string {
	if n == 1 {
		return fmt.Sprintf("%d %s", n, word)
	}
	return fmt.Sprintf("%d %ss", n, word)
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

func printNotes(w io.Writer, notes []string) {
	if len(notes) == 0 {
		return
	}
	fmt.Fprintln(w)
	for _, n := range notes {
		fmt.Fprintln(w, "note:", n)
	}
}

type tuneJSON struct {
	Family        string                `json:"family"`
	Depth         fit.Depth             `json:"depth"`
	AARELOO       *float64              `json:"aare_pct_loo"`
	NoFit         string                `json:"no_fit,omitempty"`
	Ladder        []fit.Rung            `json:"ladder"`
	Parameters    map[string]float64    `json:"parameters"`
	ShiftUnit     string                `json:"shift_unit,omitempty"`
	CI95          map[string][2]float64 `json:"ci95"`
	CIAssumed     bool                  `json:"ci95_assumed_uncertainty"`
	AAREPublished float64               `json:"aare_pct_published"`
	AARETuned     float64               `json:"aare_pct_tuned"`
	Published     fit.Stats             `json:"published"`
	Tuned         fit.Stats             `json:"tuned"`
	Flags         []string              `json:"flags"`
	OutOfRange    []string              `json:"out_of_range"`
	Residuals     []fit.Residual        `json:"residuals"`
}

func runTune(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("tune", "labmatch tune DIR [--pb ID --bo ID --co ID --mu-dead ID --mu-sat ID --mu-under ID --z ID]\n                     [--depth D] [--loss L] [--exclude LIST] [--json] [--save F] [--tuning F] [--force]",
		`Tune the chosen family of every property (default: the best-ranked) to the report on a ladder
of depths: published (no parameter), multiplier (pb: the anchor on the report's Pb alone),
shape (pb: a bend of Rs(p) below Pb; others: multiplier and shift, none for mu_under and z,
where a shift would break the continuity at Pb or the ideal-gas limit) and refit (the
family's own coefficients, held near the published values). For every rung it prints the
training and the leave-one-out AARE (each point left out in turn, refitted, predicted); by
default the rung with the smallest leave-one-out error is used, a deeper one only when it
wins by 10 % and 0.05 points (pb takes at least the anchor; a property with one point, the
multiplier). At every tuned depth Pb(Rsb) equals the report's Pb and the pair Pb(Rs), Rs(p)
stays an exact inverse; with the report's Pb excluded (--exclude pb:0) nothing anchors the
pair and its pressure scale is fitted to the Rs points. DIR may be demo:<id> for a built-in
report.`)
	fams := familyFlags(fs, nil, fit.Properties...)
	of := addOptionFlags(fs)
	exclude := fs.String("exclude", "", "leave points out: `list` of property:index, e.g. bo:3,mu_sat:0 (indexes as listed)")
	asJSON := fs.Bool("json", false, "print JSON")
	save := fs.String("save", "", "write the tuning file (JSON) to `F`")
	tuning := fs.String("tuning", "", "apply the families and parameters of tuning file `F` instead of tuning")
	force := fs.Bool("force", false, "overwrite an existing --save file; apply a --tuning file made from other report files")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one report folder, got %d arguments", len(pos))
	}
	opts, err := of.options()
	if err != nil {
		return usageError(fs, stderr, "%v", err)
	}
	if opts.Excluded, err = parseExclude(*exclude); err != nil {
		return usageError(fs, stderr, "%v", err)
	}
	choice, err := fams.choice()
	if err != nil {
		return usageError(fs, stderr, "%v", err)
	}
	if z := choice[fit.Z]; z != "" && opts.PseudoCritical != "" && !strings.HasPrefix(z, opts.PseudoCritical+"+") {
		return usageError(fs, stderr, "--z %s and --ppc %s disagree on the pseudo-critical method: give one of them", z, opts.PseudoCritical)
	}
	r, ds, code := loadDataset(pos[0], stderr)
	if code >= 0 {
		return code
	}
	for p, idx := range opts.Excluded {
		for _, i := range idx {
			if i >= len(ds.Points[p]) {
				return usageError(fs, stderr, "--exclude %s:%d: %s has %s (indexes 0 to %d)", p, i, p, plural(len(ds.Points[p]), "point"), len(ds.Points[p])-1)
			}
		}
	}
	if *save != "" && !*force {
		if _, err := os.Stat(*save); err == nil {
			fmt.Fprintf(stderr, "labmatch: %s exists; use --force to overwrite\n", *save)
			return exitData
		}
	}
	var results map[fit.PropertyID]fit.Result
	if *tuning != "" {
		var clash []string
		fs.Visit(func(f *flag.Flag) {
			switch f.Name {
			case "depth", "mode", "loss", "huber-delta", "ppc", "exclude", "pb", "bo", "co", "mu-dead", "mu-sat", "mu-under", "z":
				clash = append(clash, "--"+f.Name)
			}
		})
		if len(clash) > 0 {
			return usageError(fs, stderr, "--tuning takes the families, options and excluded points from the file; drop %s", strings.Join(clash, ", "))
		}
		tf, err := export.LoadTuning(*tuning)
		if err != nil {
			fmt.Fprintln(stderr, err)
			return exitData
		}
		if err := tf.Matches(r, *force); err != nil {
			fmt.Fprintln(stderr, err)
			return exitData
		}
		opts = tf.FitOptions()
		results, err = fit.Apply(ds, tf.Results(), opts)
		if err != nil {
			fmt.Fprintln(stderr, err)
			return exitData
		}
	} else if results, err = fit.TuneAll(ds, choice, opts); err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	if *save != "" {
		tf := export.NewTuningFile("labmatch "+version, r, results, opts, ds.Notes)
		if err := export.SaveTuning(*save, tf, *force); err != nil {
			fmt.Fprintln(stderr, err)
			return exitData
		}
	}
	if *asJSON {
		props := map[string]tuneJSON{}
		for p, res := range results {
			params := map[string]float64{"multiplier": res.Params.Multiplier}
			shiftUnit := ""
			if res.Shifted {
				params["shift"], shiftUnit = res.Params.Shift, res.ShiftUnit
			}
			if res.Params.Bend != 0 {
				params["bend"] = res.Params.Bend
			}
			for j, c := range res.Params.Coefficients {
				params[res.CoefficientIDs[j]] = c
			}
			props[string(p)] = tuneJSON{Family: res.Family, Depth: res.Depth, AARELOO: res.LOO, NoFit: res.NoFit, Ladder: res.Ladder,
				Parameters: params, ShiftUnit: shiftUnit, CI95: res.CI95, CIAssumed: res.CIAssumed, OutOfRange: nonNil(res.OutOfRange),
				AAREPublished: res.Published.AARE, AARETuned: res.Tuned.AARE, Published: res.Published, Tuned: res.Tuned,
				Flags: nonNil(res.Flags), Residuals: res.Residuals}
		}
		return writeJSON(stdout, stderr, map[string]any{"report": ds.Name, "properties": props, "notes": nonNil(ds.Notes)})
	}
	how := "tuned to the report"
	if *tuning != "" {
		how = "parameters from " + *tuning
	}
	fmt.Fprintf(stdout, "%s — %s (separator basis, %s depth, %s errors)\n", ds.Name, how, depthWord(opts), opts.Resolved().Loss)
	for _, p := range fit.Properties {
		res, ok := results[p]
		if !ok {
			continue
		}
		printResult(stdout, res)
	}
	printNotes(stdout, ds.Notes)
	if *save != "" {
		fmt.Fprintf(stdout, "\ntuning file written: %s\n", *save)
	}
	fmt.Fprintln(stdout, "\nCorrelation results are estimates; check them against the lab report and local practice.")
	return exitOK
}

func printResult(w io.Writer, res fit.Result) {
	fmt.Fprintf(w, "\n%s: %s at depth %s\n", propertyTitle(res.Property), res.Family, res.Depth)
	name := "multiplier"
	if res.Property == fit.Pb {
		name = "pressure scale"
	}
	switch {
	case res.Property == fit.Pb && res.Anchored && res.Depth != fit.DepthPublished:
		fmt.Fprintf(w, "  pressure scale %.4f  fixed by the report's Pb (Pb exact)\n", res.Params.Multiplier)
	case res.Depth == fit.DepthPublished && res.Params.Multiplier == 1 && !res.Shifted:
		fmt.Fprintf(w, "  %s %.4f  (published: nothing tuned)\n", name, res.Params.Multiplier)
	default:
		fmt.Fprintf(w, "  %s %.4f  %s\n", name, res.Params.Multiplier, interval(res, "multiplier", "%.4f"))
	}
	if res.Shifted {
		fmt.Fprintf(w, "  shift      %.4g %s  %s\n", res.Params.Shift, res.ShiftUnit, interval(res, "shift", "%.4g"))
	}
	if res.Params.Bend != 0 {
		fmt.Fprintf(w, "  bend       %.4f  %s  (exponent on Rs/Rsb below Pb)\n", res.Params.Bend, interval(res, "bend", "%.4f"))
	}
	if res.Params.Coefficients != nil {
		pub := fit.DeclaredCoefficients(res.Property, res.Family)
		for j, c := range res.Params.Coefficients {
			if j < len(pub) && c == pub[j].Value {
				continue
			}
			id := res.CoefficientIDs[j]
			fmt.Fprintf(w, "  %-10s %.6g (published %.6g)  %s\n", id, c, pub[j].Value, interval(res, id, "%.6g"))
		}
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	if len(res.Ladder) > 0 {
		fmt.Fprintln(tw, "  depth\tparameters\tAARE %\tmax |RE| %\tleave-one-out AARE %\t")
	}
	for _, r := range res.Ladder {
		mark := ""
		if r.Chosen {
			mark = "◀ chosen"
		}
		switch {
		case r.Skipped != "":
			fmt.Fprintf(tw, "  %s\t-\t-\t-\t-\tskipped: %s\n", r.Depth, r.Skipped)
		case r.LOO == nil:
			fmt.Fprintf(tw, "  %s\t%d\t%.2f\t%.2f\tn/a\t%s (%s)\n", r.Depth, r.Free, r.Tuned.AARE, r.Tuned.MaxARE, mark, r.LOONote)
		default:
			fmt.Fprintf(tw, "  %s\t%d\t%.2f\t%.2f\t%.2f\t%s\n", r.Depth, r.Free, r.Tuned.AARE, r.Tuned.MaxARE, *r.LOO, mark)
		}
	}
	tw.Flush()
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	rmse := "RMSE"
	if res.Tuned.RMSEUnit != "" {
		rmse += " [" + res.Tuned.RMSEUnit + "]"
	}
	fmt.Fprintf(tw, "  \tpoints\tAARE %%\tbias %%\tmax |RE| %%\t%s\n", rmse)
	fmt.Fprintf(tw, "  published\t%d\t%.2f\t%+.2f\t%.2f\t%.4g\n", res.Published.Points, res.Published.AARE, res.Published.Bias, res.Published.MaxARE, res.Published.RMSE)
	fmt.Fprintf(tw, "  tuned\t%d\t%.2f\t%+.2f\t%.2f\t%.4g\n", res.Tuned.Points, res.Tuned.AARE, res.Tuned.Bias, res.Tuned.MaxARE, res.Tuned.RMSE)
	tw.Flush()
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  #\tquantity\tp [psia]\tlab\tpublished\ttuned\tunit\tRE tuned %\t")
	for i, rr := range res.Residuals {
		mark := ""
		if rr.Excluded {
			mark = "excluded"
		}
		fmt.Fprintf(tw, "  %d\t%s\t%.1f\t%.5g\t%.5g\t%.5g\t%s\t%+.2f\t%s\n", i, rr.Quantity, rr.Pressure, rr.Lab, rr.Published, rr.Tuned, rr.Unit, 100*(rr.Tuned-rr.Lab)/rr.Lab, mark)
	}
	tw.Flush()
	if res.NoFit != "" {
		fmt.Fprintln(w, "  NO FIT:", res.NoFit)
	}
	for _, f := range res.Flags {
		fmt.Fprintln(w, "  flag:", f)
	}
	for _, f := range res.OutOfRange {
		fmt.Fprintln(w, "  outside the family's data:", f)
	}
}

// interval formats a parameter's 95 % interval, or says why there is none.
func interval(res fit.Result, name, format string) string {
	ci, ok := res.CI95[name]
	if !ok {
		return "95% interval not determined (too few points or a flat objective)"
	}
	s := fmt.Sprintf("95%% ["+format+", "+format+"]", ci[0], ci[1])
	if res.CIAssumed {
		s += " (from an assumed lab uncertainty: no spare points)"
	}
	if (name == "multiplier" || name == "bend") && (ci[0] < fit.MinMultiplier || ci[1] > fit.MaxMultiplier) {
		s += fmt.Sprintf(" (reaches past the bounds [%g, %g]: read it as poorly determined)", fit.MinMultiplier, fit.MaxMultiplier)
	}
	return s
}

// parseExclude reads "bo:3,mu_sat:0" into per-property point indexes.
func parseExclude(s string) (map[fit.PropertyID][]int, error) {
	out := map[fit.PropertyID][]int{}
	if s == "" {
		return out, nil
	}
	for _, item := range strings.Split(s, ",") {
		prop, idx, ok := strings.Cut(strings.TrimSpace(item), ":")
		var i int
		if _, err := fmt.Sscanf(idx, "%d", &i); !ok || err != nil || i < 0 {
			return nil, fmt.Errorf("--exclude %q: want property:index, e.g. bo:3", item)
		}
		p := fit.PropertyID(prop)
		if !validProperty(p) {
			return nil, fmt.Errorf("--exclude %q: unknown property %q", item, prop)
		}
		out[p] = append(out[p], i)
	}
	for _, v := range out {
		sort.Ints(v)
	}
	return out, nil
}

func validProperty(p fit.PropertyID) bool {
	for _, q := range fit.Properties {
		if q == p {
			return true
		}
	}
	return false
}
