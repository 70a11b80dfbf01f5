package fit

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"regexp"
	"runtime"
	"sort"
	"strings"
	"sync"

	"gonum.org/v1/gonum/mat"

	"labmatch/correlations"
	"labmatch/lab"
)

// Survey tuning (DESIGN.md §5, "for a survey, with k-fold cross-validation"): every family of
// pb (Pb from Rsb), bo (Bob), mu_dead and mu_sat is scored over a regional database of samples,
// as published, with one multiplier fitted to the whole database, and with the multiplier's
// cross-validated error: the samples are shuffled with a seed and split into k folds; each fold
// is predicted by the multiplier fitted to the others. Families are ranked by that
// cross-validated error, which says how well the tuned family predicts an oil it has not seen,
// the question a survey answers before a new discovery has its own lab report.
//
// The tuned forms are those of the report tuner's multiplier depth: Pb = m·Pb(Rsb), μ = m·μ,
// Bob = 1 + m·(Bob − 1), m in [0.5, 2] (the bounds of m = 2^tanh θ). The objective is the sum of
// squared relative errors, a quadratic in m, so the multiplier is solved in closed form and
// clamped to its bounds, which is the bounded optimum that Nelder–Mead on θ would approach.
// Each fold's multiplier comes from the database sums less the fold's: the cross-validation
// costs no more than the fit, and the published predictions are computed once per family.
//
// With refit, each family's declared coefficients (correlations.Coefficient) that the samples can
// determine are refitted as well, started from and regularised towards the published values
// with the report tuner's ridge form λ·Σ(c/c₀ − 1)² (λ scaled to the database's scatter, see
// SurveyPriorSpread), bounded to ¼–4× of published by c = c₀·4^tanh(u), by Levenberg–Marquardt
// on u; a multiplier, solved in closed form for each trial, joins them only when none of them
// changes the level of the predictions. The refit is cross-validated on the same folds, each
// fold refitted from the published values, so its training and cross-validated errors sit
// beside the multiplier's and show whether the refit generalises or overfits.

// SurveyProperties are the properties a survey scores, in order.
var SurveyProperties = []PropertyID{Pb, Bo, MuDead, MuSat}

// SurveyPriorSpread is the default τ of the survey refit's ridge: λ = σ²/τ², σ² the mean squared
// relative residual (per degree of freedom) of the multiplier fitted to the same training
// samples. The penalty is then that of a prior belief that a coefficient stays within about τ
// of its published value, weighed against the scatter the data actually show: the same λ would
// mean a much weaker pull on a database scattered by 10 % than on a report measured to 0.3 %.
// (At a report's 0.3 % the report tuner's RidgeStrength, 2e-4, is this form with τ ≈ 0.2; at a
// database's 8 % it is τ ≈ 6, no pull at all.) TestSurveyPriorSpreadChoice documents the choice
// of 0.1: the value on the 1–2–5 grid whose refits predict fresh oils best.
const SurveyPriorSpread = 0.1

// surveyLOOMax: with this many samples or fewer a property is cross-validated leave-one-out.
const surveyLOOMax = 30

// surveyStepRMS scales the refit's coordinates: one unit of a coordinate moves the relative
// residuals by this much (RMS), whatever the coefficient's sensitivity.
const surveyStepRMS = 0.01

// Identifiability thresholds of the refit (see identifiable): a coefficient whose derivative
// column has an RMS below surveyMinColumn changes no sample's prediction; one whose column keeps
// less than surveyKeepTol of its norm after projection on the coefficients kept before it
// duplicates them. The multiplier is freed beside the coefficients only when its column keeps
// more than surveyActsTol: Petrosky–Farshad's pressure scale, for one, differs from a multiplier
// only on the few samples where the pair is continued linearly below 14.7 psia (about 1 % of the
// norm), and a free multiplier beside it would be nearly degenerate.
const (
	surveyMinColumn = 1e-7
	surveyActsTol   = 0.02
	surveyKeepTol   = 1e-3
	surveyStep      = 1e-4 // relative step of the derivative columns
)

// SurveyOptions control RunSurvey. The zero value means: 10 folds (leave-one-out for 30 samples
// or fewer), seed 0, no refit, every survey property, one worker per CPU.
type SurveyOptions struct {
	Folds int    // k of the k-fold cross-validation; 0 = 10. Leave-one-out when a property has ≤ 30 samples or k ≥ its samples.
	Seed  uint64 // seed of the shuffle that makes the folds
	Refit bool   // also refit the families' declared coefficients
	// PriorSpread is τ of the refit ridge (see SurveyPriorSpread); 0 = SurveyPriorSpread.
	PriorSpread float64
	// Lambda, when > 0, fixes the ridge strength λ instead of deriving it from PriorSpread.
	Lambda     float64
	Properties []PropertyID // nil = SurveyProperties
	Workers    int          // 0 = runtime.GOMAXPROCS(0)
	// Progress, when set, is called after each unit of work with the units done and the total;
	// calls come one at a time, done increasing.
	Progress func(done, total int)
}

// SurveyStats are relative-error statistics in per cent over a family's samples.
type SurveyStats struct {
	Points int     `json:"points"`
	AARE   float64 `json:"aare_pct"`    // average absolute relative error
	Bias   float64 `json:"bias_pct"`    // average relative error
	SD     float64 `json:"sd_pct"`      // standard deviation of the relative errors
	MaxARE float64 `json:"max_are_pct"` // largest absolute relative error
}

// SurveyLoss counts the samples a family (or a property) could not use, for one reason.
type SurveyLoss struct {
	Reason string `json:"reason"`
	Count  int    `json:"count"`
	Lines  []int  `json:"lines"` // file lines of the first few
}

