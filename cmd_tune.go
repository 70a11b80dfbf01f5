package main

import (
	"flag"
	"fmt"
	"io"
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
	mode, loss, ppc *string
	huber           *float64
}

func addOptionFlags(fs *flag.FlagSet) optionFlags {
	return optionFlags{
		mode:  fs.String("mode", "multiplier", "tuning `parameters`: multiplier or multiplier+shift"),
		loss:  fs.String("loss", "relative", "objective: relative, absolute or huber"),
		huber: fs.Float64("huber-delta", 0.02, "relative error where the huber loss turns linear"),
		ppc:   fs.String("ppc", "sutton", "pseudo-critical family for Z, Bg and gas viscosity: sutton or standing"),
	}
}

func (o optionFlags) options() (fit.Options, error) {
	opts := fit.Options{Mode: fit.Mode(*o.mode), Loss: fit.Loss(*o.loss), HuberDelta: *o.huber, PseudoCritical: *o.ppc}
	switch opts.Mode {
	case fit.Multiplier, fit.MultiplierShift:
	default:
		return opts, fmt.Errorf("--mode %q: want multiplier or multiplier+shift", *o.mode)
	}
	switch opts.Loss {
	case fit.Relative, fit.Absolute, fit.Huber:
	default:
		return opts, fmt.Errorf("--loss %q: want relative, absolute or huber", *o.loss)
	}
	if *o.ppc != "sutton" && *o.ppc != "standing" {
		return opts, fmt.Errorf("--ppc %q: want sutton or standing", *o.ppc)
	}
	return opts, nil
}

func runRank(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("rank", "labmatch rank DIR [--json]",
		"Score every correlation family of every property against the report, as published and\nas tuned with one multiplier, best first (by tuned AARE, then published AARE, then id).\nDIR may be demo:<id> for a built-in report.")
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
	fmt.Fprintf(stdout, "%s — families ranked by tuned AARE (separator basis)\n", ds.Name)
	for _, p := range fit.Properties {
		es, ok := rk[p]
		if !ok {
			continue
		}
		fmt.Fprintf(stdout, "\n%s (%d points)\n", propertyTitle(p), len(ds.Points[p]))
		tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "  #\tfamily\tAARE published %\tAARE tuned %\tmultiplier\tdata range")
		for i, e := range es {
			if e.Failed != "" {
				fmt.Fprintf(tw, "  %d\t%s\t-\t-\t-\tcannot be evaluated: %s\n", i+1, e.Family, e.Failed)
				continue
			}
			rng := "inside"
			if !e.InRange {
				rng = "OUTSIDE: " + strings.Join(e.OutOfRange, "; ")
			}
			fmt.Fprintf(tw, "  %d\t%s\t%.2f\t%.2f\t%.3f\t%s\n", i+1, e.Family, e.AAREPublished, e.AARETuned, e.Multiplier, rng)
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
	if ds.Name == "" {
		ds.Name = arg
	}
	return r, ds, -1
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
	Parameters    map[string]float64    `json:"parameters"`
	CI95          map[string][2]float64 `json:"ci95"`
	CIAssumed     bool                  `json:"ci95_assumed_uncertainty"`
	AAREPublished float64               `json:"aare_pct_published"`
	AARETuned     float64               `json:"aare_pct_tuned"`
	Published     fit.Stats             `json:"published"`
	Tuned         fit.Stats             `json:"tuned"`
	Flags         []string              `json:"flags"`
	Residuals     []fit.Residual        `json:"residuals"`
}

func runTune(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("tune", "labmatch tune DIR [--pb ID --bo ID --co ID --mu-dead ID --mu-sat ID --mu-under ID --z ID] [--json] [--save F]",
		"Tune the chosen family of every property (default: the best-ranked) to the report and print\nthe parameters with 95 % intervals and the statistics before and after tuning.\nDIR may be demo:<id> for a built-in report.")
	fams := familyFlags(fs, fit.Properties...)
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
	r, ds, code := loadDataset(pos[0], stderr)
	if code >= 0 {
		return code
	}
	var results map[fit.PropertyID]fit.Result
	if *tuning != "" {
		if len(choice) > 0 || *exclude != "" {
			return usageError(fs, stderr, "--tuning takes the families, options and excluded points from the file; drop the family flags and --exclude")
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
			if res.Mode == fit.MultiplierShift {
				params["shift"] = res.Params.Shift
			}
			props[string(p)] = tuneJSON{Family: res.Family, Parameters: params, CI95: res.CI95, CIAssumed: res.CIAssumed,
				AAREPublished: res.Published.AARE, AARETuned: res.Tuned.AARE, Published: res.Published, Tuned: res.Tuned,
				Flags: nonNil(res.Flags), Residuals: res.Residuals}
		}
		return writeJSON(stdout, stderr, map[string]any{"report": ds.Name, "properties": props, "notes": nonNil(ds.Notes)})
	}
	how := "tuned to the report"
	if *tuning != "" {
		how = "parameters from " + *tuning
	}
	fmt.Fprintf(stdout, "%s — %s (separator basis, %s, %s errors)\n", ds.Name, how, opts.Resolved().Mode, opts.Resolved().Loss)
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
	fmt.Fprintf(w, "\n%s: %s\n", propertyTitle(res.Property), res.Family)
	ci := res.CI95["multiplier"]
	assumed := ""
	if res.CIAssumed {
		assumed = " (assumed lab uncertainty: no spare points)"
	}
	fmt.Fprintf(w, "  multiplier %.4f  95%% [%.4f, %.4f]%s\n", res.Params.Multiplier, ci[0], ci[1], assumed)
	if res.Mode == fit.MultiplierShift {
		s := res.CI95["shift"]
		fmt.Fprintf(w, "  shift      %.4g  95%% [%.4g, %.4g]\n", res.Params.Shift, s[0], s[1])
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  \tpoints\tAARE %\tbias %\tmax |RE| %\tRMSE")
	fmt.Fprintf(tw, "  published\t%d\t%.2f\t%+.2f\t%.2f\t%.4g\n", res.Published.Points, res.Published.AARE, res.Published.Bias, res.Published.MaxARE, res.Published.RMSE)
	fmt.Fprintf(tw, "  tuned\t%d\t%.2f\t%+.2f\t%.2f\t%.4g\n", res.Tuned.Points, res.Tuned.AARE, res.Tuned.Bias, res.Tuned.MaxARE, res.Tuned.RMSE)
	tw.Flush()
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  #\tquantity\tp [psia]\tlab\tpublished\ttuned\tRE tuned %\t")
	for i, rr := range res.Residuals {
		mark := ""
		if rr.Excluded {
			mark = "excluded"
		}
		fmt.Fprintf(tw, "  %d\t%s\t%.1f\t%.5g\t%.5g\t%.5g\t%+.2f\t%s\n", i, rr.Quantity, rr.Pressure, rr.Lab, rr.Published, rr.Tuned, 100*(rr.Tuned-rr.Lab)/rr.Lab, mark)
	}
	tw.Flush()
	for _, f := range res.Flags {
		fmt.Fprintln(w, "  flag:", f)
	}
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
