package fit

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/optimize"
	"gonum.org/v1/gonum/stat/distuv"
)

// Multiplier bounds of the smooth transform m = 2^tanh(θ) (DESIGN.md §5), and the range
// outside which a multiplier is flagged as far from the published correlation.
const (
	MinMultiplier  = 0.5
	MaxMultiplier  = 2.0
	FlagLowMult    = 0.8
	FlagHighMult   = 1.25
	penalty        = 1e30 // objective value where the correlation cannot be evaluated
	fdStep         = 1e-6 // relative step of the finite-difference Jacobian
	nmMaxEvals     = 2000
	nmFuncTol      = 1e-12
	nmConvergeIter = 8 // major iterations without a better vertex; 5 stopped 1-D contractions at 1e-4
)

// assumedRelSigma is the relative measurement uncertainty used for a parameter interval when a
// property has no more points than parameters (no residual degrees of freedom). Typical lab
// repeatability (common practice): 1 % for Pb and Rs, 0.5 % for FVF, 2 % for viscosity,
// 1 % for Z, 5 % for compressibility.
var assumedRelSigma = map[PropertyID]float64{
	Pb: 0.01, Bo: 0.005, Co: 0.05, MuDead: 0.02, MuSat: 0.02, MuUnder: 0.02, Z: 0.01,
}

// ErrNoData means a property has no usable points.
var ErrNoData = errors.New("fit: no lab data for this property")

// Residual is one point's lab, published and tuned values.
type Residual struct {
	Quantity  string  `json:"quantity"`
	Unit      string  `json:"unit"`
	Pressure  float64 `json:"pressure_psia"`
	Lab       float64 `json:"lab"`
	Published float64 `json:"published"`
	Tuned     float64 `json:"tuned"`
	Excluded  bool    `json:"excluded"`
	Source    string  `json:"source"`
	Line      int     `json:"line"`
}

// Result is the outcome of tuning one family to one property.
type Result struct {
	Property   PropertyID
	Family     string
	Mode       Mode
	Params     Params
	Shifted    bool                  // a shift was tuned (free, or fixed by Pb for pb); false: multiplier only
	ShiftUnit  string                // unit of Params.Shift (the property's, psia for pb)
	CI95       map[string][2]float64 // per parameter name ("multiplier", "shift"); nil when not determined
	CIAssumed  bool                  // the interval rests on an assumed lab uncertainty (no degrees of freedom)
	Published  Stats
	Tuned      Stats
	Residuals  []Residual
	Excluded   []int
	Flags      []string // multiplier far from 1 or at its bound, parameters left out, …
	OutOfRange []string // inputs outside the family's original data
	Evals      int      // objective evaluations

	Depth  Depth    // the rung the parameters belong to
	Ladder []Rung   // every rung with its training and leave-one-out errors, shallowest first
	LOO    *float64 // leave-one-out AARE (%) of the chosen rung; nil when not available
	NoFit  string   // set when even the chosen rung leaves a large error: the remark in words
}

// problem is one property, one family, its points and the scratch space of the objective.
type problem struct {
	prop     PropertyID
	nl       nonlinear // nil for affine models
	pts      []Point
	use      []bool
	w        []float64
	loss     Loss
	delta    float64
	shift    bool // the shift is a free parameter
	shiftMax float64
	pred     []float64
	notes    []string // what newProblem changed, for the result's flags

	// anchored (pb in multiplier+shift mode): the shift is fixed by Pb_tuned(Rsb) = Pb,
	// s = pbLab − m·pbPub, so the tuned pair honours the report's bubble point exactly.
	anchored     bool
	pbLab, pbPub float64

	// For affine models: prediction = a + m·b + s, a and b evaluated once.
	isAffine bool
	a, b     []float64
	basisErr error
}

// predict fills out with the predictions at natural parameters q.
func (pr *problem) predict(q Params, out []float64) error {
	if !pr.isAffine {
		return pr.nl.predict(q, pr.pts, out)
	}
	if pr.basisErr != nil {
		return pr.basisErr
	}
	for i := range out {
		out[i] = pr.a[i] + q.Multiplier*pr.b[i] + q.Shift
	}
	return nil
}

