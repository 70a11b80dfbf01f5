package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"

	"labmatch/export"
	"labmatch/fit"
	"labmatch/lab"
	"labmatch/samples"
)

// surveyShownExclusions is how many left-out rows the text output lists; --json lists all.
const surveyShownExclusions = 15

func runSurvey(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("survey", "labmatch survey FILE [--folds K] [--seed N] [--refit] [--properties LIST] [--json] [--out F.csv]\n                [--report F.html] [--force]",
		`Rank and tune every correlation family over a regional PVT database: a CSV file with one
sample per row (columns sample, temperature, API, gas gravity, Rsb, Pb, and optionally Bob,
dead oil viscosity, oil viscosity at Pb, separator pressure and separator temperature; units
in the headers). For pb (Pb from Rsb), bo (Bob), mu_dead and mu_sat it shows each family's
published error (AARE, bias, SD, max), its error with one multiplier fitted to the whole
database, and the cross-validated error of that multiplier: the samples are shuffled (--seed)
and split into --folds folds, and each fold is predicted by the multiplier fitted to the
others (leave-one-out for 30 samples or fewer). Families are sorted by that cross-validated
error, which says how well the tuned family would predict an oil not in the database.
With --refit each family's own coefficients are also refitted (held near their published
values) and cross-validated on the same folds, so you see whether the refit generalises or
only fits the database. Rows outside physical bounds are left out and listed. FILE may be
demo:tamsin-ridge for the built-in demo database (invented samples). --out writes one row per
sample, property and family (row = the sample's line in FILE; values in field units).`)
	folds := fs.Int("folds", 10, "number of cross-validation `folds` (2 or more)")
	seed := fs.Uint64("seed", 1, "`seed` of the shuffle that makes the folds")
	refit := fs.Bool("refit", false, "also refit each family's published coefficients and cross-validate the refit")
	props := fs.String("properties", "pb,bo,mu_dead,mu_sat", "comma-separated `list` of properties to score")
	asJSON := fs.Bool("json", false, "print JSON")
	out := fs.String("out", "", "write the predictions table to `F.csv`")
	report := fs.String("report", "", "write an HTML report with a lab-against-predicted plot per family to `F.html`")
	force := fs.Bool("force", false, "overwrite the --out and --report files if they exist")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one survey file, got %d arguments", len(pos))
	}
	if *folds < 2 {
		return usageError(fs, stderr, "--folds %d: want 2 or more", *folds)
	}
	var properties []fit.PropertyID
	for _, p := range strings.Split(*props, ",") {
		p = strings.TrimSpace(p)
		ok := false
		for _, q := range fit.SurveyProperties {
			ok = ok || string(q) == p
		}
		if !ok {
			return usageError(fs, stderr, "--properties: %q is not one of pb, bo, mu_dead, mu_sat", p)
		}
		properties = append(properties, fit.PropertyID(p))
	}
	for _, f := range []string{*out, *report} {
		if f == "" || *force {
			continue
		}
		if _, err := os.Lstat(f); err == nil {
			fmt.Fprintf(stderr, "labmatch survey: %s exists; use --force to overwrite\n", f)
			return exitData
		}
	}
	sv, err := loadSurvey(pos[0])
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	opts := fit.SurveyOptions{Folds: *folds, Seed: *seed, Refit: *refit, Properties: properties}
	var prog *progressLine
	if isTerminal(stderr) {
		prog = &progressLine{w: stderr, label: "survey"}
		opts.Progress = prog.update
	}
	res, err := fit.RunSurvey(sv, opts)
	prog.clear()
	if err != nil {
		printExclusions(stderr, sv, len(sv.Excluded))
		fmt.Fprintln(stderr, "labmatch survey:", err)
		return exitData
	}
	if *out != "" {
		if err := lab.WriteFileAtomic(*out, predictionsCSV(sv, res), *force); err != nil {
			fmt.Fprintln(stderr, err)
			return exitData
		}
	}
	if *report != "" {
		in := export.SurveyReportInput{Tool: "labmatch " + version, Survey: sv, Result: res, Folds: *folds}
		if err := export.SaveSurveyReport(*report, in, *force); err != nil {
			fmt.Fprintln(stderr, err)
			return exitData
		}
	}
	if *asJSON {
		if err := writeSurveyJSON(stdout, surveyJSON(sv, res, *folds)); err != nil {
			fmt.Fprintln(stderr, "labmatch:", err)
			return exitData
		}
		return exitOK
	}
	printSurvey(stdout, sv, res, *folds, *refit)
	if *out != "" {
		fmt.Fprintf(stdout, "\nwrote the predictions to %s\n", *out)
	}
	if *report != "" {
		fmt.Fprintf(stdout, "wrote the HTML report to %s\n", *report)
	}
	return exitOK
}

