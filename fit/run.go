package fit

import (
	"fmt"
	"math"
	"runtime"
	"sort"
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
	return tuneWith(ds, prop, family, opts, nil, nil, nil)
}

// tuneWith tunes (fixed == nil) or evaluates at fixed parameters one family of a property.
func tuneWith(ds *Dataset, prop PropertyID, family string, opts Options, dead, sat *Result, fixed *Params) (Result, error) {
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
	res := Result{Property: prop, Family: family, Mode: opts.mode(), Excluded: append([]int(nil), opts.Excluded[prop]...)}
	sort.Ints(res.Excluded)
	pubVals := make([]float64, len(pr.pts))
	if res.Published, err = pr.stats(Published, pubVals); err != nil {
		return res, fmt.Errorf("fit: %s %s: the published correlation cannot be evaluated: %w", prop, family, err)
	}
	var q Params
	if fixed != nil {
		q = *fixed
	} else {
		var evals int
		q, evals, err = pr.minimize()
		res.Evals = evals
		if err != nil {
			return res, err
		}
	}
	res.Params = q
	tunedVals := make([]float64, len(pr.pts))
	if res.Tuned, err = pr.stats(q, tunedVals); err != nil {
		return res, err
	}
	for i, pt := range pr.pts {
		res.Residuals = append(res.Residuals, Residual{Quantity: pt.Quantity, Unit: pt.Unit, Pressure: pt.Pressure,
			Lab: pt.Lab, Published: pubVals[i], Tuned: tunedVals[i], Excluded: !pr.use[i], Source: pt.Source, Line: pt.Line})
	}
	half, assumed := pr.interval(q)
	res.CIAssumed = assumed
	if half != nil {
		res.CI95 = map[string][2]float64{"multiplier": {q.Multiplier - half[0], q.Multiplier + half[0]}}
		switch {
		case len(half) > 1:
			res.CI95["shift"] = [2]float64{q.Shift - half[1], q.Shift + half[1]}
		case pr.anchored: // s = Pb − m·Pb_published: its interval follows from m's
			hs := half[0] * pr.pbPub
			res.CI95["shift"] = [2]float64{q.Shift - hs, q.Shift + hs}
		}
	}
	res.ShiftUnit, res.Shifted = shiftUnit(prop, pr.pts), pr.shift || pr.anchored
	res.Flags = append(append([]string(nil), pr.notes...), multiplierFlags(q)...)
	if e, err := correlations.Lookup(catalogProperty(prop), family); err == nil {
		res.OutOfRange = e.Check(ds.rangeInputs())
	}
	return res, nil
}

// multiplierFlags warns of a multiplier far from 1 or at its bound.
func multiplierFlags(q Params) []string {
	var fl []string
	switch {
	case q.Multiplier <= MinMultiplier*1.001 || q.Multiplier >= MaxMultiplier*0.999:
		fl = append(fl, fmt.Sprintf("multiplier %.3f is at its bound [%g, %g]: this family cannot describe the oil", q.Multiplier, MinMultiplier, MaxMultiplier))
	case q.Multiplier < FlagLowMult || q.Multiplier > FlagHighMult:
		fl = append(fl, fmt.Sprintf("multiplier %.3f is outside [%g, %g]: the family describes this oil poorly", q.Multiplier, FlagLowMult, FlagHighMult))
	}
	return fl
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
// without tuning: statistics, residuals and intervals at the recorded parameters.
// Properties without lab data are absent from the result; recorded properties that the
// dataset has data for but stored lacks are tuned afresh.
func Apply(ds *Dataset, stored map[PropertyID]Result, opts Options) (map[PropertyID]Result, error) {
	choice := Choice{}
	params := map[PropertyID]Params{}
	for p, r := range stored {
		choice[p], params[p] = r.Family, r.Params
	}
	return runAll(ds, choice, params, opts)
}

func runAll(ds *Dataset, choice Choice, fixed map[PropertyID]Params, opts Options) (map[PropertyID]Result, error) {
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
		if q, ok := fixed[p]; ok {
			fx = &q
		}
		r, err := tuneWith(ds, p, fam, opts, dead, sat, fx)
		if err != nil {
			return out, err
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
	Shift         *float64 `json:"shift,omitempty"` // multiplier+shift mode only
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
func Rank(ds *Dataset, opts Options) Ranking { return rank(ds, opts, Families) }

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
		// Tuned errors are compared in steps of aareTie, so that families that all fit
		// exactly (as many points as parameters) tie, and round-off cannot pick the winner.
		ta, tb := math.Round(*a.AARETuned/aareTie), math.Round(*b.AARETuned/aareTie)
		if ta != tb {
			return ta < tb
		}
		if *a.AAREPublished != *b.AAREPublished {
			return *a.AAREPublished < *b.AAREPublished
		}
	}
	return a.Family < b.Family
}

func score(ds *Dataset, p PropertyID, family string, opts Options) RankEntry {
	e := RankEntry{Family: family, InRange: true}
	r, err := Tune(ds, p, family, opts)
	if err != nil {
		e.Failed = err.Error()
		if ce, err := correlations.Lookup(catalogProperty(p), family); err == nil {
			e.OutOfRange = ce.Check(ds.rangeInputs())
			e.InRange = len(e.OutOfRange) == 0
		}
		return e
	}
	e.OutOfRange, e.InRange = r.OutOfRange, len(r.OutOfRange) == 0
	e.Points = r.Tuned.Points
	e.AAREPublished, e.AARETuned, e.Multiplier = &r.Published.AARE, &r.Tuned.AARE, &r.Params.Multiplier
	if r.Mode == MultiplierShift {
		e.Shift = &r.Params.Shift
	}
	e.Flags = r.Flags
	return e
}