// surveyLossLines is how many lines a SurveyLoss lists.
const surveyLossLines = 5

// SurveyCoefficient is one declared coefficient of a refitted family.
type SurveyCoefficient struct {
	ID        string  `json:"id"`
	Role      string  `json:"role"`
	Published float64 `json:"published"`
	Refit     float64 `json:"refit"`
	// FoldMin and FoldMax span the values the cross-validation folds found: a wide span says
	// the samples do not pin the coefficient down.
	FoldMin float64 `json:"fold_min"`
	FoldMax float64 `json:"fold_max"`
	// Held says why the coefficient kept its published value; "" when it was refitted.
	Held string `json:"held,omitempty"`
}

// SurveyRefit is the refit of one family's declared coefficients.
type SurveyRefit struct {
	// Multiplier is fitted beside the coefficients only when none of them can change the level
	// of the predictions (MultiplierFree); otherwise it is 1.
	Multiplier     float64             `json:"multiplier"`
	MultiplierFree bool                `json:"multiplier_free"`
	Coefficients   []SurveyCoefficient `json:"coefficients"`
	Lambda         float64             `json:"ridge_lambda"` // λ of the full fit
	Tuned          SurveyStats         `json:"tuned"`        // training errors of the fit to every sample
	CV             SurveyStats         `json:"cv"`           // cross-validated errors
	Evals          int                 `json:"evaluations"`  // objective evaluations, all folds
	// Better: the refit's cross-validated AARE beats the multiplier's by the margins of the
	// report ladder (10 % and 0.05 points). Overfits: it fits the samples better than the
	// multiplier but predicts unseen ones worse, by 0.05 points or more. Worse: it predicts unseen
	// samples worse by that much, whatever its training error.
	Better   bool `json:"better"`
	Worse    bool `json:"worse"`
	Overfits bool `json:"overfits"`
}

// SurveyPredictions are a family's predictions at the samples it could evaluate, in the order of
// the survey's samples. Refit and RefitCV are nil without a refit.
type SurveyPredictions struct {
	Sample    []int     // index into lab.Survey.Samples
	Lab       []float64 // measured value
	Published []float64
	Tuned     []float64 // with the multiplier fitted to every sample
	CV        []float64 // with the multiplier fitted to the other folds
	Refit     []float64
	RefitCV   []float64
}

// SurveyFamily is one family's score on one property.
type SurveyFamily struct {
	Family       string       `json:"family"`
	Points       int          `json:"samples"`
	Lost         []SurveyLoss `json:"lost"`          // samples the family could not evaluate, by reason
	OutsideRange int          `json:"outside_range"` // samples with an input outside the family's original data
	Published    SurveyStats  `json:"published"`
	Multiplier   float64      `json:"multiplier"`
	Tuned        SurveyStats  `json:"tuned"`
	CV           SurveyStats  `json:"cv"` // Points 0: no cross-validation (fewer than 2 samples)
	Flags        []string     `json:"flags"`
	// Refit is nil without SurveyOptions.Refit; RefitNote says why a family has no refit.
	Refit     *SurveyRefit      `json:"refit,omitempty"`
	RefitNote string            `json:"refit_note,omitempty"`
	Pred      SurveyPredictions `json:"-"`
}

// SurveyProperty is one property's ranking.
type SurveyProperty struct {
	Property    PropertyID     `json:"property"`
	Unit        string         `json:"unit"`
	Samples     int            `json:"samples"` // samples with the lab value and the inputs it needs
	Folds       int            `json:"folds"`
	LeaveOneOut bool           `json:"leave_one_out"`
	Skipped     []SurveyLoss   `json:"skipped"`  // samples with the value but without an input the property needs
	Families    []SurveyFamily `json:"families"` // best first
}

// SurveyResult is the outcome of RunSurvey.
type SurveyResult struct {
	Samples     int              `json:"samples"`
	Seed        uint64           `json:"seed"`
	PriorSpread float64          `json:"prior_spread"`
	Properties  []SurveyProperty `json:"properties"` // in SurveyProperties order; a property without samples is left out
}

// Property returns the ranking of p, or nil when the survey has none.
func (r *SurveyResult) Property(p PropertyID) *SurveyProperty {
	for i := range r.Properties {
		if r.Properties[i].Property == p {
			return &r.Properties[i]
		}
	}
	return nil
}

// surveyForm says how the multiplier enters: Pb = m·Pb_c, μ = m·μ_c; Bo = 1 + m·(Bo_c − 1).
type surveyForm int

const (
	formScale surveyForm = iota
	formBo
)

// surveyFamilyEval evaluates one family at one sample, with coefficients c (nil: published).
type surveyFamilyEval struct {
	id    string
	entry correlations.Entry
	coef  []correlations.Coefficient
	eval  func(s *lab.SurveySample, c []float64) (float64, error)
}

// surveyOil is the oil description the correlations take.
func surveyOil(s *lab.SurveySample) correlations.Oil {
	return correlations.Oil{API: s.API, GasGravity: s.GasGravity, Temperature: s.Temperature,
		SepPressure: s.SepPressure, SepTemperature: s.SepTemperature, Rsb: s.Rsb}
}