// loadSurvey reads a survey file, or the built-in demo survey named "demo:<id>".
func loadSurvey(arg string) (*lab.Survey, error) {
	if id, ok := strings.CutPrefix(arg, "demo:"); ok {
		return samples.LoadSurvey(id)
	}
	return lab.ReadSurvey(arg)
}

// progressLine rewrites one status line on a terminal. A nil *progressLine does nothing.
type progressLine struct {
	w     io.Writer
	label string
	shown bool
}

func (p *progressLine) update(done, total int) {
	fmt.Fprintf(p.w, "\r%s: %d of %d fits (%d %%)", p.label, done, total, 100*done/max(total, 1))
	p.shown = true
}

func (p *progressLine) clear() {
	if p == nil || !p.shown {
		return
	}
	fmt.Fprintf(p.w, "\r%s\r", strings.Repeat(" ", 60))
}

func surveyTitle(p fit.PropertyID) string {
	switch p {
	case fit.Pb:
		return "pb — bubble point from Rsb"
	case fit.Bo:
		return "bo — oil FVF at the bubble point"
	case fit.MuDead:
		return "mu_dead — dead-oil viscosity"
	case fit.MuSat:
		return "mu_sat — oil viscosity at the bubble point, from the measured dead-oil viscosity"
	}
	return string(p)
}

func printExclusions(w io.Writer, sv *lab.Survey, limit int) {
	if len(sv.Excluded) == 0 {
		return
	}
	rows, values := 0, 0
	for _, e := range sv.Excluded {
		if e.Columns == nil {
			rows++
		} else {
			values += len(e.Columns)
		}
	}
	var parts []string
	if rows > 0 {
		parts = append(parts, plural(rows, "row"))
	}
	if values > 0 {
		parts = append(parts, plural(values, "value"))
	}
	fmt.Fprintf(w, "\nLeft out: %s\n", strings.Join(parts, " and "))
	for i, e := range sv.Excluded {
		if i == limit {
			fmt.Fprintf(w, "  … and %d more (--json lists them all)\n", len(sv.Excluded)-limit)
			break
		}
		what := "row"
		if e.Columns != nil {
			what = strings.Join(e.Columns, " and ")
		}
		fmt.Fprintf(w, "  line %d (%s), %s: %s\n", e.Line, e.Sample, what, e.Reason)
	}
}

func cvWord(sp fit.SurveyProperty) string {
	if sp.LeaveOneOut {
		return "leave-one-out"
	}
	return fmt.Sprintf("%d folds", sp.Folds)
}

func printSurvey(w io.Writer, sv *lab.Survey, res *fit.SurveyResult, folds int, refit bool) {
	rowsOut := 0
	for _, e := range sv.Excluded {
		if e.Columns == nil {
			rowsOut++
		}
	}
	fmt.Fprintf(w, "%s: %s read, %s used", sv.File, plural(sv.Rows, "row"), plural(res.Samples, "sample"))
	if rowsOut > 0 {
		fmt.Fprintf(w, ", %d left out", rowsOut)
	}
	fmt.Fprintf(w, "\nCross-validation: %d folds from a shuffle with seed %d (leave-one-out where a property has %d samples or fewer).\n",
		folds, res.Seed, 30)
	fmt.Fprintln(w, "Errors are relative, in %; CV = each sample predicted by the tuning fitted without its fold.")
	printExclusions(w, sv, surveyShownExclusions)
	for _, sp := range res.Properties {
		fmt.Fprintf(w, "\n%s (%s, %s)\n", surveyTitle(sp.Property), plural(sp.Samples, "sample"), cvWord(sp))
		printSurveyTable(w, sp, refit)
		printFamilyRemarks(w, sp, refit)
		printRecommendation(w, sp, refit)
	}
	fmt.Fprintln(w, "\nThese are estimates from a regional database: a tuned correlation predicts a new oil only as")
	fmt.Fprintln(w, "well as the database represents it. Check them against each well's own lab report; facility,")
	fmt.Fprintln(w, "well-control and reserves decisions rest with qualified engineers and local regulations.")
}

