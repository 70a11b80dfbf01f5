package fit

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"
)

// Multiplier bounds of the smooth transform m = 2^tanh(θ) (DESIGN.md §5), and the range
// outside which a multiplier is flagged as far from the published correlation. The pb bend
// uses the same transform and bounds; a refitted coefficient c = c₀·4^tanh(u) stays within a
// quarter and four times its published value (MinCoefficientRatio, MaxCoefficientRatio), the
// ridge holding it near c₀.
const (
	MinMultiplier = 0.5
	MaxMultiplier = 2.0

	MinCoefficientRatio = 0.25
	MaxCoefficientRatio = 4.0

	FlagLowMult  = 0.8
	FlagHighMult = 1.25
	penalty      = 1e30 // objective value where the correlation cannot be evaluated
	fdStep       = 1e-6 // relative step of the finite-difference Jacobian
)

// RidgeStrength is λ of the refit depth's penalty λ·Σ(c/c₀ − 1)² on the relative change of
// each refitted coefficient from its published value, added to the sum of squared weighted
// residuals (relative errors; for Rs relative to Rsb). It is chosen by TestRidgeStrengthChoice
// as the weakest pull on the 1–2–5 grid that keeps a refit to three noisy (0.3 %) points within
// 3 % of the published coefficients; a weaker pull lets three points drag the coefficients by
// 5 % and more, a stronger one biases well-determined refits (eight points still recover a
// changed coefficient within 2 %).
const RidgeStrength = 2e-4

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
	Params     Params
	Shifted    bool                  // Params.Shift is a tuned parameter
	ShiftUnit  string                // unit of Params.Shift (the property's, psia for pb)
	Anchored   bool                  // pb: the pressure scale is fixed by the report's Pb
	CI95       map[string][2]float64 // per parameter name ("multiplier", "shift", "exponent", coefficient ids); nil when not determined
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
	// CoefficientIDs name the entries of Params.Coefficients (the family's declaration).
	CoefficientIDs []string
}

// layout says which parameters a rung frees, in the order of the optimiser's coordinates.
type layout struct {
	anchor bool  // pb: the pressure scale is fixed by the report's Pb
	mult   bool  // a free multiplier (pb without an anchor: a free pressure scale)
	shift  bool  // a free shift
	exp    bool  // the pb bend
	coef   []int // indexes of the freed coefficients in the family's declaration
}

func (l layout) size() int {
	n := len(l.coef)
	for _, b := range []bool{l.mult, l.shift, l.exp} {
		if b {
			n++
		}
	}
	return n
}

// names are the parameter names of the layout, as in Result.CI95.
func (l layout) names(ids []string) []string {
	var ns []string
	if l.mult {
		ns = append(ns, "multiplier")
	}
	if l.shift {
		ns = append(ns, "shift")
	}
	if l.exp {
		ns = append(ns, "bend")
	}
	for _, j := range l.coef {
		ns = append(ns, ids[j])
	}
	return ns
}

// problem is one property, one family, its points and the scratch space of the objective.
type problem struct {
	prop     PropertyID
	nl       nonlinear // nil for affine models
	af       affine    // nil for nonlinear models
	pts      []Point
	use      []bool
	w        []float64
	scale    []float64 // denominator of each point's residual
	loss     Loss
	delta    float64
	shiftMax float64
	lambda   float64 // ridge strength of the refit depth
	pred     []float64
	notes    []string // what newProblem changed, for the result's flags

	// coefficients: the published values of the family's declaration (nil: none declared).
	coef0 []float64
	lay   layout
	cbuf  []float64 // scratch coefficients of params

	// anchored (pb): the pressure scale is fixed by Pb_tuned(Rsb) = Pb: m = (Pb − s)/Pb_c(Rsb).
	anchored bool
	anchorAt int // index of the Pb point
	pbLab    float64

	// For affine models: prediction = a + m·b + s, a and b evaluated once for published
	// coefficients (a0, b0) and per evaluation into a, b for a refit.
	a0, b0, a, b []float64
	basisErr     error
}

