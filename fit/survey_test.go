package fit

import (
	"bytes"
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"labmatch/correlations"
	"labmatch/lab"
)

// synthTruth names the family and multiplier each synthetic lab value is drawn from.
type synthTruth struct {
	pb, bo, dead, sat      string
	pbMult, boMult         float64
	deadMult, satMult      float64
	pbCoef                 []float64 // the pb family's coefficients; nil: published
	apiLo, apiHi           float64   // API range; 0: 20–45 (both Vasquez–Beggs classes)
	noBo, noDead, noSat    bool
	lowRsb, coldFraction   float64 // share of samples with Rsb 10–40 scf/STB, share at 50 °F
	lightDeadViscosityFrac float64 // share of light samples: Rsb 1500 scf/STB, μod 0.05 cP
}

var defaultTruth = synthTruth{pb: "standing", bo: "standing", dead: "beggs-robinson", sat: "beggs-robinson",
	pbMult: 1, boMult: 1, deadMult: 1, satMult: 1}

// synthSurvey draws n samples: API, gas gravity, temperature and Rsb spread over the ranges of
// common black oils, and each lab value from its truth family times its multiplier, scattered by
// a relative noise (for Bo on Bo − 1, where the multiplier acts).
func synthSurvey(t testing.TB, n int, seed uint64, noise float64, tr synthTruth) *lab.Survey {
	t.Helper()
	r := rand.New(rand.NewPCG(seed, 0xfeed))
	pbF, err1 := correlations.SolutionGasByID(tr.pb)
	boF, err2 := correlations.OilFVFByID(tr.bo)
	dF, err3 := correlations.DeadViscosityByID(tr.dead)
	sF, err4 := correlations.SatViscosityByID(tr.sat)
	if err1 != nil || err2 != nil || err3 != nil || err4 != nil {
		t.Fatal(err1, err2, err3, err4)
	}
	lo, hi := tr.apiLo, tr.apiHi
	if hi == 0 {
		lo, hi = 20, 45
	}
	sv := &lab.Survey{File: "synthetic"}
	for i := 0; i < n; i++ {
		s := lab.SurveySample{Line: i + 2, ID: fmt.Sprintf("S%04d", i+1), API: lo + (hi-lo)*r.Float64(),
			GasGravity: 0.65 + 0.35*r.Float64(), Temperature: 120 + 130*r.Float64(), Rsb: 150 * math.Pow(10, r.Float64())}
		if r.Float64() < tr.lowRsb {
			s.Rsb = 10 + 30*r.Float64()
		}
		if r.Float64() < tr.coldFraction {
			s.Temperature = 50
		}
		o := surveyOil(&s)
		var pb float64
		var err error
		if tr.pbCoef != nil {
			pb, err = pbF.BubblePointWith(s.Rsb, o, tr.pbCoef)
		} else {
			pb, err = pbF.BubblePoint(s.Rsb, o)
		}
		if err != nil {
			t.Fatal(err)
		}
		s.Pb = tr.pbMult * pb * (1 + noise*r.NormFloat64())
		if !tr.noBo {
			bo, err := boF.FVF(s.Pb, s.Rsb, o)
			if err != nil {
				t.Fatal(err)
			}
			s.Bob = 1 + tr.boMult*(bo-1)*(1+noise*r.NormFloat64())
		}
		md, err := dF.Viscosity(o)
		if err != nil {
			t.Fatal(err)
		}
		md *= tr.deadMult // the oil's true dead-oil viscosity, which its live-oil viscosity starts from
		if !tr.noSat {
			ms, err := sF.Viscosity(md, s.Rsb, o)
			if err != nil {
				t.Fatal(err)
			}
			s.SatViscosity = tr.satMult * ms * (1 + noise*r.NormFloat64())
		}
		if !tr.noDead {
			s.DeadViscosity = md * (1 + noise*r.NormFloat64())
		}
		if r.Float64() < tr.lightDeadViscosityFrac {
			// A light, gas-rich oil: its dead-oil viscosity is below Kartoatmodjo–Schmidt's reach.
			s.Rsb, s.DeadViscosity, s.SatViscosity = 1500, 0.05, 0.04
		}
		sv.Samples = append(sv.Samples, s)
	}
	return sv
}

