package fit

import (
	"fmt"
	"math"
	"runtime"
	"sort"
	"strings"
	"sync"

	"labmatch/correlations"
)

// fallbackDead and fallbackSat are used for the dead-oil viscosity and the viscosity at Pb that
// the live-oil families need when the report has no such measurement and no tuned value is
// given (Beggs and Robinson 1975 is the common default).
const (
	fallbackDead = "beggs-robinson"
	fallbackSat  = "beggs-robinson"
)

// chainInputs returns the dead-oil viscosity and the viscosity at Pb for the live-oil
// families: measured values where the report has them, else the given tuned results, else
// published fallbacks.
func (ds *Dataset) chainInputs(dead, sat *Result) (muDead, muB float64, err error) {
	muDead = ds.MuDeadLab
	if muDead == 0 {
		fam, q := fallbackDead, Published
		if dead != nil {
			fam, q = dead.Family, dead.Params
		}
		f, err := correlations.DeadViscosityByID(fam)
		if err != nil {
			return 0, 0, err
		}
		v, err := f.Viscosity(ds.Oil)
		if err != nil {
			return 0, 0, err
		}
		muDead = q.Multiplier*v + q.Shift
	}
	muB = ds.MuBLab
	if muB == 0 {
		fam, q := fallbackSat, Published
		if sat != nil {
			fam, q = sat.Family, sat.Params
		}
		f, err := correlations.SatViscosityByID(fam)
		if err != nil {
			return 0, 0, err
		}
		v, err := f.Viscosity(muDead, ds.Rsb, ds.Oil)
		if err != nil {
			return 0, 0, err
		}
		muB = q.Multiplier*v + q.Shift
	}
	return muDead, muB, nil
}

// Tune tunes one family to one property of the dataset. The live-oil viscosity families use
// the measured dead-oil viscosity and viscosity at Pb, or published fallbacks when the report
// has none (TuneAll chains the tuned values instead).
func Tune(ds *Dataset, prop PropertyID, family string, opts Options) (Result, error) {
	return tuneWith(ds, prop, family, opts, nil, nil, nil, "")
}

// tuneWith tunes (fixed == nil) or evaluates at fixed parameters one family of a property.
func tuneWith(ds *Dataset, prop PropertyID, family string, opts Options, dead, sat *Result, fixed *Params, fixedDepth Depth) (Result, error) {
	muDead, muB, err := 0.0, 0.0, error(nil)
	if prop == MuSat || prop == MuUnder {
		if muDead, muB, err = ds.chainInputs(dead, sat); err != nil {
			return Result{}, fmt.Errorf("fit: %s: %w", prop, err)
		}
	}
	m, err := newModel(ds, prop, family, opts, muDead, muB)
	if err != nil {
		return Result{}, err
	}
	pr, err := newProblem(ds, prop, m, opts)
	if err != nil {
		return Result{}, err
	}
	res := Result{Property: prop, Family: family, Excluded: append([]int(nil), opts.Excluded[prop]...), Anchored: pr.anchored}
	sort.Ints(res.Excluded)
	for _, c := range m.coefficients() {
		res.CoefficientIDs = append(res.CoefficientIDs, c.ID)
	}
	pubVals := make([]float64, len(pr.pts))
	if res.Published, err = pr.stats(Published, pubVals); err != nil {
		return res, fmt.Errorf("fit: %s %s: the published correlation cannot be evaluated: %w", prop, family, err)
	}
	var chosen *rungFit
	if fixed != nil {
		chosen, err = pr.evaluateFixed(*fixed, fixedDepth)
		if err != nil {
			return res, err
		}
	} else {
		if chosen, err = pr.ladder(&res, opts.depthFor(prop)); err != nil {
			return res, err
		}
	}
	res.Params, res.Depth, res.Tuned, res.LOO = chosen.q, chosen.rung.Depth, chosen.rung.Tuned, chosen.rung.LOO
	res.Anchored = pr.anchored // recorded parameters may not honour the anchor
	for i, pt := range pr.pts {
		res.Residuals = append(res.Residuals, Residual{Quantity: pt.Quantity, Unit: pt.Unit, Pressure: pt.Pressure,
			Lab: pt.Lab, Published: pubVals[i], Tuned: chosen.vals[i], Excluded: !pr.use[i], Source: pt.Source, Line: pt.Line})
	}
	pr.lay = chosen.lay
	half, assumed := pr.interval(chosen.q)
	res.CIAssumed = assumed
	if half != nil {
		res.CI95 = map[string][2]float64{}
		for j, name := range chosen.lay.names(res.CoefficientIDs) {
			v := paramValue(chosen.q, name, res.CoefficientIDs)
			res.CI95[name] = [2]float64{v - half[j], v + half[j]}
		}
	}
	res.ShiftUnit, res.Shifted = shiftUnit(prop, pr.pts), chosen.lay.shift || chosen.q.Shift != 0
	res.Flags = append(append([]string(nil), pr.notes...), chosen.rung.Flags...)
	if chosen.rung.Depth != DepthPublished {
		res.NoFit = noFitRemark(prop, family, pr.pts, pr.free, chosen.vals)
	}
	if e, err := catalogEntry(prop, family); err == nil {
		res.OutOfRange = e.Check(ds.rangeInputs())
	}
	return res, nil
}