// predict fills out with the predictions at natural parameters q.
func (pr *problem) predict(q Params, out []float64) error {
	if pr.nl != nil {
		return pr.nl.predict(q, pr.pts, out)
	}
	a, b := pr.a0, pr.b0
	if q.Coefficients != nil {
		if err := pr.af.basis(q.Coefficients, pr.pts, pr.a, pr.b); err != nil {
			return err
		}
		a, b = pr.a, pr.b
	} else if pr.basisErr != nil {
		return pr.basisErr
	}
	for i := range out {
		out[i] = a[i] + q.Multiplier*b[i] + q.Shift
	}
	return nil
}

func newProblem(ds *Dataset, prop PropertyID, m model, opts Options) (*problem, error) {
	pts := ds.Points[prop]
	if len(pts) == 0 {
		return nil, ErrNoData
	}
	n := len(pts)
	pr := &problem{prop: prop, pts: pts, use: make([]bool, n), w: make([]float64, n), scale: make([]float64, n),
		loss: opts.loss(), delta: opts.huberDelta(), lambda: opts.ridge(), pred: make([]float64, n), anchorAt: -1}
	for i := range pr.use {
		pr.use[i] = true
		pr.w[i] = 1
	}
	if ws, ok := opts.Weights[prop]; ok {
		if len(ws) != n {
			return nil, fmt.Errorf("fit: %s: %d weights for %d points", prop, len(ws), n)
		}
		for i, w := range ws {
			if !(w >= 0) || math.IsInf(w, 0) {
				return nil, fmt.Errorf("fit: %s: weight %d is %g, want a finite value ≥ 0", prop, i, w)
			}
			pr.w[i] = w
		}
	}
	for _, i := range opts.Excluded[prop] {
		if i < 0 || i >= n {
			return nil, fmt.Errorf("fit: %s: excluded point %d does not exist (%d points)", prop, i, n)
		}
		pr.use[i] = false
	}
	switch m := m.(type) {
	case affine:
		pr.af = m
		pr.a0, pr.b0, pr.a, pr.b = make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
		pr.basisErr = m.basis(nil, pts, pr.a0, pr.b0)
	case nonlinear:
		pr.nl = m
	default:
		return nil, fmt.Errorf("fit: %s: model %T is neither affine nor nonlinear", prop, m)
	}
	if cs := m.coefficients(); len(cs) > 0 {
		pr.coef0 = make([]float64, len(cs))
		for j, c := range cs {
			pr.coef0[j] = c.Value
		}
	}
	used, mean := 0, 0.0
	for i, u := range pr.use {
		if u && pr.w[i] > 0 {
			used++
			mean += math.Abs(pts[i].Lab)
		}
	}
	if used == 0 {
		return nil, fmt.Errorf("fit: %s: every point is excluded", prop)
	}
	mean /= float64(used)
	pr.shiftMax = 0.25 * mean
	// Residual scales (DESIGN.md §5 and DEVELOPERS.md): relative errors by default; for the Rs
	// points of pb relative to Rsb, because the adjusted Rs at low pressure is a small
	// difference of large numbers whose uncertainty is a fraction of Rsb, not of itself; with
	// the absolute loss, errors in the property's unit divided by the mean lab value, which
	// gives the same optimum as plain absolute errors and keeps the ridge on the same scale.
	for i, pt := range pts {
		switch {
		case pr.loss == Absolute:
			pr.scale[i] = mean
		case prop == Pb && pt.Quantity == "Rs":
			pr.scale[i] = ds.Rsb
		default:
			pr.scale[i] = pt.Lab
		}
		if prop == Pb && pt.Quantity == "Pb" && pr.use[i] {
			pr.anchored, pr.anchorAt, pr.pbLab = true, i, pt.Lab
		}
	}
	if prop == Pb && !pr.anchored {
		pr.notes = append(pr.notes, "the report's Pb is excluded, so nothing anchors the pair: its pressure scale is fitted to the Rs points")
	}
	return pr, nil
}

// free reports whether point i takes part in the fit as a free point (the pb anchor does not:
// it is honoured exactly).
func (pr *problem) free(i int) bool {
	return pr.use[i] && pr.w[i] > 0 && !(pr.anchored && i == pr.anchorAt)
}

func (pr *problem) freePoints() int {
	n := 0
	for i := range pr.pts {
		if pr.free(i) {
			n++
		}
	}
	return n
}