func newProblem(ds *Dataset, prop PropertyID, m model, opts Options) (*problem, error) {
	pts := ds.Points[prop]
	if len(pts) == 0 {
		return nil, ErrNoData
	}
	pr := &problem{prop: prop, pts: pts, use: make([]bool, len(pts)), w: make([]float64, len(pts)),
		loss: opts.loss(), delta: opts.huberDelta(), shift: opts.mode() == MultiplierShift, pred: make([]float64, len(pts))}
	for i := range pr.use {
		pr.use[i] = true
		pr.w[i] = 1
	}
	if prop == Pb && len(pts) > 1 {
		// The report's Pb weighs as much as all Rs points together, so that the tuned pair
		// honours the measured bubble point closely.
		for i, pt := range pts {
			if pt.Quantity == "Pb" {
				pr.w[i] = float64(len(pts) - 1)
			}
		}
	}
	if ws, ok := opts.Weights[prop]; ok {
		if len(ws) != len(pts) {
			return nil, fmt.Errorf("fit: %s: %d weights for %d points", prop, len(ws), len(pts))
		}
		for i, w := range ws {
			if !(w >= 0) || math.IsInf(w, 0) {
				return nil, fmt.Errorf("fit: %s: weight %d is %g, want a finite value ≥ 0", prop, i, w)
			}
			pr.w[i] = w
		}
	}
	for _, i := range opts.Excluded[prop] {
		if i < 0 || i >= len(pts) {
			return nil, fmt.Errorf("fit: %s: excluded point %d does not exist (%d points)", prop, i, len(pts))
		}
		pr.use[i] = false
	}
	switch m := m.(type) {
	case affine:
		pr.isAffine = true
		pr.a, pr.b = make([]float64, len(pts)), make([]float64, len(pts))
		pr.basisErr = m.basis(pts, pr.a, pr.b)
	case nonlinear:
		pr.nl = m
	default:
		return nil, fmt.Errorf("fit: %s: model %T is neither affine nor nonlinear", prop, m)
	}
	n := 0
	mean := 0.0
	for i, u := range pr.use {
		if u && pr.w[i] > 0 {
			n++
			mean += math.Abs(pts[i].Lab)
		}
	}
	if n == 0 {
		return nil, fmt.Errorf("fit: %s: every point is excluded", prop)
	}
	pr.shiftMax = 0.25 * mean / float64(n)
	if pr.shift {
		switch {
		case prop == Pb:
			pr.shift = false
			if err := pr.anchor(); err != nil {
				return nil, err
			}
		case prop == MuUnder:
			pr.shift = false
			pr.notes = append(pr.notes, "no shift for mu_under: it would break the viscosity's continuity at Pb")
		case n <= 2:
			pr.shift = false
			pr.notes = append(pr.notes, fmt.Sprintf("no shift: %d point(s) cannot determine two parameters", n))
		}
	}
	return pr, nil
}

// anchor fixes the pb shift by the report's bubble point (see problem.anchored).
func (pr *problem) anchor() error {
	pm, ok := pr.nl.(pbModel)
	if !ok {
		return fmt.Errorf("fit: pb: unexpected model %T", pr.nl)
	}
	for i, pt := range pr.pts {
		if pt.Quantity != "Pb" || !pr.use[i] {
			continue
		}
		v, err := pm.f.BubblePoint(pt.Rs, pm.oil)
		if err != nil {
			return fmt.Errorf("fit: pb: the published correlation cannot be evaluated: %w", err)
		}
		pr.anchored, pr.pbLab, pr.pbPub = true, pt.Lab, v
		return nil
	}
	pr.notes = append(pr.notes, "no shift: the report's Pb is excluded, so nothing anchors it")
	return nil
}

// params maps optimiser coordinates to bounded natural parameters.
func (pr *problem) params(x []float64) Params {
	q := Params{Multiplier: math.Pow(2, math.Tanh(x[0]))}
	switch {
	case pr.anchored:
		q.Shift = pr.pbLab - q.Multiplier*pr.pbPub
	case pr.shift && len(x) > 1:
		q.Shift = pr.shiftMax * math.Tanh(x[1])
	}
	return q
}