// surveyFamilies returns the families of a property with their evaluators.
func surveyFamilies(p PropertyID) []surveyFamilyEval {
	var out []surveyFamilyEval
	add := func(id string, coef []correlations.Coefficient, eval func(*lab.SurveySample, []float64) (float64, error)) {
		e, _ := correlations.Lookup(catalogProperty(p), id) // every family has its entry (catalog tests)
		out = append(out, surveyFamilyEval{id: id, entry: e, coef: coef, eval: eval})
	}
	switch p {
	case Pb:
		for _, f := range correlations.SolutionGasFamilies() {
			add(f.ID, f.Coefficients, func(s *lab.SurveySample, c []float64) (float64, error) {
				if c == nil {
					return f.BubblePoint(s.Rsb, surveyOil(s))
				}
				return f.BubblePointWith(s.Rsb, surveyOil(s), c)
			})
		}
	case Bo:
		for _, f := range correlations.OilFVFFamilies() {
			add(f.ID, f.Coefficients, func(s *lab.SurveySample, c []float64) (float64, error) {
				if c == nil {
					return f.FVF(s.Pb, s.Rsb, surveyOil(s))
				}
				return f.FVFWith(s.Pb, s.Rsb, surveyOil(s), c)
			})
		}
	case MuDead:
		for _, f := range correlations.DeadViscosityFamilies() {
			add(f.ID, f.Coefficients, func(s *lab.SurveySample, c []float64) (float64, error) {
				if c == nil {
					return f.Viscosity(surveyOil(s))
				}
				return f.ViscosityWith(surveyOil(s), c)
			})
		}
	case MuSat:
		for _, f := range correlations.SatViscosityFamilies() {
			add(f.ID, f.Coefficients, func(s *lab.SurveySample, c []float64) (float64, error) {
				if c == nil {
					return f.Viscosity(s.DeadViscosity, s.Rsb, surveyOil(s))
				}
				return f.ViscosityWith(s.DeadViscosity, s.Rsb, surveyOil(s), c)
			})
		}
	}
	return out
}

// surveyLab returns a sample's lab value of p (0: absent) and, when the sample has the value
// but lacks an input the property needs, the reason it is skipped.
func surveyLab(p PropertyID, s *lab.SurveySample) (float64, string) {
	switch p {
	case Pb:
		return s.Pb, ""
	case Bo:
		return s.Bob, ""
	case MuDead:
		return s.DeadViscosity, ""
	case MuSat:
		if s.SatViscosity > 0 && s.DeadViscosity == 0 {
			return 0, "no dead-oil viscosity, which the live-oil families start from"
		}
		return s.SatViscosity, ""
	}
	return 0, ""
}

func surveyUnit(p PropertyID) string {
	switch p {
	case Pb:
		return "psia"
	case Bo:
		return "rb/STB"
	}
	return "cP"
}

func surveyFormOf(p PropertyID) surveyForm {
	if p == Bo {
		return formBo
	}
	return formScale
}

// surveyInput returns the value of a catalog range input for a sample of property p.
func surveyInput(p PropertyID, s *lab.SurveySample, input string) (float64, bool) {
	switch input {
	case "API":
		return s.API, true
	case "gas gravity":
		return s.GasGravity, true
	case "temperature":
		return s.Temperature, true
	case "Rsb", "Rs":
		return s.Rsb, true
	case "Pb", "p":
		return s.Pb, true
	case "mu_dead":
		if p == MuSat {
			return s.DeadViscosity, true
		}
	}
	return 0, false
}

func outsideRanges(p PropertyID, e correlations.Entry, s *lab.SurveySample) bool {
	for _, r := range e.Ranges {
		if v, ok := surveyInput(p, s, r.Input); ok && (v < r.Min || v > r.Max) {
			return true
		}
	}
	return false
}

// ErrSurveyOptions means SurveyOptions hold an unusable value.
var ErrSurveyOptions = errors.New("fit: bad survey options")

// surveyJob is one family of one property: its rows, published predictions and fits.
type surveyJob struct {
	prop   PropertyID
	form   surveyForm
	fam    surveyFamilyEval
	out    *SurveyFamily
	folds  int
	foldOf []int // fold of each of the family's samples (aligned with Pred.Sample)

	// refit state
	keep     []int     // indexes of the refitted coefficients
	uscale   []float64 // u = uscale·x for each kept coefficient
	freeMult bool      // the refit also fits a multiplier
	c0       []float64 // published values
	lambda   float64   // fixed λ; 0: from tau and the multiplier's scatter
	tau      float64
	folded   []surveyFit // per fold (and the full fit last)
}

// surveyFit is one refit (a fold's, or the full one).
type surveyFit struct {
	c      []float64
	m      float64
	lambda float64
	evals  int
	err    error
}