// params maps optimiser coordinates to bounded natural parameters under the current layout.
// The coefficient slice of the result is scratch space: clone it to keep it.
func (pr *problem) params(x []float64) (Params, error) {
	q := Params{Multiplier: 1}
	k := 0
	next := func() float64 { v := x[k]; k++; return v }
	if pr.lay.mult {
		q.Multiplier = math.Pow(2, math.Tanh(next()))
	}
	if pr.lay.shift {
		q.Shift = pr.shiftMax * math.Tanh(next())
	}
	if pr.lay.exp {
		q.Bend = math.Pow(2, math.Tanh(next()))
	}
	if len(pr.lay.coef) > 0 {
		if pr.cbuf == nil {
			pr.cbuf = make([]float64, len(pr.coef0))
		}
		copy(pr.cbuf, pr.coef0)
		for _, j := range pr.lay.coef {
			pr.cbuf[j] = pr.coef0[j] * math.Pow(4, math.Tanh(next()))
		}
		q.Coefficients = pr.cbuf
	}
	if pr.lay.anchor && !pr.reanchor(&q) {
		return q, fmt.Errorf("fit: pb: the pair cannot be evaluated at Rsb")
	}
	return q, nil
}

// coords is the inverse of params for the free parameters of q.
func (pr *problem) coords(q Params) []float64 {
	inv := func(ratio float64) float64 { return math.Atanh(clamp(math.Log2(ratio), -0.999999, 0.999999)) }
	var x []float64
	if pr.lay.mult {
		x = append(x, inv(q.Multiplier))
	}
	if pr.lay.shift {
		x = append(x, math.Atanh(clamp(q.Shift/pr.shiftMax, -0.999999, 0.999999)))
	}
	if pr.lay.exp {
		x = append(x, inv(q.bend()))
	}
	for _, j := range pr.lay.coef {
		r := 1.0
		if q.Coefficients != nil {
			r = q.Coefficients[j] / pr.coef0[j]
		}
		x = append(x, math.Atanh(clamp(math.Log(r)/math.Log(4), -0.999999, 0.999999)))
	}
	return x
}

func clamp(v, lo, hi float64) float64 { return math.Max(lo, math.Min(hi, v)) }

// residual returns the weighed residual of point i for prediction v (see the scales in
// newProblem).
func (pr *problem) residual(i int, v float64) float64 {
	return (v - pr.pts[i].Lab) / pr.scale[i]
}

// ridge is the refit penalty at parameters q.
func (pr *problem) ridge(q Params) float64 {
	if q.Coefficients == nil {
		return 0
	}
	s := 0.0
	for _, j := range pr.lay.coef {
		d := q.Coefficients[j]/pr.coef0[j] - 1
		s += d * d
	}
	return pr.lambda * s
}

// objective is the weighted loss over the free points plus the ridge at natural parameters q;
// penalty when the family fails.
func (pr *problem) objective(q Params) float64 {
	if err := pr.predict(q, pr.pred); err != nil {
		return penalty
	}
	s := 0.0
	for i, v := range pr.pred {
		if !pr.free(i) {
			continue
		}
		r := pr.residual(i, v)
		if pr.loss == Huber && math.Abs(r) > pr.delta {
			s += pr.w[i] * (2*pr.delta*math.Abs(r) - pr.delta*pr.delta)
		} else {
			s += pr.w[i] * r * r
		}
	}
	s += pr.ridge(q)
	if math.IsNaN(s) || math.IsInf(s, 0) {
		return penalty
	}
	return s
}

// stats evaluates error statistics of the used points at parameters q; vals receives the
// predictions at every point.
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

// minimize finds the optimum of the current layout's objective from x0 and returns its
// coordinates: in closed form where the model is affine in its parameters (linear), else by
// Levenberg–Marquardt on the residuals (leastSquares). A layout with no free parameter
// returns x0.
func (pr *problem) minimize(x0 []float64) ([]float64, int, error) {
	q, err := pr.params(x0)
	if err != nil || pr.objective(q) >= penalty {
		return nil, 1, fmt.Errorf("fit: %s: the correlation cannot be evaluated for this oil at the start", pr.prop)
	}
	if len(x0) == 0 {
		return x0, 1, nil
	}
	if x, ok := pr.linear(); ok {
		return x, 1, nil
	}
	return pr.leastSquares(x0)
}

