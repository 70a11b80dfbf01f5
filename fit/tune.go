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
	nmConvergeIter = 12
)

// assumedRelSigma is the relative measurement uncertainty used for a parameter interval when a
// property has no more points than parameters (no residual degrees of freedom). Typical lab
// repeatability (common practice): about 1 % for FVF, Pb and Rs, 2 % for viscosity and Z,
// 5 % for compressibility.
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
	Property  PropertyID
	Family    string
	Mode      Mode
	Params    Params
	CI95      map[string][2]float64 // per parameter name ("multiplier", "shift")
	CIAssumed bool                  // the interval rests on an assumed lab uncertainty (no degrees of freedom)
	Published Stats
	Tuned     Stats
	Residuals []Residual
	Excluded  []int
	Flags     []string // multiplier far from 1, family outside its data range, …
	Evals     int      // objective evaluations
}

// problem is one property, one family, its points and the scratch space of the objective.
type problem struct {
	prop     PropertyID
	m        model
	pts      []Point
	use      []bool
	w        []float64
	loss     Loss
	delta    float64
	shift    bool
	shiftMax float64
	pred     []float64
}

func newProblem(ds *Dataset, prop PropertyID, m model, opts Options) (*problem, error) {
	pts := ds.Points[prop]
	if len(pts) == 0 {
		return nil, ErrNoData
	}
	pr := &problem{prop: prop, m: m, pts: pts, use: make([]bool, len(pts)), w: make([]float64, len(pts)),
		loss: opts.loss(), delta: opts.huberDelta(), shift: opts.mode() == MultiplierShift, pred: make([]float64, len(pts))}
	for i := range pr.use {
		pr.use[i] = true
		pr.w[i] = 1
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
	if prop == Co {
		pr.shiftMax /= coShiftUnit
	}
	return pr, nil
}

// params maps optimiser coordinates to bounded natural parameters.
func (pr *problem) params(x []float64) Params {
	q := Params{Multiplier: math.Pow(2, math.Tanh(x[0]))}
	if pr.shift && len(x) > 1 {
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
	if err := pr.m.predict(q, pr.pts, pr.pred); err != nil {
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
	if err := pr.m.predict(q, pr.pts, vals); err != nil {
		return Stats{}, err
	}
	var st Stats
	var sq float64
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
		sq += (v - lab) * (v - lab)
	}
	if st.Points > 0 {
		st.AARE /= float64(st.Points)
		st.Bias /= float64(st.Points)
		st.RMSE = math.Sqrt(sq / float64(st.Points))
	}
	return st, nil
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

// interval returns the 95 % half-widths of the natural parameters from the Gauss–Newton
// covariance s²(JᵀJ)⁻¹, J the Jacobian of the weighed residuals by central differences.
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
	if err := pr.m.predict(q, pr.pts, res); err != nil {
		return nil, false
	}
	rss := 0.0
	for _, i := range used {
		r := pr.residual(i, res[i])
		rss += pr.w[i] * r * r
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
		if pr.m.predict(qu, pr.pts, up) != nil || pr.m.predict(qd, pr.pts, dn) != nil {
			return nil, false
		}
		jac[j] = make([]float64, n)
		for a, i := range used {
			jac[j][a] = math.Sqrt(pr.w[i]) * (pr.residual(i, up[i]) - pr.residual(i, dn[i])) / (2 * h)
		}
	}
	// JᵀJ for k ≤ 2, inverted in closed form.
	var a, b, d float64
	for r := 0; r < n; r++ {
		a += jac[0][r] * jac[0][r]
		if k == 2 {
			b += jac[0][r] * jac[1][r]
			d += jac[1][r] * jac[1][r]
		}
	}
	var inv []float64 // diagonal of (JᵀJ)⁻¹
	if k == 1 {
		if a == 0 {
			return nil, false
		}
		inv = []float64{1 / a}
	} else {
		det := a*d - b*b
		if det <= 0 {
			return nil, false
		}
		inv = []float64{d / det, a / det}
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
		half[j] = tq * math.Sqrt(s2*inv[j])
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