// printSurveyTable prints one property's families in rank order: the published statistics,
// the multiplier with its training and cross-validated AARE, and the refit's.
func printSurveyTable(w io.Writer, sp fit.SurveyProperty, refit bool) {
	fw := len("family")
	for _, f := range sp.Families {
		fw = max(fw, len(f.Family))
	}
	// Column widths: n 5, published AARE 6, bias 7, SD 6, max 6 | multiplier 7, AARE 6, CV 6 |
	// refit AARE 6, CV 6.
	group := fmt.Sprintf("  %3s  %-*s  %5s  %-28s   %-21s", "", fw, "", "", "published", "one multiplier")
	head := fmt.Sprintf("  %3s  %-*s  %5s  %6s %7s %6s %6s   %7s %6s %6s", "#", fw, "family", "n", "AARE", "bias", "SD", "max", "value", "AARE", "CV")
	if refit {
		group += "   refit"
		head += fmt.Sprintf("   %6s %6s", "AARE", "CV")
	}
	fmt.Fprintln(w, strings.TrimRight(group, " "))
	fmt.Fprintln(w, head)
	for i, f := range sp.Families {
		if f.Points == 0 {
			fmt.Fprintf(w, "  %3d  %-*s  %5d  cannot be evaluated for any sample\n", i+1, fw, f.Family, 0)
			continue
		}
		cv := "-"
		if f.CV.Points > 0 {
			cv = fmt.Sprintf("%.2f", f.CV.AARE)
		}
		line := fmt.Sprintf("  %3d  %-*s  %5d  %6.2f %+7.2f %6.2f %6.1f   %7.3f %6.2f %6s", i+1, fw, f.Family, f.Points,
			f.Published.AARE, f.Published.Bias, f.Published.SD, f.Published.MaxARE, f.Multiplier, f.Tuned.AARE, cv)
		if refit {
			if f.Refit != nil {
				line += fmt.Sprintf("   %6.2f %6.2f", f.Refit.Tuned.AARE, f.Refit.CV.AARE)
			} else {
				line += fmt.Sprintf("   %6s %6s", "-", "-")
			}
		}
		fmt.Fprintln(w, line)
	}
}

// printFamilyRemarks lists, below a property's table, what each family could not do: samples
// out of its domain, samples outside its data, a multiplier far from 1, and the refit.
func printFamilyRemarks(w io.Writer, sp fit.SurveyProperty, refit bool) {
	for _, l := range sp.Skipped {
		fmt.Fprintf(w, "  %s skipped: %s (lines %s)\n", plural(l.Count, "sample"), l.Reason, lineList(l.Lines, l.Count))
	}
	for _, f := range sp.Families {
		var notes []string
		for _, l := range f.Lost {
			notes = append(notes, fmt.Sprintf("cannot evaluate %s: %s (lines %s)", plural(l.Count, "sample"), l.Reason, lineList(l.Lines, l.Count)))
		}
		notes = append(notes, f.Flags...)
		var more []string
		if refit {
			switch {
			case f.Refit == nil && f.RefitNote != "":
				notes = append(notes, "no refit: "+f.RefitNote)
			case f.Refit != nil:
				more = refitSummary(f)
			}
		}
		if len(notes)+len(more) == 0 {
			continue
		}
		if len(notes) == 0 {
			fmt.Fprintf(w, "  %s:\n", f.Family)
		} else {
			fmt.Fprintf(w, "  %s: %s\n", f.Family, strings.Join(notes, "; "))
		}
		for _, m := range more {
			fmt.Fprintf(w, "      %s\n", m)
		}
	}
}