// huberResidual is the signed square root of the Huber loss of a residual r with threshold δ,
// ψ(r) = r for |r| ≤ δ and sign(r)·√(2δ|r| − δ²) beyond (Huber, P.J. (1964), "Robust
// Estimation of a Location Parameter", Ann. Math. Statist. 35 (1): ρ = r² within δ, 2δ|r| − δ²
// beyond, in the scaling of objective). ψ² = ρ, and ψ is continuous with its first derivative
// at |r| = δ (both sides give ψ = δ, ψ' = 1), so the Huber objective is a sum of squares that
// Levenberg–Marquardt minimises; its gradient Σ 2ψψ'·∂r is the exact one, so the optimum is
// the Huber optimum.
func huberResidual(r, delta float64) float64 {
	a := math.Abs(r)
	if a <= delta {
		return r
	}
	return math.Copysign(math.Sqrt(2*delta*a-delta*delta), r)
}

// leastSquares minimises the objective as a sum of squares by Levenberg–Marquardt from x0: the
// residuals √w·r of the free points (√w·ψ(r) for the Huber loss, see huberResidual) and the
// ridge's √λ·(c/c₀ − 1). Nelder–Mead was measured to stall at its start in the narrow valley
// of a coefficient strongly correlated with the multiplier (Beggs–Robinson's 0.515 on the
// published report), which also made leave-one-out errors look better than the full fit; with
// the Huber loss, which it minimised until this, its refit rung stayed at the shape rung's
// optimum and its leave-one-out refits did not move from the full fit
// (TestHuberWithinDeltaIsRelative).
func (pr *problem) leastSquares(x0 []float64) ([]float64, int, error) {
	var free []int
	for i := range pr.pts {
		if pr.free(i) {
			free = append(free, i)
		}
	}
	nr := len(free) + len(pr.lay.coef)
	huber := pr.loss == Huber
	resid := func(x, out []float64) bool {
		q, err := pr.params(x)
		if err != nil || pr.predict(q, pr.pred) != nil {
			return false
		}
		for a, i := range free {
			r := pr.residual(i, pr.pred[i])
			if huber {
				r = huberResidual(r, pr.delta)
			}
			out[a] = math.Sqrt(pr.w[i]) * r
		}
		for a, j := range pr.lay.coef {
			out[len(free)+a] = math.Sqrt(pr.lambda) * (q.Coefficients[j]/pr.coef0[j] - 1)
		}
		for _, v := range out {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return false
			}
		}
		return true
	}
	x, evals, err := levenbergMarquardt(resid, x0, nr)
	if err != nil {
		return nil, evals, fmt.Errorf("fit: %s: %w", pr.prop, err)
	}
	return x, evals, nil
}

// linear solves a multiplier (and shift) of an affine model with published coefficients and a
// quadratic loss in closed form: the objective is then a weighted linear least-squares problem
// in (m, s), and when its optimum lies inside the bounds it is also the optimum of the bounded
// problem on the transformed parameters. ok is false when the closed form does not apply or
// its optimum is outside the bounds (Levenberg–Marquardt then runs on the transformed
// parameters).
func (pr *problem) linear() ([]float64, bool) {
	l := pr.lay
	if pr.af == nil || pr.loss == Huber || pr.basisErr != nil || !l.mult || l.exp || len(l.coef) > 0 || l.anchor {
		return nil, false
	}
	var sbb, sb, s1, sby, sy float64
	for i := range pr.pts {
		if !pr.free(i) {
			continue
		}
		u := pr.w[i] / (pr.scale[i] * pr.scale[i])
		b, y := pr.b0[i], pr.pts[i].Lab-pr.a0[i]
		sbb += u * b * b
		sb += u * b
		s1 += u
		sby += u * b * y
		sy += u * y
	}
	q := Params{}
	if l.shift {
		det := sbb*s1 - sb*sb
		if !(math.Abs(det) > 1e-12*sbb*s1) {
			return nil, false
		}
		q.Multiplier = (sby*s1 - sb*sy) / det
		q.Shift = (sbb*sy - sb*sby) / det
	} else {
		if !(sbb > 0) {
			return nil, false
		}
		q.Multiplier = sby / sbb
	}
	const inside = 0.999 // the transform cannot reach its bounds exactly
	if !(q.Multiplier > MinMultiplier/inside && q.Multiplier < MaxMultiplier*inside) || math.Abs(q.Shift) >= inside*pr.shiftMax {
		return nil, false
	}
	return pr.coords(q), true
}