// coords is the inverse of params, for a start or a reported optimum.
func (pr *problem) coords(q Params) []float64 {
	x := []float64{math.Atanh(clamp(math.Log2(q.Multiplier), -0.999999, 0.999999))}
	if pr.shift {
		x = append(x, math.Atanh(clamp(q.Shift/pr.shiftMax, -0.999999, 0.999999)))
	}
	return x
}

func clamp(v, lo, hi float64) float64 { return math.Max(lo, math.Min(hi, v)) }

// residual returns the weighed residual of point i for prediction v: relative by default.
func (pr *problem) residual(i int, v float64) float64 {
	lab := pr.pts[i].Lab
	if pr.loss == Absolute {
		return v - lab
	}
	return (v - lab) / lab
}

// objective is the weighted loss at natural parameters q; penalty when the family fails.
func (pr *problem) objective(q Params) float64 {
	if err := pr.predict(q, pr.pred); err != nil {
		return penalty
	}
	s := 0.0
	for i, v := range pr.pred {
		if !pr.use[i] {
			continue
		}
		r := pr.residual(i, v)
		if pr.loss == Huber && math.Abs(r) > pr.delta {
			s += pr.w[i] * (2*pr.delta*math.Abs(r) - pr.delta*pr.delta)
		} else {
			s += pr.w[i] * r * r
		}
	}
	if math.IsNaN(s) || math.IsInf(s, 0) {
		return penalty
	}
	return s
}

// stats evaluates error statistics of the used points at parameters q into out.
func (pr *problem) stats(q Params, vals []float64) (Stats, error) {
	if err := pr.predict(q, vals); err != nil {
		return Stats{}, err
	}
	st := Stats{RMSEUnit: rmseUnit(pr.prop, pr.pts)}
	var sq float64
	nsq := 0
	for i, v := range vals {
		if !pr.use[i] || pr.w[i] == 0 {
			continue
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return Stats{}, fmt.Errorf("fit: %s: prediction at %g psia is not finite", pr.prop, pr.pts[i].Pressure)
		}
		lab := pr.pts[i].Lab
		re := 100 * (v - lab) / lab
		st.Points++
		st.AARE += math.Abs(re)
		st.Bias += re
		st.MaxARE = math.Max(st.MaxARE, math.Abs(re))
		if pr.pts[i].Unit == st.RMSEUnit {
			sq += (v - lab) * (v - lab)
			nsq++
		}
	}
	if st.Points > 0 {
		st.AARE /= float64(st.Points)
		st.Bias /= float64(st.Points)
	}
	if nsq > 0 {
		st.RMSE = math.Sqrt(sq / float64(nsq))
	}
	return st, nil
}

// rmseUnit is the unit RMSE is given in: the property's main quantity (Rs for pb, whose
// points mix Pb in psia and Rs in scf/STB).
func rmseUnit(prop PropertyID, pts []Point) string {
	if prop == Pb {
		return "scf/STB"
	}
	if len(pts) > 0 {
		return pts[0].Unit
	}
	return ""
}

// shiftUnit is the unit of a property's shift parameter.
func shiftUnit(prop PropertyID, pts []Point) string {
	if prop == Pb {
		return "psia"
	}
	return rmseUnit(prop, pts)
}

// minimize runs Nelder–Mead from the published parameters and returns the optimum.
func (pr *problem) minimize() (Params, int, error) {
	x0 := pr.coords(Published)
	p := optimize.Problem{Func: func(x []float64) float64 { return pr.objective(pr.params(x)) }}
	if p.Func(x0) >= penalty {
		return Params{}, 1, fmt.Errorf("fit: %s: the published correlation cannot be evaluated for this oil", pr.prop)
	}
	settings := &optimize.Settings{
		FuncEvaluations: nmMaxEvals,
		Converger:       &optimize.FunctionConverge{Absolute: nmFuncTol, Relative: nmFuncTol, Iterations: nmConvergeIter},
	}
	res, err := optimize.Minimize(p, x0, settings, &optimize.NelderMead{SimplexSize: 0.1})
	if err != nil {
		return Params{}, 0, fmt.Errorf("fit: %s: Nelder–Mead: %w", pr.prop, err)
	}
	if serr := res.Status.Err(); serr != nil {
		return Params{}, res.FuncEvaluations, fmt.Errorf("fit: %s: Nelder–Mead ended with %v: %w", pr.prop, res.Status, serr)
	}
	return pr.params(res.X), res.FuncEvaluations, nil
}