// RunSurvey ranks and tunes every family of the survey properties over the samples of sv.
func RunSurvey(sv *lab.Survey, opts SurveyOptions) (*SurveyResult, error) {
	if opts.Folds == 0 {
		opts.Folds = 10
	}
	if opts.Folds < 2 {
		return nil, fmt.Errorf("%w: %d folds; want 2 or more", ErrSurveyOptions, opts.Folds)
	}
	if opts.PriorSpread == 0 {
		opts.PriorSpread = SurveyPriorSpread
	}
	if !(opts.PriorSpread > 0) || math.IsInf(opts.PriorSpread, 0) || opts.Lambda < 0 || math.IsNaN(opts.Lambda) || math.IsInf(opts.Lambda, 0) {
		return nil, fmt.Errorf("%w: prior spread %g, λ %g", ErrSurveyOptions, opts.PriorSpread, opts.Lambda)
	}
	props := opts.Properties
	if props == nil {
		props = SurveyProperties
	}
	for _, p := range props {
		if surveyFamilies(p) == nil {
			return nil, fmt.Errorf("%w: %q is not a survey property (want pb, bo, mu_dead, mu_sat)", ErrSurveyOptions, p)
		}
	}
	if sv == nil || len(sv.Samples) == 0 {
		return nil, fmt.Errorf("%w: the survey has no usable samples", ErrNoData)
	}
	workers := opts.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	// One shuffle for the whole survey, so that every property and family sees the same folds.
	order := make([]int, len(sv.Samples))
	for i := range order {
		order[i] = i
	}
	rng := rand.New(rand.NewPCG(opts.Seed, 0x5eed5eed))
	rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
	rank := make([]int, len(order))
	for pos, i := range order {
		rank[i] = pos
	}

	res := &SurveyResult{Samples: len(sv.Samples), Seed: opts.Seed, PriorSpread: opts.PriorSpread}
	var jobs []*surveyJob
	for _, p := range props {
		sp := SurveyProperty{Property: p, Unit: surveyUnit(p)}
		var rows []int
		skipped := map[string]*SurveyLoss{}
		var skipOrder []string
		for i := range sv.Samples {
			s := &sv.Samples[i]
			v, why := surveyLab(p, s)
			if why != "" {
				addLoss(skipped, &skipOrder, why, s.Line)
				continue
			}
			if v > 0 {
				rows = append(rows, i)
			}
		}
		sp.Skipped = lossList(skipped, skipOrder)
		if len(rows) == 0 {
			continue
		}
		sp.Samples = len(rows)
		// Folds: the property's samples in shuffle order, dealt round-robin.
		byRank := append([]int(nil), rows...)
		sort.Slice(byRank, func(a, b int) bool { return rank[byRank[a]] < rank[byRank[b]] })
		fold := make(map[int]int, len(rows))
		k := opts.Folds
		if len(rows) <= surveyLOOMax || k >= len(rows) {
			k = len(rows)
			sp.LeaveOneOut = true
		}
		for j, i := range byRank {
			fold[i] = j % k
		}
		sp.Folds = k
		fams := surveyFamilies(p)
		sp.Families = make([]SurveyFamily, len(fams))
		for fi, f := range fams {
			job := &surveyJob{prop: p, form: surveyFormOf(p), fam: f, out: &sp.Families[fi], folds: k}
			job.out.Family = f.id
			job.evaluate(sv, rows, fold)
			jobs = append(jobs, job)
		}
		res.Properties = append(res.Properties, sp)
	}
	if len(res.Properties) == 0 {
		return nil, fmt.Errorf("%w: no sample has a value of %s", ErrNoData, joinProps(props))
	}

	// Work: the published evaluation and multiplier of every family, then each refit's folds.
	prog := &surveyProgress{f: opts.Progress}
	prog.total = len(jobs)
	if opts.Refit {
		for _, j := range jobs {
			if len(j.fam.coef) > 0 {
				prog.total += j.folds + 1
			}
		}
	}
	runParallel(workers, len(jobs), func(i int) {
		jobs[i].published(sv)
		prog.step()
	})
	if opts.Refit {
		type unit struct {
			job  *surveyJob
			fold int // -1: the full fit
		}
		var units []unit
		for _, j := range jobs {
			if !j.prepareRefit(sv, opts) {
				if len(j.fam.coef) > 0 { // counted in the total: nothing to fit after all
					for k := 0; k <= j.folds; k++ {
						prog.step()
					}
				}
				continue
			}
			j.folded = make([]surveyFit, j.folds+1)
			units = append(units, unit{j, -1})
			for f := 0; f < j.folds; f++ {
				units = append(units, unit{j, f})
			}
		}
		runParallel(workers, len(units), func(i int) {
			u := units[i]
			slot := u.fold
			if slot < 0 {
				slot = u.job.folds
			}
			u.job.folded[slot] = u.job.refit(sv, u.fold)
			prog.step()
		})
		for _, j := range jobs {
			j.finishRefit(sv)
		}
	}
	for i := range res.Properties {
		sortSurveyFamilies(res.Properties[i].Families)
	}
	return res, nil
}

func joinProps(ps []PropertyID) string {
	s := make([]string, len(ps))
	for i, p := range ps {
		s[i] = string(p)
	}
	return strings.Join(s, ", ")
}

// surveyProgress serialises the progress callback.
type surveyProgress struct {
	mu          sync.Mutex
	f           func(done, total int)
	done, total int
}

func (p *surveyProgress) step() {
	if p.f == nil {
		return
	}
	p.mu.Lock()
	p.done++
	p.f(p.done, p.total)
	p.mu.Unlock()
}

// runParallel calls f(0..n−1) on up to workers goroutines.
func runParallel(workers, n int, f func(int)) {
	if workers > n {
		workers = n
	}
	if workers <= 1 {
		for i := 0; i < n; i++ {
			f(i)
		}
		return
	}
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				f(i)
			}
		}()
	}
	for i := 0; i < n; i++ {
		next <- i
	}
	close(next)
	wg.Wait()
}

func addLoss(m map[string]*SurveyLoss, order *[]string, reason string, line int) {
	l, ok := m[reason]
	if !ok {
		l = &SurveyLoss{Reason: reason}
		m[reason] = l
		*order = append(*order, reason)
	}
	l.Count++
	if len(l.Lines) < surveyLossLines {
		l.Lines = append(l.Lines, line)
	}
}

func lossList(m map[string]*SurveyLoss, order []string) []SurveyLoss {
	out := make([]SurveyLoss, 0, len(order))
	for _, r := range order {
		out = append(out, *m[r])
	}
	sort.SliceStable(out, func(a, b int) bool { return out[a].Count > out[b].Count })
	return out
}

// evaluate records the family's rows and fold labels; the published predictions come in
// published (run in parallel).
func (j *surveyJob) evaluate(sv *lab.Survey, rows []int, fold map[int]int) {
	j.out.Pred.Sample = rows // narrowed by published to the rows the family can evaluate
	j.foldOf = make([]int, len(rows))
	for a, i := range rows {
		j.foldOf[a] = fold[i]
	}
}

// lossReason shortens a correlation error to a reason many samples can share: the numbers of
// the one sample ("Rsb = 1e4", "(−0.008 cP)") are dropped.
func lossReason(err error) string {
	s := strings.TrimPrefix(err.Error(), "correlations: ")
	s = reParenNumber.ReplaceAllString(s, "")
	return reEqualsNumber.ReplaceAllString(s, "")
}