// paramValue returns the natural value of a named parameter.
func paramValue(q Params, name string, ids []string) float64 {
	switch name {
	case "multiplier":
		return q.Multiplier
	case "shift":
		return q.Shift
	case "bend":
		return q.bend()
	}
	for j, id := range ids {
		if id == name && q.Coefficients != nil {
			return q.Coefficients[j]
		}
	}
	return math.NaN()
}

// ladder fits every rung, computes its leave-one-out error, and returns the chosen (or forced)
// one; the rungs go to res.Ladder.
func (pr *problem) ladder(res *Result, force Depth) (*rungFit, error) {
	fits := make([]*rungFit, len(Depths))
	nFree := pr.freePoints()
	var prev []float64 // start of the next rung: the shallower rung's optimum, extended
	var prevLay layout
	beyond := false // past a forced depth: deeper rungs are not fitted
	for i, d := range Depths {
		r := Rung{Depth: d}
		if beyond {
			r.Skipped = fmt.Sprintf("not fitted: depth %s was asked for", force)
			res.Ladder = append(res.Ladder, r)
			continue
		}
		beyond = d == force
		l, skip := pr.layoutFor(d)
		if skip == "" && l.size() > nFree {
			skip = fmt.Sprintf("%s for %s", plural(nFree, "free point"), plural(l.size(), "parameter"))
		}
		if skip != "" {
			r.Skipped = skip
			res.Ladder = append(res.Ladder, r)
			continue
		}
		rf, err := pr.fitRung(d, l, extendStart(pr, prevLay, prev, l))
		if err != nil {
			if d == DepthPublished {
				return nil, err
			}
			r.Skipped = "the fit failed: " + err.Error()
			res.Ladder = append(res.Ladder, r)
			continue
		}
		pr.leaveOneOut(&rf)
		res.Evals += rf.evals
		fits[i] = &rf
		prev, prevLay = rf.x, l
		res.Ladder = append(res.Ladder, rf.rung)
	}
	pick := chooseRung(pr.prop, fits)
	if force != "" {
		want := -1
		for i, d := range Depths {
			if d == force {
				want = i
			}
		}
		if want < 0 {
			return nil, fmt.Errorf("fit: unknown depth %q (want one of %v)", force, Depths)
		}
		pick = -1
		for i := want; i >= 0; i-- {
			if fits[i] != nil {
				pick = i
				break
			}
		}
		if pick != want {
			pr.notes = append(pr.notes, fmt.Sprintf("%s depth %s was asked for but is skipped (%s): %s used", pr.prop, force, res.Ladder[want].Skipped, Depths[pick]))
		}
	}
	if pick < 0 {
		return nil, fmt.Errorf("fit: %s: no rung could be fitted", pr.prop)
	}
	res.Ladder[pick].Chosen = true
	fits[pick].rung.Chosen = true
	return fits[pick], nil
}