// interval returns the 95 % half-widths of the natural parameters. The covariance is the
// Gauss–Newton one, σ²(JᵀJ)⁻¹, J the Jacobian of the residuals by central differences; with
// unequal weights W it is the sandwich (JᵀWJ)⁻¹ JᵀW²J (JᵀWJ)⁻¹ σ², since the weights express
// importance, not a known measurement variance. σ² comes from the unweighted residuals.
func (pr *problem) interval(q Params) (half []float64, assumed bool) {
	k := 1
	if pr.shift {
		k = 2
	}
	var used []int
	for i, u := range pr.use {
		if u && pr.w[i] > 0 {
			used = append(used, i)
		}
	}
	n := len(used)
	res := make([]float64, len(pr.pts))
	if err := pr.predict(q, res); err != nil {
		return nil, false
	}
	rss := 0.0
	for _, i := range used {
		r := pr.residual(i, res[i])
		rss += r * r
	}
	jac := make([][]float64, k)
	up, dn := make([]float64, len(pr.pts)), make([]float64, len(pr.pts))
	for j := 0; j < k; j++ {
		qu, qd := q, q
		var h float64
		if j == 0 {
			h = fdStep * q.Multiplier
			qu.Multiplier += h
			qd.Multiplier -= h
		} else {
			h = fdStep * math.Max(1e-3*pr.shiftMax, math.Abs(q.Shift))
			qu.Shift += h
			qd.Shift -= h
		}
		if pr.predict(qu, up) != nil || pr.predict(qd, dn) != nil {
			return nil, false
		}
		jac[j] = make([]float64, n)
		for a, i := range used {
			jac[j][a] = (pr.residual(i, up[i]) - pr.residual(i, dn[i])) / (2 * h)
		}
	}
	// A = JᵀWJ and B = JᵀW²J, k×k with k ≤ 2.
	var a, b [2][2]float64
	for r, i := range used {
		w := pr.w[i]
		for x := 0; x < k; x++ {
			for y := 0; y < k; y++ {
				a[x][y] += w * jac[x][r] * jac[y][r]
				b[x][y] += w * w * jac[x][r] * jac[y][r]
			}
		}
	}
	var ai [2][2]float64
	if k == 1 {
		if a[0][0] == 0 {
			return nil, false
		}
		ai[0][0] = 1 / a[0][0]
	} else {
		det := a[0][0]*a[1][1] - a[0][1]*a[1][0]
		if !(det > 0) {
			return nil, false
		}
		ai = [2][2]float64{{a[1][1] / det, -a[0][1] / det}, {-a[1][0] / det, a[0][0] / det}}
	}
	dof := n - k
	var s2, tq float64
	if dof > 0 {
		s2 = rss / float64(dof)
		tq = distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(dof)}.Quantile(0.975)
	} else {
		// No degrees of freedom: the fit is exact; use the assumed lab uncertainty.
		sig := assumedRelSigma[pr.prop]
		if pr.loss == Absolute {
			sig *= meanAbsLab(pr.pts, used)
		}
		s2, tq, assumed = sig*sig, 1.959963984540054, true
	}
	half = make([]float64, k)
	for j := range half {
		// (A⁻¹ B A⁻¹)_jj
		v := 0.0
		for x := 0; x < k; x++ {
			for y := 0; y < k; y++ {
				v += ai[j][x] * b[x][y] * ai[y][j]
			}
		}
		half[j] = tq * math.Sqrt(s2*v)
	}
	return half, assumed
}

func meanAbsLab(pts []Point, used []int) float64 {
	s := 0.0
	for _, i := range used {
		s += math.Abs(pts[i].Lab)
	}
	return s / float64(len(used))
}