var (
	reNumber       = `[-−]?[0-9]+(\.[0-9]*)?(e[-+]?[0-9]+)?`
	reParenNumber  = regexp.MustCompile(`\s*\(` + reNumber + `(\s[^()]*)?\)`)
	reEqualsNumber = regexp.MustCompile(`\s*=\s*` + reNumber + `(\s?(psia|scf/STB|°F|°API|cP))?`)
)

// published evaluates the family at every sample, fits the multiplier to all of them and to
// each fold's complement, and fills the statistics.
func (j *surveyJob) published(sv *lab.Survey) {
	out := j.out
	rows := out.Pred.Sample
	n := len(rows)
	pr := SurveyPredictions{Sample: make([]int, 0, n), Lab: make([]float64, 0, n), Published: make([]float64, 0, n)}
	folds := make([]int, 0, n)
	lost := map[string]*SurveyLoss{}
	var lostOrder []string
	for a, i := range rows {
		s := &sv.Samples[i]
		y, _ := surveyLab(j.prop, s)
		v, err := j.fam.eval(s, nil)
		if err == nil && (math.IsNaN(v) || math.IsInf(v, 0) || !(v > 0)) {
			err = fmt.Errorf("a non-positive or non-finite value (%g)", v)
		}
		if err != nil {
			addLoss(lost, &lostOrder, lossReason(err), s.Line)
			continue
		}
		if outsideRanges(j.prop, j.fam.entry, s) {
			out.OutsideRange++
		}
		pr.Sample = append(pr.Sample, i)
		pr.Lab = append(pr.Lab, y)
		pr.Published = append(pr.Published, v)
		folds = append(folds, j.foldOf[a])
	}
	j.foldOf = folds
	out.Lost = lossList(lost, lostOrder)
	out.Points = len(pr.Sample)
	out.Pred = pr
	if out.Points == 0 {
		out.Multiplier = 1
		out.Flags = append(out.Flags, "cannot be evaluated for any sample")
		return
	}
	out.Published = surveyStats(pr.Lab, pr.Published)

	// Multiplier: relative residual r = m·u − v (see surveyUV); m = Σuv/Σu², clamped.
	var suu, suv float64
	fu := make([]float64, j.folds)
	fv := make([]float64, j.folds)
	for a := range pr.Lab {
		u, v := surveyUV(j.form, pr.Lab[a], pr.Published[a])
		suu += u * u
		suv += u * v
		fu[j.foldOf[a]] += u * u
		fv[j.foldOf[a]] += u * v
	}
	out.Multiplier = surveyMultiplier(suv, suu)
	pr.Tuned = make([]float64, out.Points)
	for a, g := range pr.Published {
		pr.Tuned[a] = surveyApply(j.form, out.Multiplier, g)
	}
	out.Tuned = surveyStats(pr.Lab, pr.Tuned)
	if out.Points >= 2 {
		foldM := make([]float64, j.folds)
		for f := range foldM {
			foldM[f] = surveyMultiplier(suv-fv[f], suu-fu[f])
		}
		pr.CV = make([]float64, out.Points)
		for a, g := range pr.Published {
			pr.CV[a] = surveyApply(j.form, foldM[j.foldOf[a]], g)
		}
		out.CV = surveyStats(pr.Lab, pr.CV)
	}
	out.Pred = pr
	out.Flags = append(out.Flags, surveyMultiplierFlags(out.Multiplier)...)
	if out.OutsideRange > 0 {
		out.Flags = append(out.Flags, fmt.Sprintf("%d of %d samples outside its original data", out.OutsideRange, out.Points))
	}
}

// surveyUV returns u and v of the relative residual r = m·u − v of a sample with lab value y
// and correlation value g: Pb, μ: m·g/y − 1; Bo: (1 + m·(g − 1) − y)/y.
func surveyUV(form surveyForm, y, g float64) (u, v float64) {
	if form == formBo {
		return (g - 1) / y, (y - 1) / y
	}
	return g / y, 1
}

func surveyApply(form surveyForm, m, g float64) float64 {
	if form == formBo {
		return 1 + m*(g-1)
	}
	return m * g
}

// surveyMultiplier is the least-squares multiplier Σuv/Σu² within [MinMultiplier,
// MaxMultiplier]; 1 when the sums carry no information.
func surveyMultiplier(suv, suu float64) float64 {
	if !(suu > 0) {
		return 1
	}
	return clamp(suv/suu, MinMultiplier, MaxMultiplier)
}

func surveyMultiplierFlags(m float64) []string {
	switch {
	case m <= MinMultiplier || m >= MaxMultiplier:
		return []string{fmt.Sprintf("multiplier %.3f is at its bound [%g, %g]: this family cannot describe these oils", m, MinMultiplier, MaxMultiplier)}
	case m < FlagLowMult || m > FlagHighMult:
		return []string{fmt.Sprintf("multiplier %.3f is outside [%g, %g]: the family describes these oils poorly", m, FlagLowMult, FlagHighMult)}
	}
	return nil
}

// surveyStats returns the relative-error statistics of pred against lab.
func surveyStats(lab, pred []float64) SurveyStats {
	st := SurveyStats{Points: len(lab)}
	if st.Points == 0 {
		return st
	}
	var sum, sumAbs, sumSq float64
	for i, y := range lab {
		e := 100 * (pred[i] - y) / y
		sum += e
		sumAbs += math.Abs(e)
		sumSq += e * e
		st.MaxARE = math.Max(st.MaxARE, math.Abs(e))
	}
	n := float64(st.Points)
	st.AARE = sumAbs / n
	st.Bias = sum / n
	if st.Points > 1 {
		st.SD = math.Sqrt(math.Max(0, (sumSq-n*st.Bias*st.Bias)/(n-1)))
	}
	return st
}