func familyResult(t testing.TB, res *SurveyResult, p PropertyID, id string) *SurveyFamily {
	t.Helper()
	sp := res.Property(p)
	if sp == nil {
		t.Fatalf("no %s in the survey", p)
	}
	for i := range sp.Families {
		if sp.Families[i].Family == id {
			return &sp.Families[i]
		}
	}
	t.Fatalf("no %s family %s", p, id)
	return nil
}

// The six-oil table (Ahmed, Reservoir Engineering Handbook, ch. 2; from memory, so tolerances
// are loose) loads as a survey in field and in metric units with the same results; Standing's
// bubble point of oil 1, the one prediction the book prints (2,181 psia against a measured
// 2,377), is reproduced; every family's prediction of every oil is finite.
func TestSurveySixOils(t *testing.T) {
	var results []*SurveyResult
	for _, f := range []string{"../testdata/survey/six-oils-field.csv", "../testdata/survey/six-oils-metric.csv"} {
		sv, err := lab.ReadSurvey(f)
		if err != nil {
			t.Fatal(err)
		}
		res, err := RunSurvey(sv, SurveyOptions{Refit: true})
		if err != nil {
			t.Fatal(err)
		}
		results = append(results, res)
	}
	field, metric := results[0], results[1]
	if len(field.Properties) != 2 || field.Property(Pb) == nil || field.Property(Bo) == nil {
		t.Fatalf("want pb and bo only (the table has no viscosities); got %d properties", len(field.Properties))
	}
	for _, sp := range field.Properties {
		if !sp.LeaveOneOut || sp.Folds != 6 || sp.Samples != 6 {
			t.Errorf("%s: 6 samples want leave-one-out, got folds %d of %d samples", sp.Property, sp.Folds, sp.Samples)
		}
		msp := metric.Property(sp.Property)
		for k, f := range sp.Families {
			m := msp.Families[k]
			if m.Family != f.Family {
				t.Errorf("%s rank %d: field %s, metric %s", sp.Property, k+1, f.Family, m.Family)
				continue
			}
			if f.Points != 6 {
				t.Errorf("%s %s: %d oils evaluated (lost %v)", sp.Property, f.Family, f.Points, f.Lost)
			}
			for _, pair := range [][2]float64{{f.Published.AARE, m.Published.AARE}, {f.Multiplier, m.Multiplier},
				{f.Tuned.AARE, m.Tuned.AARE}, {f.CV.AARE, m.CV.AARE}} {
				if math.Abs(pair[0]-pair[1]) > 1e-4*math.Max(1, math.Abs(pair[0])) {
					t.Errorf("%s %s: field %.8g, metric %.8g", sp.Property, f.Family, pair[0], pair[1])
				}
			}
			for a := range f.Pred.Sample {
				for _, v := range []float64{f.Pred.Published[a], f.Pred.Tuned[a], f.Pred.CV[a]} {
					if math.IsNaN(v) || math.IsInf(v, 0) || !(v > 0) {
						t.Errorf("%s %s oil %d: prediction %g", sp.Property, f.Family, a+1, v)
					}
				}
			}
		}
	}
	for _, sp := range field.Properties {
		for _, f := range sp.Families {
			t.Logf("%s %-21s published AARE %5.2f bias %+6.2f  ×%.3f tuned %5.2f  LOO %5.2f", sp.Property, f.Family,
				f.Published.AARE, f.Published.Bias, f.Multiplier, f.Tuned.AARE, f.CV.AARE)
		}
	}
	st := familyResult(t, field, Pb, "standing")
	// Ahmed, Reservoir Engineering Handbook, ch. 2, Standing example: Pb = 2,181 psia for oil 1
	// (from memory: 1 %).
	if got := st.Pred.Published[0]; math.Abs(got/2181-1) > 0.01 {
		t.Errorf("Standing Pb of oil 1 = %.0f psia, want 2,181", got)
	}
	if st.Pred.Lab[0] != 2377 {
		t.Errorf("oil 1 lab Pb %g, want 2,377", st.Pred.Lab[0])
	}
}

// expectedAbsNoise is E|ε| of a normal relative noise σ: σ·√(2/π).
func expectedAbsNoise(sigma float64) float64 { return 100 * sigma * math.Sqrt(2/math.Pi) }