// refitSummary says what the refit did and whether it generalises, then lists its
// coefficients, a few to a line.
func refitSummary(f fit.SurveyFamily) []string {
	rf := f.Refit
	var verdict string
	switch {
	case rf.Better:
		verdict = fmt.Sprintf("refit predicts unseen samples better: CV %.2f %% against the multiplier's %.2f %%", rf.CV.AARE, f.CV.AARE)
	case rf.Overfits:
		verdict = fmt.Sprintf("refit OVERFITS: it fits the database better (%.2f %% against %.2f %%) but predicts unseen samples worse (CV %.2f %% against %.2f %%)",
			rf.Tuned.AARE, f.Tuned.AARE, rf.CV.AARE, f.CV.AARE)
	case rf.Worse:
		verdict = fmt.Sprintf("refit predicts unseen samples worse: CV %.2f %% against the multiplier's %.2f %%", rf.CV.AARE, f.CV.AARE)
	default:
		verdict = fmt.Sprintf("refit gives no clear gain on unseen samples: CV %.2f %% against the multiplier's %.2f %%", rf.CV.AARE, f.CV.AARE)
	}
	lines := []string{verdict}
	var cs, held []string
	for _, c := range rf.Coefficients {
		if c.Held != "" {
			held = append(held, fmt.Sprintf("%s %.5g (%s)", c.ID, c.Published, c.Held))
			continue
		}
		cs = append(cs, fmt.Sprintf("%s %.5g → %.5g (folds %.5g to %.5g)", c.ID, c.Published, c.Refit, c.FoldMin, c.FoldMax))
	}
	if rf.MultiplierFree {
		cs = append(cs, fmt.Sprintf("and a multiplier %.4f", rf.Multiplier))
	}
	for i := 0; i < len(cs); i += 3 {
		lines = append(lines, strings.Join(cs[i:min(i+3, len(cs))], ", "))
	}
	for _, h := range held {
		lines = append(lines, "held at published: "+h)
	}
	return lines
}

// printRecommendation names the property's best family by cross-validated error, with the
// multiplier to use, and says when its refit would be the better choice.
func printRecommendation(w io.Writer, sp fit.SurveyProperty, refit bool) {
	if len(sp.Families) == 0 || sp.Families[0].Points == 0 {
		return
	}
	b := sp.Families[0]
	if b.CV.Points == 0 {
		fmt.Fprintf(w, "  too few samples to cross-validate; %s with multiplier %.3f fits best\n", b.Family, b.Multiplier)
		return
	}
	fmt.Fprintf(w, "  best for an unseen oil: %s × %.3f (CV AARE %.2f %%", b.Family, b.Multiplier, b.CV.AARE)
	if b.Points < sp.Samples {
		fmt.Fprintf(w, ", on the %d of %d samples it can evaluate", b.Points, sp.Samples)
	}
	fmt.Fprintln(w, ")")
	if refit {
		for _, f := range sp.Families {
			if f.Refit != nil && f.Refit.Better && f.Refit.CV.AARE < b.CV.AARE {
				fmt.Fprintf(w, "  %s refitted predicts better still (CV AARE %.2f %%); its coefficients are listed above\n", f.Family, f.Refit.CV.AARE)
				break
			}
		}
	}
}

// lineList writes "4, 9, 12" or "4, 9, 12, …" when there are more.
func lineList(lines []int, count int) string {
	s := make([]string, len(lines))
	for i, l := range lines {
		s[i] = strconv.Itoa(l)
	}
	out := strings.Join(s, ", ")
	if count > len(lines) {
		out += ", …"
	}
	return out
}

type surveyExclusionJSON struct {
	Row     int      `json:"row"` // line in the file
	Sample  string   `json:"sample"`
	Columns []string `json:"columns"` // the values left out; null for the whole row
	Reason  string   `json:"reason"`
}

type surveyCoefficientJSON struct {
	ID        string  `json:"id"`
	Role      string  `json:"role"`
	Published float64 `json:"published"`
	Refit     float64 `json:"refit"`
	FoldMin   float64 `json:"fold_min"`
	FoldMax   float64 `json:"fold_max"`
	Held      string  `json:"held,omitempty"`
}