// sortSurveyFamilies orders families by cross-validated AARE (tuned AARE where there is none),
// in 0.01 % steps as printed, then published AARE, then id; families without samples last. The
// steps keep round-off from ordering families that tie, such as every family tuned to a single
// sample (tuned AARE 0 up to 1e-14).
func sortSurveyFamilies(fs []SurveyFamily) {
	key := func(f SurveyFamily) float64 {
		switch {
		case f.Points == 0:
			return math.Inf(1)
		case f.CV.Points > 0:
			return math.Round(f.CV.AARE * 100)
		}
		return math.Round(f.Tuned.AARE * 100)
	}
	sort.SliceStable(fs, func(a, b int) bool {
		ka, kb := key(fs[a]), key(fs[b])
		if ka != kb {
			return ka < kb
		}
		if fs[a].Published.AARE != fs[b].Published.AARE {
			return fs[a].Published.AARE < fs[b].Published.AARE
		}
		return fs[a].Family < fs[b].Family
	})
}

// prepareRefit decides which declared coefficients the survey can refit and sets the ridge;
// false when the family has nothing to refit (RefitNote says why).
func (j *surveyJob) prepareRefit(sv *lab.Survey, opts SurveyOptions) bool {
	out := j.out
	switch {
	case len(j.fam.coef) == 0:
		out.RefitNote = "the family declares no coefficients to refit"
		return false
	case out.Points < 3:
		out.RefitNote = "fewer than 3 samples"
		return false
	}
	j.c0 = correlations.Published(j.fam.coef)
	held := j.identifiable(sv)
	out.Refit = &SurveyRefit{Coefficients: make([]SurveyCoefficient, len(j.c0))}
	for k, c := range j.fam.coef {
		out.Refit.Coefficients[k] = SurveyCoefficient{ID: c.ID, Role: c.Role, Published: c.Value, Refit: c.Value,
			FoldMin: c.Value, FoldMax: c.Value, Held: held[k]}
	}
	out.Refit.MultiplierFree = j.freeMult
	if len(j.keep) == 0 {
		out.RefitNote = "none of its declared coefficients changes these predictions"
		out.Refit = nil
		return false
	}
	j.lambda, j.tau = opts.Lambda, opts.PriorSpread
	return true
}

// identifiable chooses what the refit frees: Gram–Schmidt on the columns of the relative
// residuals' derivatives by the relative change of each declared coefficient, at the published
// values and in declaration order, then the multiplier's column. A coefficient that changes no
// prediction, or duplicates the ones kept before it, keeps its published value; the multiplier
// is freed only when the kept coefficients cannot already change the level of the predictions
// (most declarations hold a pressure or viscosity scale that acts as it). It returns, per
// coefficient, why it is held ("" for the refitted ones, listed in j.keep).
func (j *surveyJob) identifiable(sv *lab.Survey) []string {
	pr := &j.out.Pred
	n := len(pr.Sample)
	held := make([]string, len(j.c0))
	var basis [][]float64
	// add orthogonalises col against the basis and returns the fraction of its norm that is
	// left; above surveyKeepTol the normalised remainder joins the basis.
	add := func(col []float64) float64 {
		norm0 := math.Sqrt(dot(col, col))
		if norm0 == 0 {
			return 0
		}
		v := append([]float64(nil), col...)
		for _, b := range basis {
			d := dot(v, b)
			for i := range v {
				v[i] -= d * b[i]
			}
		}
		nv := math.Sqrt(dot(v, v))
		if nv/norm0 > surveyKeepTol {
			for i := range v {
				v[i] /= nv
			}
			basis = append(basis, v)
		}
		return nv / norm0
	}
	up, dn := make([]float64, len(j.c0)), make([]float64, len(j.c0))
	for k := range j.c0 {
		copy(up, j.c0)
		copy(dn, j.c0)
		up[k] *= 1 + surveyStep
		dn[k] *= 1 - surveyStep
		col := make([]float64, n)
		failed := false
		for a, i := range pr.Sample {
			s := &sv.Samples[i]
			gu, err1 := j.fam.eval(s, up)
			gd, err2 := j.fam.eval(s, dn)
			if err1 != nil || err2 != nil {
				failed = true
				break
			}
			uu, _ := surveyUV(j.form, pr.Lab[a], gu)
			ud, _ := surveyUV(j.form, pr.Lab[a], gd)
			col[a] = (uu - ud) / (2 * surveyStep)
		}
		switch {
		case failed:
			held[k] = "the family cannot be evaluated for every sample when it changes"
		case math.Sqrt(dot(col, col)/float64(n)) < surveyMinColumn:
			held[k] = "no sample's prediction depends on it"
		case len(basis) >= n-2:
			held[k] = "too few samples to refit more coefficients"
		case add(col) <= surveyKeepTol:
			held[k] = "the coefficients refitted before it already make the same change"
		default:
			j.keep = append(j.keep, k)
			// Optimiser coordinate x = u/scale, with scale such that x = 1 moves the relative
			// residuals by surveyStepRMS (RMS): a simplex of size 1 then has sides of similar
			// effect, whatever the coefficient's sensitivity.
			rms := math.Sqrt(dot(col, col) / float64(n))
			j.uscale = append(j.uscale, math.Min(1, surveyStepRMS/(rms*math.Ln2*2)))
		}
	}
	mcol := make([]float64, n)
	for a := range mcol {
		mcol[a], _ = surveyUV(j.form, pr.Lab[a], pr.Published[a])
	}
	j.freeMult = add(mcol) > surveyActsTol
	return held
}