// extendStart maps the optimum of a shallower rung to start coordinates of a deeper one: the
// parameters they share keep their values, the new ones start at the published correlation.
func extendStart(pr *problem, from layout, x []float64, to layout) []float64 {
	if x == nil {
		return nil
	}
	pr.lay = from
	q, err := pr.params(x)
	if err != nil {
		return nil
	}
	q = q.clone()
	q.Coefficients = nil
	if !to.exp {
		q.Bend = 0
	}
	pr.lay = to
	return pr.coords(q)
}

// evaluateFixed evaluates recorded parameters (a tuning file) as the rung they belong to. The
// free parameters, for the intervals, are the rung's: none at the published depth, the
// multiplier (or the pb anchor) above it, and the shift, bend and coefficients that the
// record moves from their published values. A recorded pb pair keeps the anchor when it
// honours the report's Pb (its scale then follows the anchor in the intervals, as when it was
// tuned); one that does not (edited, or from another report) is applied as it is, with a
// remark giving its bubble point.
// anchorTol is how closely (relative) recorded pb parameters must reproduce the report's Pb to
// count as anchored on it: round-off of a scale written with every digit.
const anchorTol = 1e-9

func (pr *problem) evaluateFixed(q Params, d Depth) (*rungFit, error) {
	l := layout{shift: q.Shift != 0, exp: q.Bend != 0}
	if q.Coefficients != nil {
		if len(q.Coefficients) != len(pr.coef0) {
			return nil, fmt.Errorf("fit: %s: %d coefficients recorded, the family declares %d", pr.prop, len(q.Coefficients), len(pr.coef0))
		}
		for j := range pr.coef0 {
			if q.Coefficients[j] != pr.coef0[j] {
				l.coef = append(l.coef, j)
			}
		}
	}
	tuned := d != DepthPublished || q.Multiplier != 1 || l.size() > 0
	if pr.anchored {
		pm := pr.nl.(pbModel)
		pb, err := pm.pb(q, pm.rsb)
		honours := err == nil && math.Abs(pb/pr.pbLab-1) <= anchorTol
		if tuned && !honours && err == nil {
			pr.notes = append(pr.notes, fmt.Sprintf("the recorded pair gives Pb = %s psia at Rsb, not the report's %s psia: applied as recorded, not anchored",
				groupDigits(pb), groupDigits(pr.pbLab)))
		}
		pr.anchored = tuned && honours
	}
	l.anchor = pr.anchored
	l.mult = tuned && !l.anchor
	pr.lay = l
	rf := &rungFit{rung: Rung{Depth: d, Free: l.size(), Params: q.clone(), Chosen: true}, lay: l, q: q.clone(), vals: make([]float64, len(pr.pts))}
	var err error
	if rf.rung.Tuned, err = pr.stats(rf.q, rf.vals); err != nil {
		return nil, err
	}
	rf.rung.Flags = multiplierFlags(pr.prop, rf.q, l)
	return rf, nil
}

// plural writes "1 point", "5 points".
func plural(n int, word string) string {
	if n == 1 {
		return fmt.Sprintf("%d %s", n, word)
	}
	return fmt.Sprintf("%d %ss", n, word)
}

// Choice names the family chosen for each property; a missing property takes the
// best-ranked family.
type Choice map[PropertyID]string

// TuneAll tunes the chosen family of every property that has lab data, in order, feeding the
// tuned dead-oil and saturated viscosities to the live-oil families where the report lacks
// measurements. Properties without data are absent from the result.
func TuneAll(ds *Dataset, choice Choice, opts Options) (map[PropertyID]Result, error) {
	return runAll(ds, choice, nil, opts)
}