// interval returns the 95 % half-widths of the free natural parameters at q (layout order).
// The covariance is the Gauss–Newton one, σ²(JᵀWJ + R)⁻¹ JᵀW²J (JᵀWJ + R)⁻¹, J the Jacobian of
// the residuals by central differences, W the weights (which express importance, not a known
// variance, hence the sandwich) and R the curvature of the ridge. σ² comes from the
// unweighted residuals; with no degrees of freedom from the assumed lab uncertainty.
func (pr *problem) interval(q Params) (half []float64, assumed bool) {
	k := pr.lay.size()
	if k == 0 {
		return nil, false
	}
	var used []int
	for i := range pr.pts {
		if pr.free(i) {
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
	// Natural parameters in layout order, their steps, and the ridge curvature.
	type par struct {
		get func(*Params) *float64
		c0  float64 // published value of a coefficient; 0 for the others
	}
	var ps []par
	if pr.lay.mult {
		ps = append(ps, par{get: func(p *Params) *float64 { return &p.Multiplier }})
	}
	if pr.lay.shift {
		ps = append(ps, par{get: func(p *Params) *float64 { return &p.Shift }})
	}
	if pr.lay.exp {
		ps = append(ps, par{get: func(p *Params) *float64 { return &p.Bend }})
	}
	for _, j := range pr.lay.coef {
		ps = append(ps, par{get: func(p *Params) *float64 { return &p.Coefficients[j] }, c0: pr.coef0[j]})
	}
	jac := mat.NewDense(n, k, nil)
	up, dn := make([]float64, len(pr.pts)), make([]float64, len(pr.pts))
	base := q.clone()
	if base.Bend == 0 && pr.lay.exp {
		base.Bend = 1
	}
	for j, p := range ps {
		qu, qd := base.clone(), base.clone()
		v := *p.get(&base)
		h := fdStep * math.Max(math.Abs(v), 1e-3*pr.shiftMax)
		if p.c0 == 0 && v == 0 {
			h = fdStep * pr.shiftMax
		}
		*p.get(&qu) = v + h
		*p.get(&qd) = v - h
		if pr.lay.anchor { // the scale follows the anchor as the other parameters move
			if !pr.reanchor(&qu) || !pr.reanchor(&qd) {
				return nil, false
			}
		}
		if pr.predict(qu, up) != nil || pr.predict(qd, dn) != nil {
			return nil, false
		}
		for a, i := range used {
			jac.Set(a, j, (pr.residual(i, up[i])-pr.residual(i, dn[i]))/(2*h))
		}
	}
	var a, b mat.Dense
	wj := mat.NewDense(n, k, nil)
	w2j := mat.NewDense(n, k, nil)
	for r, i := range used {
		for j := 0; j < k; j++ {
			wj.Set(r, j, pr.w[i]*jac.At(r, j))
			w2j.Set(r, j, pr.w[i]*pr.w[i]*jac.At(r, j))
		}
	}
	a.Mul(jac.T(), wj)
	b.Mul(jac.T(), w2j)
	for j, p := range ps {
		if p.c0 != 0 {
			a.Set(j, j, a.At(j, j)+pr.lambda/(p.c0*p.c0))
		}
	}
	var ai mat.Dense
	if err := ai.Inverse(&a); err != nil {
		return nil, false
	}
	var cov mat.Dense
	cov.Mul(&ai, &b)
	cov.Mul(&cov, &ai)
	dof := n - k
	var s2, tq float64
	if dof > 0 {
		s2 = rss / float64(dof)
		tq = distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(dof)}.Quantile(0.975)
	} else {
		// No degrees of freedom: the fit is exact; use the assumed lab uncertainty.
		sig := assumedRelSigma[pr.prop]
		s2, tq, assumed = sig*sig, 1.959963984540054, true
	}
	half = make([]float64, k)
	for j := range half {
		v := cov.At(j, j)
		if !(v >= 0) || math.IsInf(v, 0) {
			return nil, false
		}
		half[j] = tq * math.Sqrt(s2*v)
	}
	return half, assumed
}

// reanchor recomputes the anchored pb scale for changed parameters.
func (pr *problem) reanchor(q *Params) bool {
	pm := pr.nl.(pbModel)
	v, err := pm.publishedPb(pm.rsb, q.Coefficients)
	if err != nil || !(v > 0) {
		return false
	}
	q.Multiplier = (pr.pbLab - q.Shift) / v
	return true
}