type surveyFamilyJSON struct {
	Family       string                  `json:"family"`
	Samples      int                     `json:"samples"`
	AAREPub      float64                 `json:"aare_pct_published"`
	BiasPub      float64                 `json:"bias_pct_published"`
	SDPub        float64                 `json:"sd_pct_published"`
	MaxPub       float64                 `json:"max_are_pct_published"`
	Multiplier   float64                 `json:"multiplier"`
	AARETuned    float64                 `json:"aare_pct_tuned"`
	BiasTuned    float64                 `json:"bias_pct_tuned"`
	SDTuned      float64                 `json:"sd_pct_tuned"`
	MaxTuned     float64                 `json:"max_are_pct_tuned"`
	AARECV       *float64                `json:"aare_pct_cv"`
	BiasCV       *float64                `json:"bias_pct_cv"`
	MaxCV        *float64                `json:"max_are_pct_cv"`
	AARERefit    *float64                `json:"aare_pct_refit"`
	AARERefitCV  *float64                `json:"aare_pct_refit_cv"`
	RefitMult    *float64                `json:"refit_multiplier"`
	RefitLambda  *float64                `json:"refit_ridge_lambda,omitempty"`
	RefitBetter  *bool                   `json:"refit_better"`
	RefitWorse   *bool                   `json:"refit_worse"`
	Overfits     *bool                   `json:"refit_overfits"`
	RefitNote    string                  `json:"refit_note,omitempty"`
	Coefficients []surveyCoefficientJSON `json:"coefficients"`
	Lost         []fit.SurveyLoss        `json:"lost"`
	OutsideRange int                     `json:"outside_range"`
	Flags        []string                `json:"flags"`
}

type surveyPropertyJSON struct {
	Samples     int              `json:"samples"`
	Unit        string           `json:"unit"`
	Folds       int              `json:"folds"`
	LeaveOneOut bool             `json:"leave_one_out"`
	Skipped     []fit.SurveyLoss `json:"skipped"`
}

type surveyPredictionJSON struct {
	Sample    string   `json:"sample"`
	Row       int      `json:"row"`
	Property  string   `json:"property"`
	Family    string   `json:"family"`
	Unit      string   `json:"unit"`
	Lab       digits7  `json:"lab"`
	Published digits7  `json:"published"`
	Tuned     digits7  `json:"tuned"`
	TunedCV   *digits7 `json:"tuned_cv"`
	Refit     *digits7 `json:"refit,omitempty"`
	RefitCV   *digits7 `json:"refit_cv,omitempty"`
}

// digits7 is a prediction written with 7 significant digits, more than any lab value carries:
// the predictions of a large database are most of its JSON.
type digits7 float64

func (v digits7) MarshalJSON() ([]byte, error) {
	return strconv.AppendFloat(nil, float64(v), 'g', 7, 64), nil
}

func ptr[T any](v T) *T { return &v }