// Apply evaluates recorded families and parameters (a loaded tuning file) on a dataset
// without tuning: statistics, residuals and intervals at the recorded parameters, and the
// recorded ladder and leave-one-out error (those of the tuning that made them).
// Properties without lab data are absent from the result; recorded properties that the
// dataset has data for but stored lacks are tuned afresh.
func Apply(ds *Dataset, stored map[PropertyID]Result, opts Options) (map[PropertyID]Result, error) {
	choice := Choice{}
	for p, r := range stored {
		choice[p] = r.Family
	}
	return runAll(ds, choice, stored, opts)
}

func runAll(ds *Dataset, choice Choice, fixed map[PropertyID]Result, opts Options) (map[PropertyID]Result, error) {
	out := map[PropertyID]Result{}
	var rk Ranking
	for _, p := range Properties {
		if len(ds.Points[p]) == 0 {
			continue
		}
		fam := choice[p]
		if fam == "" {
			if rk == nil {
				rk = Rank(ds, opts)
			}
			best, ok := rk.Best(p)
			if !ok {
				reason := "no family"
				if es := rk[p]; len(es) > 0 {
					reason = es[0].Failed
				}
				return out, fmt.Errorf("fit: %s: no family can be evaluated for this report: %s", p, reason)
			}
			fam = best
		}
		var dead, sat *Result
		if r, ok := out[MuDead]; ok {
			dead = &r
		}
		if r, ok := out[MuSat]; ok {
			sat = &r
		}
		var fx *Params
		var fd Depth
		if st, ok := fixed[p]; ok {
			q := st.Params.clone()
			fx, fd = &q, st.Depth
		}
		r, err := tuneWith(ds, p, fam, opts, dead, sat, fx, fd)
		if err != nil {
			return out, err
		}
		if st, ok := fixed[p]; ok && st.Ladder != nil {
			// The ladder and leave-one-out error as recorded when the parameters were tuned.
			r.Ladder, r.LOO = st.Ladder, st.LOO
		}
		if r.NoFit != "" && choice[p] == "" {
			// The family is the best-ranked one: none follows the lab points.
			r.NoFit = "no family follows" + strings.TrimPrefix(r.NoFit, r.Family+" does not follow") + " (best: " + r.Family + " at depth " + string(r.Depth) + ")"
		}
		out[p] = r
	}
	return out, nil
}

// RankEntry is one family's score on one property.
// The numbers are nil (null in JSON) for a family that could not be scored.
type RankEntry struct {
	Family        string   `json:"family"`
	AAREPublished *float64 `json:"aare_pct_published"`
	AARETuned     *float64 `json:"aare_pct_tuned"`
	Multiplier    *float64 `json:"multiplier"`
	Shift         *float64 `json:"shift,omitempty"` // when the chosen rung tunes a shift
	Depth         Depth    `json:"depth"`           // the rung chosen (or forced) for this family
	AARELOO       *float64 `json:"aare_pct_loo"`    // leave-one-out AARE of that rung, %
	InRange       bool     `json:"in_range"`
	Points        int      `json:"points"`
	Failed        string   `json:"failed,omitempty"` // why the family could not be scored
	OutOfRange    []string `json:"out_of_range,omitempty"`
	Flags         []string `json:"flags,omitempty"` // multiplier far from 1 or at its bound, …
}

// aareTie is the step (percentage points of AARE) in which tuned errors are compared.
const aareTie = 0.01

// Ranking lists, per property, every family in rank order.
type Ranking map[PropertyID][]RankEntry

// Best returns the best-ranked family that could be scored.
func (rk Ranking) Best(p PropertyID) (string, bool) {
	for _, e := range rk[p] {
		if e.Failed == "" {
			return e.Family, true
		}
	}
	return "", false
}

type rankJob struct {
	prop   PropertyID
	family string
	slot   *RankEntry
}