// refit fits the kept coefficients to the samples outside fold (−1: to every sample), from the
// published values.
func (j *surveyJob) refit(sv *lab.Survey, fold int) surveyFit {
	pr := &j.out.Pred
	var idx []int // positions in pr of the training samples
	for a := range pr.Sample {
		if fold < 0 || j.foldOf[a] != fold {
			idx = append(idx, a)
		}
	}
	fit := surveyFit{c: append([]float64(nil), j.c0...), m: 1}
	if len(idx) < 2 {
		fit.err = errors.New("fewer than 2 training samples")
		return fit
	}
	vs := make([]float64, len(idx))
	var suu, suv float64
	for b, a := range idx {
		var u float64
		u, vs[b] = surveyUV(j.form, pr.Lab[a], pr.Published[a]) // v does not depend on the correlation
		suu += u * u
		suv += u * vs[b]
	}
	// The ridge strength from the multiplier's scatter on these training samples.
	lambda := j.lambda
	if lambda == 0 {
		m := surveyMultiplier(suv, suu)
		rss := 0.0
		for b, a := range idx {
			u, _ := surveyUV(j.form, pr.Lab[a], pr.Published[a])
			rss += (m*u - vs[b]) * (m*u - vs[b])
		}
		lambda = rss / float64(len(idx)-1) / (j.tau * j.tau)
	}
	fit.lambda = lambda
	sqrtLambda := math.Sqrt(lambda)
	c := make([]float64, len(j.c0))
	us := make([]float64, len(idx))
	// residuals fills out with the training residuals m·u − v, then √λ·(c/c₀ − 1) for each
	// refitted coefficient: its sum of squares is the objective. false: the family cannot be
	// evaluated there.
	residuals := func(x, out []float64) bool {
		copy(c, j.c0)
		for k, ci := range j.keep {
			c[ci] = j.c0[ci] * math.Pow(MaxCoefficientRatio, math.Tanh(j.uscale[k]*x[k]))
			out[len(idx)+k] = sqrtLambda * (c[ci]/j.c0[ci] - 1)
		}
		var suu, suv float64
		for b, a := range idx {
			g, err := j.fam.eval(&sv.Samples[pr.Sample[a]], c)
			if err != nil || math.IsNaN(g) || math.IsInf(g, 0) || !(g > 0) {
				return false
			}
			u, _ := surveyUV(j.form, pr.Lab[a], g)
			us[b] = u
			suu += u * u
			suv += u * vs[b]
		}
		m := 1.0
		if j.freeMult {
			m = surveyMultiplier(suv, suu)
		}
		fit.m = m
		for b := range idx {
			out[b] = m*us[b] - vs[b]
		}
		return true
	}
	x, evals, err := levenbergMarquardt(residuals, make([]float64, len(j.keep)), len(idx)+len(j.keep))
	fit.evals = evals
	if err != nil {
		fit.err = err
		return fit
	}
	out := make([]float64, len(idx)+len(j.keep))
	residuals(x, out) // leaves the optimum's coefficients in c and its multiplier in fit.m
	copy(fit.c, c)
	return fit
}

// Levenberg–Marquardt settings of the survey refit.
const (
	lmMaxIter    = 200
	lmFDStep     = 1e-6  // forward-difference step in the scaled coordinates
	lmGradTol    = 1e-8  // residuals orthogonal to the Jacobian's columns to this cosine: converged
	lmCostTol    = 1e-12 // an accepted step that lowers the cost by less than this (relative) is small
	lmSmallSteps = 3     // this many small steps in a row end the fit
)