func surveyJSON(sv *lab.Survey, res *fit.SurveyResult, folds int) map[string]any {
	excluded := make([]surveyExclusionJSON, len(sv.Excluded))
	for i, e := range sv.Excluded {
		excluded[i] = surveyExclusionJSON{Row: e.Line, Sample: e.Sample, Columns: e.Columns, Reason: e.Reason}
	}
	props := map[string][]surveyFamilyJSON{}
	info := map[string]surveyPropertyJSON{}
	var preds []surveyPredictionJSON
	for _, sp := range res.Properties {
		info[string(sp.Property)] = surveyPropertyJSON{Samples: sp.Samples, Unit: sp.Unit, Folds: sp.Folds, LeaveOneOut: sp.LeaveOneOut, Skipped: sp.Skipped}
		fams := make([]surveyFamilyJSON, 0, len(sp.Families))
		for _, f := range sp.Families {
			j := surveyFamilyJSON{Family: f.Family, Samples: f.Points,
				AAREPub: f.Published.AARE, BiasPub: f.Published.Bias, SDPub: f.Published.SD, MaxPub: f.Published.MaxARE,
				Multiplier: f.Multiplier, AARETuned: f.Tuned.AARE, BiasTuned: f.Tuned.Bias, SDTuned: f.Tuned.SD, MaxTuned: f.Tuned.MaxARE,
				RefitNote:    f.RefitNote,
				Coefficients: []surveyCoefficientJSON{}, Lost: f.Lost, OutsideRange: f.OutsideRange, Flags: nonNil(f.Flags)}
			if f.CV.Points > 0 {
				j.AARECV, j.BiasCV, j.MaxCV = ptr(f.CV.AARE), ptr(f.CV.Bias), ptr(f.CV.MaxARE)
			}
			if rf := f.Refit; rf != nil {
				j.AARERefit, j.AARERefitCV = ptr(rf.Tuned.AARE), ptr(rf.CV.AARE)
				j.RefitMult, j.RefitLambda = ptr(rf.Multiplier), ptr(rf.Lambda)
				j.RefitBetter, j.RefitWorse, j.Overfits = ptr(rf.Better), ptr(rf.Worse), ptr(rf.Overfits)
				for _, c := range rf.Coefficients {
					j.Coefficients = append(j.Coefficients, surveyCoefficientJSON(c))
				}
			}
			fams = append(fams, j)
			for a, i := range f.Pred.Sample {
				s := sv.Samples[i]
				p := surveyPredictionJSON{Sample: s.ID, Row: s.Line, Property: string(sp.Property), Family: f.Family, Unit: sp.Unit,
					Lab: digits7(f.Pred.Lab[a]), Published: digits7(f.Pred.Published[a]), Tuned: digits7(f.Pred.Tuned[a])}
				if f.Pred.CV != nil {
					p.TunedCV = ptr(digits7(f.Pred.CV[a]))
				}
				if f.Pred.Refit != nil {
					p.Refit, p.RefitCV = ptr(digits7(f.Pred.Refit[a])), ptr(digits7(f.Pred.RefitCV[a]))
				}
				preds = append(preds, p)
			}
		}
		props[string(sp.Property)] = fams
	}
	return map[string]any{
		"file": sv.File, "fingerprint_sha256": sv.Fingerprint, "rows": sv.Rows, "samples": res.Samples,
		"folds": folds, "seed": res.Seed, "prior_spread": res.PriorSpread,
		"excluded": excluded, "properties": props, "property_info": info, "predictions": nonNilSlice(preds),
	}
}

// writeSurveyJSON writes the survey JSON indented like the other commands', except that each
// prediction takes one line: a large database has hundreds of thousands of them.
func writeSurveyJSON(w io.Writer, doc map[string]any) error {
	preds, _ := doc["predictions"].([]surveyPredictionJSON)
	delete(doc, "predictions")
	head, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return err
	}
	var b bytes.Buffer
	b.Write(bytes.TrimSuffix(head, []byte("}")))
	b.WriteString(",\n  \"predictions\": [")
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	for i, p := range preds {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString("\n    ")
		if err := enc.Encode(p); err != nil {
			return err
		}
		b.Truncate(b.Len() - 1) // Encode's newline
	}
	if len(preds) > 0 {
		b.WriteString("\n  ")
	}
	b.WriteString("]\n}\n")
	_, err = w.Write(b.Bytes())
	return err
}

func nonNilSlice[T any](s []T) []T {
	if s == nil {
		return []T{}
	}
	return s
}

// predictionsCSV is the --out table: one row per sample, property and family, in rank order,
// values in field units with the unit in its own column.
func predictionsCSV(sv *lab.Survey, res *fit.SurveyResult) []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	w.Write([]string{"sample", "row", "property", "family", "rank", "unit", "lab", "published", "tuned", "tuned_cv", "refit", "refit_cv"})
	num := func(v []float64, a int) string {
		if v == nil {
			return ""
		}
		return strconv.FormatFloat(v[a], 'g', 6, 64)
	}
	for _, sp := range res.Properties {
		for r, f := range sp.Families {
			for a, i := range f.Pred.Sample {
				s := sv.Samples[i]
				w.Write([]string{s.ID, strconv.Itoa(s.Line), string(sp.Property), f.Family, strconv.Itoa(r + 1), sp.Unit,
					num(f.Pred.Lab, a), num(f.Pred.Published, a), num(f.Pred.Tuned, a), num(f.Pred.CV, a),
					num(f.Pred.Refit, a), num(f.Pred.RefitCV, a)})
			}
		}
	}
	w.Flush()
	return b.Bytes()
}