// Synthetic truth: a database drawn from one family times a known multiplier with 2 % noise
// ranks that family first, recovers the multiplier within 1 %, and its cross-validated AARE is
// close to the noise's mean absolute value (σ·√(2/π) = 1.60 %).
func TestSurveySyntheticTruth(t *testing.T) {
	const noise = 0.02
	truth := synthTruth{pb: "glaso", bo: "al-marhoun", dead: "egbogah-ng", sat: "petrosky-farshad",
		pbMult: 1.08, boMult: 0.93, deadMult: 0.9, satMult: 1.1}
	sv := synthSurvey(t, 400, 3, noise, truth)
	res, err := RunSurvey(sv, SurveyOptions{Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		p    PropertyID
		id   string
		mult float64
	}{{Pb, truth.pb, truth.pbMult}, {Bo, truth.bo, truth.boMult}, {MuDead, truth.dead, truth.deadMult}, {MuSat, truth.sat, truth.satMult}} {
		sp := res.Property(c.p)
		if sp.Folds != 10 || sp.LeaveOneOut {
			t.Errorf("%s: %d folds, want 10", c.p, sp.Folds)
		}
		best := sp.Families[0]
		if best.Family != c.id {
			t.Errorf("%s: ranked first %s (CV %.2f %%), want %s", c.p, best.Family, best.CV.AARE, c.id)
			continue
		}
		t.Logf("%s: %s first, multiplier %.4f (truth %.2f), tuned AARE %.2f %%, CV %.2f %%; second %s CV %.2f %%",
			c.p, best.Family, best.Multiplier, c.mult, best.Tuned.AARE, best.CV.AARE, sp.Families[1].Family, sp.Families[1].CV.AARE)
		if math.Abs(best.Multiplier/c.mult-1) > 0.01 {
			t.Errorf("%s %s: multiplier %.4f, want %.4f within 1 %%", c.p, c.id, best.Multiplier, c.mult)
		}
		// Bo's noise is on Bo − 1, so its relative error on Bo is smaller; the live-oil viscosity
		// also carries the noise of the measured dead-oil viscosity it starts from (raised to the
		// power B ≈ 0.5–0.7, so up to √(1 + 0.7²) = 1.22 times the noise).
		want := expectedAbsNoise(noise)
		lo, hi := 0.85*want, 1.15*want
		switch c.p {
		case Bo:
			lo, hi = 0, want
		case MuSat:
			hi = 1.35 * want
		}
		if best.CV.AARE < lo || best.CV.AARE > hi || best.CV.AARE < best.Tuned.AARE {
			t.Errorf("%s %s: CV AARE %.3f %% (tuned %.3f), want %.2f–%.2f", c.p, c.id, best.CV.AARE, best.Tuned.AARE, lo, hi)
		}
	}
}

// Overfitting is visible: small noisy databases (12 samples, 5 % scatter) drawn from the
// published Beggs–Robinson viscosities, and Beggs–Robinson's live-oil viscosity refitted with its
// four declared coefficients. The multiplier is the right model here, so all a refit can learn
// is the scatter: on most of eight such databases it fits the samples better than the multiplier
// and predicts each one left out worse, and the result flags it.
func TestSurveyOverfitting(t *testing.T) {
	const dbs = 8
	below, above, flagged := 0, 0, 0
	excess := 0.0
	for seed := uint64(1); seed <= dbs; seed++ {
		sv := synthSurvey(t, 12, seed, 0.05, defaultTruth)
		res, err := RunSurvey(sv, SurveyOptions{Refit: true, Properties: []PropertyID{MuSat}})
		if err != nil {
			t.Fatal(err)
		}
		br := familyResult(t, res, MuSat, "beggs-robinson")
		if br.Refit == nil {
			t.Fatalf("seed %d: no refit (%s)", seed, br.RefitNote)
		}
		if br.Refit.Tuned.AARE < br.Tuned.AARE {
			below++
		}
		if br.Refit.CV.AARE > br.CV.AARE {
			above++
		}
		if br.Refit.Overfits {
			flagged++
		}
		if br.Refit.Overfits != (br.Refit.Tuned.AARE < br.Tuned.AARE && br.Refit.CV.AARE >= br.CV.AARE+chooseAbsMargin) || br.Refit.Better && br.Refit.Overfits {
			t.Errorf("seed %d: flags %+v for training %.2f/%.2f, CV %.2f/%.2f", seed, br.Refit, br.Refit.Tuned.AARE, br.Tuned.AARE, br.Refit.CV.AARE, br.CV.AARE)
		}
		excess += (br.Refit.CV.AARE - br.CV.AARE) / dbs
	}
	t.Logf("of %d databases: refit fits better in %d, predicts worse in %d, flagged in %d; mean CV excess %.2f points", dbs, below, above, flagged, excess)
	if below < 6 || above < 6 || flagged < 5 || excess <= 0 {
		t.Errorf("of %d databases the refit fits better in %d, predicts worse in %d, is flagged in %d; mean CV excess %.2f points", dbs, below, above, flagged, excess)
	}
}

// TestSurveyPriorSpreadChoice documents the choice of SurveyPriorSpread: on the 1–2–5 grid, the
// weakest pull (largest τ) whose refits of Standing's three coefficients to small noisy
// databases (15 or 40 samples, 8 % scatter) predict fresh oils within 2 % of the best τ's
// error, on average over three cases: the published correlation
// times 1.05 (the multiplier is the right model), and an exponent changed by 5 % (the refit has
// something to learn) with 15 and with 40 samples. The error is measured against 1,000 fresh
// samples of the noiseless truth, which the refit never saw. The report tuner's fixed
// λ = RidgeStrength, which suits a report's 0.3 % lab scatter, is far too weak at a database's
// scatter: it predicts worse than the multiplier alone where the published shape is right, and
// worse than the chosen τ on average. At the chosen τ forty samples with 3 % scatter still
// recover an exponent changed by 8 % within 2 %.
func TestSurveyPriorSpreadChoice(t *testing.T) {
	pub := correlations.Published(correlations.StandingCoefficients)
	bent := []float64{pub[0], pub[1], pub[2] * 0.95}
	cases := []struct {
		coef []float64
		n    int
	}{{pub, 15}, {bent, 15}, {bent, 40}}
	const seeds = 8
	fresh := make([]*lab.Survey, len(cases))
	for k, c := range cases {
		tr := defaultTruth
		tr.pbMult, tr.pbCoef = 1.05, c.coef
		fresh[k] = synthSurvey(t, 1000, 999, 0, tr)
	}
	// predictionError returns the mean AARE on the fresh samples of the refit and of the
	// multiplier, per case.
	predictionError := func(opts SurveyOptions) (refit, mult []float64) {
		refit, mult = make([]float64, len(cases)), make([]float64, len(cases))
		for k, c := range cases {
			tr := defaultTruth
			tr.pbMult, tr.pbCoef = 1.05, c.coef
			for seed := uint64(1); seed <= seeds; seed++ {
				res, err := RunSurvey(synthSurvey(t, c.n, seed, 0.08, tr), opts)
				if err != nil {
					t.Fatal(err)
				}
				f := familyResult(t, res, Pb, "standing")
				cf := make([]float64, len(f.Refit.Coefficients))
				for j, cc := range f.Refit.Coefficients {
					cf[j] = cc.Refit
				}
				for _, s := range fresh[k].Samples {
					o := surveyOil(&s)
					g, err1 := correlations.StandingBubblePointWith(s.Rsb, o, cf)
					g0, err2 := correlations.StandingBubblePoint(s.Rsb, o)
					if err1 != nil || err2 != nil {
						t.Fatal(err1, err2)
					}
					w := 100.0 / float64(seeds*len(fresh[k].Samples))
					refit[k] += w * math.Abs(f.Refit.Multiplier*g/s.Pb-1)
					mult[k] += w * math.Abs(f.Multiplier*g0/s.Pb-1)
				}
			}
		}
		return refit, mult
	}
	mean := func(v []float64) float64 { return (v[0] + v[1] + v[2]) / 3 }
	opts := func(tau, lambda float64) SurveyOptions {
		return SurveyOptions{Refit: true, PriorSpread: tau, Lambda: lambda, Properties: []PropertyID{Pb}}
	}
	// The choice: the weakest pull (largest τ) whose mean error is within 2 % of the best on
	// the grid (0.05 and 0.1 are nearly tied; the weaker lets large databases move further).
	grid := []float64{0.05, 0.1, 0.2, 0.5}
	errs := make([]float64, len(grid))
	var chosen, mult []float64
	best := math.Inf(1)
	for i, tau := range grid {
		e, m := predictionError(opts(tau, 0))
		errs[i] = mean(e)
		best = math.Min(best, errs[i])
		if tau == SurveyPriorSpread {
			chosen, mult = e, m
		}
	}
	pick := 0.0
	for i, tau := range grid {
		if errs[i] <= 1.02*best {
			pick = tau
		}
	}
	t.Logf("mean AARE on fresh oils for τ = %v: %.3f %%", grid, errs)
	if pick != SurveyPriorSpread {
		t.Errorf("the rule picks τ = %g (errors %v), not SurveyPriorSpread = %g", pick, errs, SurveyPriorSpread)
	}
	report, _ := predictionError(opts(0, RidgeStrength))
	if !(report[0] > mult[0] && mean(report) > mean(chosen)) {
		t.Errorf("λ = %g: %v %% against the multiplier's %v and the chosen τ's %v: want worse than both", RidgeStrength, report, mult, chosen)
	}
	t.Logf("AARE on fresh oils, %%: chosen τ %v, multiplier %v, λ = RidgeStrength %v", chosen, mult, report)
	changed := append([]float64(nil), pub...)
	changed[2] *= 0.92
	for seed := uint64(1); seed <= 6; seed++ {
		tr := defaultTruth
		tr.pbCoef = changed
		res, err := RunSurvey(synthSurvey(t, 40, seed, 0.03, tr), opts(SurveyPriorSpread, 0))
		if err != nil {
			t.Fatal(err)
		}
		f := familyResult(t, res, Pb, "standing")
		if got := f.Refit.Coefficients[2].Refit; math.Abs(got/changed[2]-1) > 0.02 {
			t.Errorf("seed %d: refitted exponent %.4f, want %.4f within 2 %%", seed, got, changed[2])
		}
	}
}

// Samples where a family is out of its domain are lost by that family alone, with a counted
// reason; the other families and properties keep them. The database mixes low-GOR oils (Rsb
// 10–40 scf/STB, some at 50 °F), which every family evaluates, with light gas-rich oils whose
// dead-oil viscosity (0.05 cP) drives Kartoatmodjo–Schmidt's live-oil viscosity negative (within
// the reader's bounds the only failure of a survey family found by a search of the input space).
func TestSurveyOutOfDomain(t *testing.T) {
	tr := defaultTruth
	tr.lowRsb, tr.coldFraction, tr.lightDeadViscosityFrac = 0.3, 0.2, 0.1
	sv := synthSurvey(t, 120, 5, 0.03, tr)
	res, err := RunSurvey(sv, SurveyOptions{Refit: true})
	if err != nil {
		t.Fatal(err)
	}
	lostBy := map[string]int{}
	for _, sp := range res.Properties {
		if sp.Samples != len(sv.Samples) {
			t.Errorf("%s: %d samples, want all %d", sp.Property, sp.Samples, len(sv.Samples))
		}
		for _, fe := range surveyFamilies(sp.Property) {
			want := 0
			for i := range sv.Samples {
				if _, err := fe.eval(&sv.Samples[i], nil); err != nil {
					want++
				}
			}
			f := familyResult(t, res, sp.Property, fe.id)
			lost := 0
			for _, l := range f.Lost {
				lost += l.Count
				if l.Reason == "" || len(l.Lines) == 0 || len(l.Lines) > surveyLossLines || strings.ContainsAny(l.Reason[:1], "0123456789") {
					t.Errorf("%s %s: loss %+v", sp.Property, f.Family, l)
				}
			}
			if lost != want || f.Points != len(sv.Samples)-want || f.CV.Points != f.Points || f.Tuned.Points != f.Points {
				t.Errorf("%s %s: lost %d (%v), evaluated %d, CV over %d; the family fails on %d", sp.Property, f.Family, lost, f.Lost, f.Points, f.CV.Points, want)
			}
			if want > 0 {
				lostBy[string(sp.Property)+" "+fe.id] = want
			}
		}
	}
	if len(lostBy) != 1 || lostBy["mu_sat kartoatmodjo-schmidt"] == 0 {
		t.Errorf("losses %v: want the light oils in Kartoatmodjo–Schmidt's live-oil viscosity only", lostBy)
	}
	ks := familyResult(t, res, MuSat, "kartoatmodjo-schmidt")
	if len(ks.Lost) != 1 || !strings.Contains(ks.Lost[0].Reason, "non-positive viscosity") {
		t.Errorf("kartoatmodjo-schmidt losses %+v", ks.Lost)
	}
}

// A live-oil viscosity without a dead-oil viscosity to start from is skipped with a reason;
// properties without any value are left out of the result.
func TestSurveyMissingValues(t *testing.T) {
	tr := defaultTruth
	tr.noBo, tr.noDead = true, true
	sv := synthSurvey(t, 40, 2, 0.03, tr)
	res, err := RunSurvey(sv, SurveyOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Properties) != 1 || res.Properties[0].Property != Pb {
		t.Fatalf("properties %v, want pb only", res.Properties)
	}
	res, err = RunSurvey(sv, SurveyOptions{Properties: []PropertyID{MuSat}})
	if err == nil {
		t.Fatalf("mu_sat without any dead-oil viscosity: want an error, got %+v", res)
	}
	sv.Samples[0].DeadViscosity = 3
	res, err = RunSurvey(sv, SurveyOptions{Properties: []PropertyID{MuSat}})
	if err != nil {
		t.Fatal(err)
	}
	sp := res.Property(MuSat)
	if sp.Samples != 1 || len(sp.Skipped) != 1 || sp.Skipped[0].Count != 39 || !strings.Contains(sp.Skipped[0].Reason, "dead-oil") {
		t.Errorf("mu_sat: %d samples, skipped %+v", sp.Samples, sp.Skipped)
	}
	if f := sp.Families[0]; f.CV.Points != 0 {
		t.Errorf("one sample: no cross-validation expected, got %+v", f.CV)
	}
	for _, o := range []SurveyOptions{{Folds: 1}, {PriorSpread: -1}, {Lambda: math.NaN()}, {Properties: []PropertyID{Co}}} {
		if _, err := RunSurvey(sv, o); err == nil {
			t.Errorf("options %+v: want an error", o)
		}
	}
	if _, err := RunSurvey(&lab.Survey{}, SurveyOptions{}); err == nil {
		t.Error("no samples: want an error")
	}
}

// Folds: leave-one-out for 30 samples or fewer; otherwise k folds of near-equal size, the same for
// every family, set by the seed alone; the result does not depend on the number of workers.
func TestSurveyFoldsAndWorkers(t *testing.T) {
	sv := synthSurvey(t, 30, 4, 0.05, defaultTruth)
	res, err := RunSurvey(sv, SurveyOptions{Folds: 5})
	if err != nil {
		t.Fatal(err)
	}
	if sp := res.Property(Pb); !sp.LeaveOneOut || sp.Folds != 30 {
		t.Errorf("30 samples: folds %d, leave-one-out %v", sp.Folds, sp.LeaveOneOut)
	}
	sv = synthSurvey(t, 95, 4, 0.05, defaultTruth)
	one, err := RunSurvey(sv, SurveyOptions{Folds: 7, Seed: 9, Refit: true, Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	many, err := RunSurvey(sv, SurveyOptions{Folds: 7, Seed: 9, Refit: true, Workers: 4})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(one, many) {
		t.Error("1 and 4 workers give different results")
	}
	other, err := RunSurvey(sv, SurveyOptions{Folds: 7, Seed: 10})
	if err != nil {
		t.Fatal(err)
	}
	a, b := familyResult(t, one, Pb, "glaso"), familyResult(t, other, Pb, "glaso")
	if a.CV.AARE == b.CV.AARE || a.Tuned != b.Tuned || a.Published != b.Published {
		t.Errorf("another seed: CV %g and %g (want different), tuned %+v and %+v (want equal)", a.CV.AARE, b.CV.AARE, a.Tuned, b.Tuned)
	}
	// Each fold's multiplier is the closed form on the other folds: recompute fold sizes.
	sp := one.Property(Pb)
	if sp.Folds != 7 || sp.LeaveOneOut {
		t.Fatalf("folds %d", sp.Folds)
	}
	for _, j := range []int{0, len(sp.Families) - 1} {
		f := sp.Families[j]
		if len(f.Pred.CV) != f.Points {
			t.Errorf("%s: %d CV predictions for %d samples", f.Family, len(f.Pred.CV), f.Points)
		}
	}
}

// The cross-validated multiplier of each fold equals a multiplier fitted to the other folds
// alone (the fold sums subtracted from the totals are exact).
func TestSurveyFoldMultiplier(t *testing.T) {
	sv := synthSurvey(t, 60, 8, 0.05, defaultTruth)
	res, err := RunSurvey(sv, SurveyOptions{Folds: 4, Properties: []PropertyID{Bo}})
	if err != nil {
		t.Fatal(err)
	}
	f := familyResult(t, res, Bo, "glaso")
	// For each sample, refit the multiplier on the samples whose CV multiplier differs from its
	// own fold's: group samples by their CV multiplier, the fold label seen from outside.
	foldM := map[float64][]int{}
	for a := range f.Pred.Sample {
		g := f.Pred.Published[a]
		m := (f.Pred.CV[a] - 1) / (g - 1)
		key := math.Round(m*1e9) / 1e9
		foldM[key] = append(foldM[key], a)
	}
	if len(foldM) != 4 {
		t.Fatalf("%d distinct fold multipliers, want 4", len(foldM))
	}
	for m, members := range foldM {
		in := map[int]bool{}
		for _, a := range members {
			in[a] = true
		}
		var suu, suv float64
		for a := range f.Pred.Sample {
			if in[a] {
				continue
			}
			u, v := surveyUV(formBo, f.Pred.Lab[a], f.Pred.Published[a])
			suu += u * u
			suv += u * v
		}
		if want := surveyMultiplier(suv, suu); math.Abs(want-m) > 1e-8 {
			t.Errorf("fold of %d samples: multiplier %.10g, refitted on the others %.10g", len(members), m, want)
		}
		if n := len(members); n < 15 || n > 15 {
			t.Errorf("fold size %d, want 15", n)
		}
	}
}

// The refit holds what the samples cannot determine: with only light oils the API ≤ 30 set of
// Vasquez–Beggs changes no prediction; Glasø's constant acts as the multiplier together with the
// others, so no multiplier is freed beside the coefficients.
func TestSurveyRefitIdentifiable(t *testing.T) {
	tr := defaultTruth
	tr.apiLo, tr.apiHi = 32, 45
	sv := synthSurvey(t, 80, 6, 0.03, tr)
	res, err := RunSurvey(sv, SurveyOptions{Refit: true, Properties: []PropertyID{Pb}})
	if err != nil {
		t.Fatal(err)
	}
	vb := familyResult(t, res, Pb, "vasquez-beggs")
	if vb.Refit == nil {
		t.Fatal(vb.RefitNote)
	}
	for _, c := range vb.Refit.Coefficients {
		heavy := strings.HasSuffix(c.ID, "_heavy")
		if heavy != (c.Held != "") || heavy && (c.Refit != c.Published || !strings.Contains(c.Held, "no sample")) {
			t.Errorf("vasquez-beggs %s: refit %g (published %g), held %q", c.ID, c.Refit, c.Published, c.Held)
		}
	}
	gl := familyResult(t, res, Pb, "glaso")
	if gl.Refit == nil || gl.Refit.MultiplierFree || gl.Refit.Multiplier != 1 {
		t.Errorf("glaso refit: %+v", gl.Refit)
	}
	// Lasater declares no coefficients; Valkó–McCain's shape Rs below Pb, not Pb(Rsb).
	for id, note := range map[string]string{"lasater": "declares no coefficients", "valko-mccain": "none of its declared coefficients"} {
		if f := familyResult(t, res, Pb, id); f.Refit != nil || !strings.Contains(f.RefitNote, note) {
			t.Errorf("%s: refit %+v, note %q", id, f.Refit, f.RefitNote)
		}
	}
}

func TestSurveyProgress(t *testing.T) {
	sv := synthSurvey(t, 40, 1, 0.05, defaultTruth)
	last, calls, total := 0, 0, 0
	_, err := RunSurvey(sv, SurveyOptions{Refit: true, Progress: func(done, tot int) {
		if done != last+1 || (total != 0 && tot != total) {
			t.Errorf("progress %d/%d after %d/%d", done, tot, last, total)
		}
		last, total = done, tot
		calls++
	}})
	if err != nil {
		t.Fatal(err)
	}
	if calls == 0 || last != total {
		t.Errorf("progress ended at %d/%d after %d calls", last, total, calls)
	}
}

// surveyCSV writes a survey as a survey file in field units, as a user's database would be.
func surveyCSV(sv *lab.Survey) []byte {
	var b bytes.Buffer
	b.WriteString("sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia],Bob [rb/STB],dead oil viscosity [cP],oil viscosity at Pb [cP]\n")
	for _, s := range sv.Samples {
		fmt.Fprintf(&b, "%s,%.1f,%.1f,%.3f,%.0f,%.0f,%.4f,%.4g,%.4g\n", s.ID, s.Temperature, s.API, s.GasGravity, s.Rsb, s.Pb, s.Bob, s.DeadViscosity, s.SatViscosity)
	}
	return b.Bytes()
}

// BenchmarkSurveyPb10k: the target, 10,000 samples, every pb family, 10 folds, reading
// the file included.
func BenchmarkSurveyPb10k(b *testing.B) {
	data := surveyCSV(synthSurvey(b, 10000, 1, 0.05, defaultTruth))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		sv, err := lab.ParseSurvey("db.csv", data)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := RunSurvey(sv, SurveyOptions{Properties: []PropertyID{Pb}}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSurveyPb10kRefit: the same with --refit.
func BenchmarkSurveyPb10kRefit(b *testing.B) {
	data := surveyCSV(synthSurvey(b, 10000, 1, 0.05, defaultTruth))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		sv, err := lab.ParseSurvey("db.csv", data)
		if err != nil {
			b.Fatal(err)
		}
		if _, err := RunSurvey(sv, SurveyOptions{Properties: []PropertyID{Pb}, Refit: true}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSurveyAll1k: 1,000 samples, every family of every survey property, 10 folds, with
// and without refit, reading included.
func BenchmarkSurveyAll1k(b *testing.B) {
	data := surveyCSV(synthSurvey(b, 1000, 1, 0.05, defaultTruth))
	for _, refit := range []bool{false, true} {
		b.Run(fmt.Sprintf("refit=%v", refit), func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				sv, err := lab.ParseSurvey("db.csv", data)
				if err != nil {
					b.Fatal(err)
				}
				if _, err := RunSurvey(sv, SurveyOptions{Refit: refit}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkSurveyRead10k: reading the 10,000-sample file alone, for the share of the total.
func BenchmarkSurveyRead10k(b *testing.B) {
	data := surveyCSV(synthSurvey(b, 10000, 1, 0.05, defaultTruth))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := lab.ParseSurvey("db.csv", data); err != nil {
			b.Fatal(err)
		}
	}
}

// TestSurveyOneSampleOrder: with a single sample every family's multiplier fits it exactly, so
// the tuned errors tie (up to round-off) and the families are ordered by their published error.
// Behaviour test (the sample's values are invented).
func TestSurveyOneSampleOrder(t *testing.T) {
	sv, err := lab.ParseSurvey("one.csv", []byte("sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia]\nA,200,35,0.8,500,2000\n"))
	if err != nil {
		t.Fatal(err)
	}
	res, err := RunSurvey(sv, SurveyOptions{Properties: []PropertyID{Pb}})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Properties) != 1 || len(res.Properties[0].Families) < 2 {
		t.Fatalf("properties %+v", res.Properties)
	}
	fs := res.Properties[0].Families
	for i := 1; i < len(fs); i++ {
		if fs[i].Published.AARE < fs[i-1].Published.AARE {
			t.Errorf("%s (published %.4g %%) after %s (%.4g %%)", fs[i].Family, fs[i].Published.AARE, fs[i-1].Family, fs[i-1].Published.AARE)
		}
	}
}