// levenbergMarquardt minimises the sum of squares of resid(x) over x ∈ ℝᵏ from x0 (k = len(x0)), with
// Marquardt's scaling of the damping by the diagonal of JᵀJ and a forward-difference Jacobian
// (Marquardt, D.W. (1963), "An Algorithm for Least-Squares Estimation of Nonlinear Parameters",
// J. SIAM 11 (2): 431–441; Nielsen's update of the damping, as in Madsen, Nielsen and
// Tingleff (2004), "Methods for Non-Linear Least Squares Problems", DTU, §3.2). The survey
// refit is a sum of squared residuals of hundreds of samples in a few coefficients, where
// Nelder–Mead (the report tuner's method) was measured to stop short of the optimum: its
// training error came out above its own cross-validated error; the report tuner's refit
// depth showed the same (a coefficient correlated with the multiplier). It returns the optimum,
// the number of residual evaluations, and an error when resid cannot be evaluated at the start.
// m is the number of residuals.
func levenbergMarquardt(resid func(x, out []float64) bool, x0 []float64, m int) ([]float64, int, error) {
	k := len(x0)
	x := append([]float64(nil), x0...)
	r := make([]float64, m)
	evals := 1
	if !resid(x, r) {
		return nil, evals, errors.New("fit: the family cannot be evaluated for every point at the start")
	}
	cost := dot(r, r)
	jac := mat.NewDense(m, k, nil)
	rt := make([]float64, m)
	xt := make([]float64, k)
	var a mat.SymDense
	g := mat.NewVecDense(k, nil)
	delta := mat.NewVecDense(k, nil)
	mu, nu := -1.0, 2.0
	small := 0 // accepted steps in a row that gained less than lmCostTol
	for iter := 0; iter < lmMaxIter; iter++ {
		// Jacobian by forward differences.
		for q := 0; q < k; q++ {
			copy(xt, x)
			xt[q] += lmFDStep
			evals++
			if !resid(xt, rt) {
				copy(xt, x)
				xt[q] -= lmFDStep
				evals++
				if !resid(xt, rt) {
					return x, evals, nil // the domain's edge: stay where the fit is
				}
				for i := range rt {
					jac.Set(i, q, (r[i]-rt[i])/lmFDStep)
				}
				continue
			}
			for i := range rt {
				jac.Set(i, q, (rt[i]-r[i])/lmFDStep)
			}
		}
		a.SymOuterK(1, jac.T()) // JᵀJ
		g.MulVec(jac.T(), mat.NewVecDense(m, r))
		// Converged when the residuals are orthogonal to every column of the Jacobian to within
		// lmGradTol (MINPACK's gtol test: the cosine of the angle between r and each column).
		orthogonal := true
		for q := 0; q < k; q++ {
			if n := math.Sqrt(a.At(q, q) * cost); n > 0 && math.Abs(g.AtVec(q)) > lmGradTol*n {
				orthogonal = false
			}
		}
		if orthogonal {
			return x, evals, nil
		}
		if mu < 0 {
			maxDiag := 0.0
			for q := 0; q < k; q++ {
				maxDiag = math.Max(maxDiag, a.At(q, q))
			}
			mu = 1e-3 * maxDiag
		}
		accepted := false
		for !accepted {
			damped := mat.NewSymDense(k, nil)
			damped.CopySym(&a)
			for q := 0; q < k; q++ {
				damped.SetSym(q, q, a.At(q, q)+mu*math.Max(a.At(q, q), 1e-12))
			}
			var ch mat.Cholesky
			if !ch.Factorize(damped) {
				mu *= nu
				nu *= 2
				if mu > 1e30 {
					return x, evals, nil
				}
				continue
			}
			if err := ch.SolveVecTo(delta, g); err != nil {
				return x, evals, nil
			}
			for q := 0; q < k; q++ {
				xt[q] = x[q] - delta.AtVec(q)
			}
			evals++
			newCost := math.Inf(1)
			if resid(xt, rt) {
				newCost = dot(rt, rt)
			}
			// Gain ratio: actual over predicted reduction (Madsen et al., eq. 3.14).
			pred := 0.0
			for q := 0; q < k; q++ {
				d := delta.AtVec(q)
				pred += d * (mu*math.Max(a.At(q, q), 1e-12)*d + g.AtVec(q))
			}
			if newCost < cost && pred > 0 {
				rho := (cost - newCost) / pred
				mu *= math.Max(1.0/3, 1-math.Pow(2*rho-1, 3))
				nu = 2
				gain := cost - newCost
				copy(x, xt)
				copy(r, rt)
				cost = newCost
				accepted = true
				if gain <= lmCostTol*cost {
					if small++; small >= lmSmallSteps {
						return x, evals, nil
					}
				} else {
					small = 0
				}
			} else {
				mu *= nu
				nu *= 2
				if mu > 1e30 {
					return x, evals, nil // no step lowers the cost: a minimum to working precision
				}
			}
		}
	}
	return x, evals, nil
}

// finishRefit gathers the fold refits into predictions and statistics.
func (j *surveyJob) finishRefit(sv *lab.Survey) {
	out := j.out
	if out.Refit == nil || j.folded == nil {
		return
	}
	full := j.folded[j.folds]
	rf := out.Refit
	if full.err != nil {
		out.RefitNote = "the refit failed: " + full.err.Error()
		out.Refit = nil
		return
	}
	pr := &out.Pred
	n := len(pr.Sample)
	pr.Refit = make([]float64, n)
	pr.RefitCV = make([]float64, n)
	for a, i := range pr.Sample {
		s := &sv.Samples[i]
		g, err := j.fam.eval(s, full.c)
		if err != nil {
			out.RefitNote = "the refit cannot be evaluated for sample " + s.ID + ": " + err.Error()
			out.Refit, pr.Refit, pr.RefitCV = nil, nil, nil
			return
		}
		pr.Refit[a] = surveyApply(j.form, full.m, g)
		ff := j.folded[j.foldOf[a]]
		if ff.err != nil {
			out.RefitNote = fmt.Sprintf("the refit without fold %d failed: %v", j.foldOf[a]+1, ff.err)
			out.Refit, pr.Refit, pr.RefitCV = nil, nil, nil
			return
		}
		g, err = j.fam.eval(s, ff.c)
		if err != nil {
			// The fold's coefficients may leave the family's domain for a sample they never saw:
			// that is a failed prediction, scored as the published one would be lost.
			out.RefitNote = fmt.Sprintf("the refit of fold %d cannot predict sample %s: %v", j.foldOf[a]+1, s.ID, err)
			out.Refit, pr.Refit, pr.RefitCV = nil, nil, nil
			return
		}
		pr.RefitCV[a] = surveyApply(j.form, ff.m, g)
	}
	rf.Multiplier = full.m
	rf.Lambda = full.lambda
	for k := range rf.Coefficients {
		c := &rf.Coefficients[k]
		c.Refit = full.c[k]
		c.FoldMin, c.FoldMax = j.folded[0].c[k], j.folded[0].c[k]
		for f := 1; f < j.folds; f++ {
			c.FoldMin = math.Min(c.FoldMin, j.folded[f].c[k])
			c.FoldMax = math.Max(c.FoldMax, j.folded[f].c[k])
		}
	}
	for _, f := range j.folded {
		rf.Evals += f.evals
	}
	rf.Tuned = surveyStats(pr.Lab, pr.Refit)
	rf.CV = surveyStats(pr.Lab, pr.RefitCV)
	cvM, cvR := out.CV.AARE, rf.CV.AARE
	rf.Better = cvR <= (1-chooseRelMargin)*cvM && cvM-cvR >= chooseAbsMargin
	rf.Worse = cvR >= cvM+chooseAbsMargin
	rf.Overfits = rf.Tuned.AARE < out.Tuned.AARE && rf.Worse
}