// Rank scores every family of every property with data, as published and as tuned, on all
// cores. Families that cannot be evaluated rank last with the reason. The order is tuned
// AARE (to aareTie), then published AARE, then id, so it is deterministic. The live-oil
// viscosity families are scored with the measured dead-oil viscosity and viscosity at Pb
// (published fallbacks when the report has none), not with the tuned ones that TuneAll
// chains, so that each family is judged on its own.
func Rank(ds *Dataset, opts Options) Ranking {
	return rank(ds, opts, func(p PropertyID) []string { return familiesFor(p, opts) })
}

func rank(ds *Dataset, opts Options, families func(PropertyID) []string) Ranking {
	rk := Ranking{}
	var jobs []rankJob
	for _, p := range Properties {
		if len(ds.Points[p]) == 0 {
			continue
		}
		fams := families(p)
		rk[p] = make([]RankEntry, len(fams))
		for i, f := range fams {
			jobs = append(jobs, rankJob{p, f, &rk[p][i]})
		}
	}
	workers := runtime.GOMAXPROCS(0)
	if workers > len(jobs) {
		workers = len(jobs)
	}
	ch := make(chan rankJob)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for j := range ch {
				*j.slot = score(ds, j.prop, j.family, opts)
			}
		}()
	}
	for _, j := range jobs {
		ch <- j
	}
	close(ch)
	wg.Wait()
	for _, p := range Properties {
		es := rk[p]
		sort.SliceStable(es, func(a, b int) bool { return rankLess(es[a], es[b]) })
	}
	return rk
}

func rankLess(a, b RankEntry) bool {
	if (a.Failed == "") != (b.Failed == "") {
		return a.Failed == ""
	}
	if a.Failed == "" {
		// Errors are compared in steps of aareTie, so that families that all fit exactly (as
		// many points as parameters) tie, and round-off cannot pick the winner. The key is the
		// leave-one-out error of the chosen rung, or its training error where there is none.
		ta, tb := math.Round(rankKey(a)/aareTie), math.Round(rankKey(b)/aareTie)
		if ta != tb {
			return ta < tb
		}
		if ta, tb := math.Round(*a.AARETuned/aareTie), math.Round(*b.AARETuned/aareTie); ta != tb {
			return ta < tb
		}
		// Tied (one point fitted exactly by every family): fewer cautions first, a family used
		// outside its original data and one whose multiplier is far from 1 counting one each.
		if ca, cb := cautions(a), cautions(b); ca != cb {
			return ca < cb
		}
		if *a.AAREPublished != *b.AAREPublished {
			return *a.AAREPublished < *b.AAREPublished
		}
	}
	return a.Family < b.Family
}

// cautions counts what speaks against a family beside its errors: used outside its original
// data, and a multiplier (or coefficient) flagged as far from the published value.
func cautions(e RankEntry) int {
	n := 0
	if !e.InRange {
		n++
	}
	if len(e.Flags) > 0 {
		n++
	}
	return n
}

// rankKey is the error a family is ranked by.
func rankKey(e RankEntry) float64 {
	if e.AARELOO != nil {
		return *e.AARELOO
	}
	return *e.AARETuned
}

func score(ds *Dataset, p PropertyID, family string, opts Options) RankEntry {
	e := RankEntry{Family: family, InRange: true}
	r, err := Tune(ds, p, family, opts)
	if err != nil {
		e.Failed = err.Error()
		if ce, err := catalogEntry(p, family); err == nil {
			e.OutOfRange = ce.Check(ds.rangeInputs())
			e.InRange = len(e.OutOfRange) == 0
		}
		return e
	}
	e.OutOfRange, e.InRange = r.OutOfRange, len(r.OutOfRange) == 0
	e.Points = r.Tuned.Points
	e.AAREPublished, e.AARETuned, e.Multiplier = &r.Published.AARE, &r.Tuned.AARE, &r.Params.Multiplier
	e.Depth, e.AARELOO = r.Depth, r.LOO
	if r.Shifted {
		e.Shift = &r.Params.Shift
	}
	e.Flags = r.Flags
	return e
}
