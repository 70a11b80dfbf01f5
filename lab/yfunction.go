package lab

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// The Y-function of a constant-composition expansion (CCE) below the saturation pressure,
//
//	Y = (Psat − p) / (p·(V/Vsat − 1)),
//
// is close to a straight line in pressure for black oils (Standing, Volumetric and Phase
// Behavior of Oil Field Hydrocarbon Systems, 1952; McCain, The Properties of Petroleum
// Fluids, 2nd ed., 1990, ch. 10). A point off the line is a misread volume; a curved Y
// means the saturation pressure or the volumes near it are wrong, or the fluid is not a
// black oil. Pressures are psia; relative volumes are V/Vsat.

// ErrYTooFewPoints means a Y-function fit was asked of a CCE with fewer than three usable
// points below the saturation pressure.
var ErrYTooFewPoints = errors.New("lab: Y-function needs at least 3 CCE points below the saturation pressure with V/Vsat > 1")

// ErrCoTooFewPoints means an undersaturated compressibility was asked of a CCE with fewer
// than two points at or above the saturation pressure.
var ErrCoTooFewPoints = errors.New("lab: compressibility needs at least 2 CCE points at or above the saturation pressure")

// Outlier rule of the Y-function fit (documented choice, common practice in regression
// diagnostics): a point is off the line when its externally studentised residual exceeds
// YOutlierT in magnitude AND its residual exceeds YOutlierMinRel of the line's value. The
// second condition keeps near-perfect data (a residual scale near zero) from flagging
// rounding noise. The test runs only with at least YOutlierMinPoints points, since with
// fewer the deleted residual variance has too few degrees of freedom to mean anything.
const (
	YOutlierT         = 3.0
	YOutlierMinRel    = 0.01
	YOutlierMinPoints = 5
)

// yStudentCap bounds a studentised residual so it stays finite when the other points lie
// exactly on the line.
const yStudentCap = 1e6

// ImpliedPsatBracket is the half-width, as a fraction of the reported saturation pressure,
// of the bracket that ImpliedPsat searches.
const ImpliedPsatBracket = 0.10

// YPoint is one CCE point below the saturation pressure with its Y value.
type YPoint struct {
	Line      int     // cce.csv line (0 when built in code)
	Pressure  float64 // psia
	RelVolume float64 // V/Vsat as used (renormalised by ImpliedPsat)
	Y         float64 // (Psat − p)/(p·(V/Vsat − 1))
	Fit       float64 // A + B·p of the final line
	T         float64 // externally studentised residual against the line through all points
	Outlier   bool    // off the line by the rule of YOutlierT and YOutlierMinRel
}

// YFit is a straight line Y = A + B·p fitted by least squares to the Y values of the CCE
// points below Psat. Points flagged as outliers are left out of the final line.
type YFit struct {
	Psat   float64  // saturation pressure used, psia
	A      float64  // intercept, dimensionless
	B      float64  // slope, 1/psi
	R2     float64  // coefficient of determination of the final line
	RSS    float64  // residual sum of squares of the final line
	Points []YPoint // the points below Psat, in the order given
}

// Y returns the fitted line's value at p psia.
func (f YFit) Y(p float64) float64 { return f.A + f.B*p }

// Outliers returns the points off the line.
func (f YFit) Outliers() []YPoint {
	var out []YPoint
	for _, pt := range f.Points {
		if pt.Outlier {
			out = append(out, pt)
		}
	}
	return out
}

// RelVolume returns the smoothed relative volume V/Vsat = 1 + (Psat − p)/(p·Y(p)) at
// 0 < p ≤ Psat, from the fitted line (the inverse of the Y definition).
func (f YFit) RelVolume(p float64) (float64, error) {
	if !(p > 0) || p > f.Psat {
		return 0, fmt.Errorf("lab: smoothed relative volume wanted at %g psia, outside (0, Psat = %g]", p, f.Psat)
	}
	y := f.Y(p)
	if !(y > 0) || math.IsInf(y, 0) {
		return 0, fmt.Errorf("lab: Y line is %g at %g psia, want > 0", y, p)
	}
	return 1 + (f.Psat-p)/(p*y), nil
}

// SmoothedRelVolumes returns the smoothed V/Vsat at each fitted point's pressure, in the
// order of f.Points.
func (f YFit) SmoothedRelVolumes() ([]float64, error) {
	out := make([]float64, len(f.Points))
	for i, pt := range f.Points {
		v, err := f.RelVolume(pt.Pressure)
		if err != nil {
			return nil, err
		}
		out[i] = v
	}
	return out, nil
}

// YValue returns Y = (Psat − p)/(p·(V/Vsat − 1)) for one two-phase CCE point.
func YValue(psat, p, relVolume float64) (float64, error) {
	if !(psat > 0) || !(p > 0) || p >= psat {
		return 0, fmt.Errorf("lab: Y-function wants 0 < p < Psat, got p = %g, Psat = %g psia", p, psat)
	}
	if !(relVolume > 1) || math.IsInf(relVolume, 0) {
		return 0, fmt.Errorf("lab: Y-function wants V/Vsat > 1 below Psat, got %g at %g psia", relVolume, p)
	}
	return (psat - p) / (p * (relVolume - 1)), nil
}

// FitY computes the Y-function of the CCE points strictly below psat whose V/Vsat exceeds
// one (others are inconsistent and skipped: the QC reports them), fits Y = A + B·p by least
// squares, flags points off the line (YOutlierT, YOutlierMinRel), and refits the line
// without them. psat is the pressure at which the CCE volumes were normalised, psia.
func FitY(psat float64, pts []CCEPoint) (YFit, error) {
	if !(psat > 0) || math.IsInf(psat, 0) {
		return YFit{}, fmt.Errorf("lab: Y-function: saturation pressure %g psia, want > 0", psat)
	}
	var yp []YPoint
	for _, c := range pts {
		y, err := YValue(psat, c.Pressure, c.RelVolume)
		if err != nil {
			continue
		}
		yp = append(yp, YPoint{Line: c.Line, Pressure: c.Pressure, RelVolume: c.RelVolume, Y: y})
	}
	return fitYPoints(psat, yp)
}

func fitYPoints(psat float64, yp []YPoint) (YFit, error) {
	if len(yp) < 3 {
		return YFit{}, ErrYTooFewPoints
	}
	x := make([]float64, len(yp))
	y := make([]float64, len(yp))
	for i, pt := range yp {
		x[i], y[i] = pt.Pressure, pt.Y
	}
	all, ok := yLine(x, y)
	if !ok {
		return YFit{}, fmt.Errorf("lab: Y-function: the CCE points below Psat all lie at one pressure")
	}
	if len(yp) >= YOutlierMinPoints {
		t := all.studentised(x, y)
		for i := range yp {
			yp[i].T = t[i]
			e := y[i] - all.at(x[i])
			if math.Abs(t[i]) > YOutlierT && math.Abs(e) > YOutlierMinRel*math.Abs(all.at(x[i])) {
				yp[i].Outlier = true
			}
		}
	}
	var xi, yi []float64
	for i, pt := range yp {
		if !pt.Outlier {
			xi = append(xi, x[i])
			yi = append(yi, y[i])
		}
	}
	final := all
	if len(xi) < len(x) {
		if l, ok := yLine(xi, yi); ok && len(xi) >= 3 {
			final = l
		}
	}
	f := YFit{Psat: psat, A: final.a, B: final.b, Points: yp}
	var ybar float64
	for _, v := range yi {
		ybar += v
	}
	ybar /= float64(len(yi))
	var sst float64
	for i := range xi {
		e := yi[i] - final.at(xi[i])
		f.RSS += e * e
		sst += (yi[i] - ybar) * (yi[i] - ybar)
	}
	f.R2 = 1
	if sst > 0 {
		f.R2 = 1 - f.RSS/sst
	}
	for i := range f.Points {
		f.Points[i].Fit = final.at(f.Points[i].Pressure)
	}
	return f, nil
}

// yLineFit is an ordinary least-squares line with what the residual diagnostics need.
type yLineFit struct {
	a, b      float64
	xbar, sxx float64
	n         int
}

func (l yLineFit) at(x float64) float64 { return l.a + l.b*x }

func yLine(x, y []float64) (yLineFit, bool) {
	n := len(x)
	if n < 2 {
		return yLineFit{}, false
	}
	var xbar, ybar float64
	for i := range x {
		xbar += x[i]
		ybar += y[i]
	}
	xbar /= float64(n)
	ybar /= float64(n)
	var sxx, sxy float64
	for i := range x {
		sxx += (x[i] - xbar) * (x[i] - xbar)
		sxy += (x[i] - xbar) * (y[i] - ybar)
	}
	if !(sxx > 0) {
		return yLineFit{}, false
	}
	b := sxy / sxx
	return yLineFit{a: ybar - b*xbar, b: b, xbar: xbar, sxx: sxx, n: n}, true
}

// studentised returns the externally studentised residuals t_i = e_i/(s_(i)·√(1 − h_i)),
// with leverage h_i = 1/n + (x_i − x̄)²/Sxx and the deleted variance
// s_(i)² = (RSS − e_i²/(1 − h_i))/(n − 3) (Belsley, Kuh and Welsch, Regression
// Diagnostics, 1980). Values are capped at ±yStudentCap so they stay finite.
func (l yLineFit) studentised(x, y []float64) []float64 {
	n := len(x)
	e := make([]float64, n)
	var rss float64
	for i := range x {
		e[i] = y[i] - l.at(x[i])
		rss += e[i] * e[i]
	}
	t := make([]float64, n)
	if n < 4 {
		return t
	}
	for i := range x {
		h := 1/float64(n) + (x[i]-l.xbar)*(x[i]-l.xbar)/l.sxx
		if h >= 1 {
			continue
		}
		s2 := (rss - e[i]*e[i]/(1-h)) / float64(n-3)
		den := math.Sqrt(math.Max(s2, 0) * (1 - h))
		switch {
		case den > 0:
			t[i] = e[i] / den
		case e[i] != 0:
			t[i] = math.Copysign(yStudentCap, e[i])
		}
		t[i] = math.Max(-yStudentCap, math.Min(yStudentCap, t[i]))
	}
	return t
}

// PsatEstimate is the saturation pressure implied by a CCE's Y-function.
type PsatEstimate struct {
	Psat     float64 // psia
	Reported float64 // the saturation pressure the volumes were normalised at, psia
	Lo, Hi   float64 // bracket searched, psia
	VsatRel  float64 // V(Psat)/V(Reported) from the single-phase trend
	Fit      YFit    // the Y line at Psat, with the volumes renormalised to V(Psat)
}

// ImpliedPsat estimates the saturation pressure that makes the two-phase Y points most
// nearly a straight line. Method (ours, documented here): the Y line is first fitted at the
// reported pressure and its outliers are set aside. Then for a candidate Ps in the bracket
// (highest two-phase point, reported·(1 ± ImpliedPsatBracket)), capped below the highest
// CCE pressure: the points below Ps are two-phase; V(Ps) is taken from the single-phase
// trend, a least-squares line of ln V through the (up to three) lowest-pressure points at or
// above Ps (constant compressibility over that short span; V(Ps) = that point's V when only
// one exists); the volumes are renormalised V/V(Ps); and the line is fitted to their Y
// values. The objective is the scale-free residual RSS/ΣY²; a candidate with any
// renormalised two-phase V ≤ 1 is rejected. A 201-point grid over the bracket is refined by
// golden-section search around the best grid point. reported is the pressure of the CCE
// point with V/Vsat = 1 (or the report's saturation pressure), psia.
func ImpliedPsat(reported float64, pts []CCEPoint) (PsatEstimate, error) {
	f0, err := FitY(reported, pts)
	if err != nil {
		return PsatEstimate{}, err
	}
	type key struct {
		line int
		p, v float64
	}
	out := map[key]bool{}
	for _, pt := range f0.Points {
		if pt.Outlier {
			out[key{pt.Line, pt.Pressure, pt.RelVolume}] = true
		}
	}
	var use []CCEPoint
	for _, c := range pts {
		if !(c.Pressure > 0) || !(c.RelVolume > 0) || math.IsInf(c.Pressure, 0) || math.IsInf(c.RelVolume, 0) {
			continue
		}
		if !out[key{c.Line, c.Pressure, c.RelVolume}] {
			use = append(use, c)
		}
	}
	if len(use) == 0 {
		return PsatEstimate{}, ErrYTooFewPoints
	}
	sort.SliceStable(use, func(i, j int) bool { return use[i].Pressure > use[j].Pressure })
	lo := 0.0
	for _, c := range use {
		if c.Pressure < reported && c.RelVolume > 1 {
			lo = math.Max(lo, c.Pressure)
		}
	}
	lo = math.Max(lo, reported*(1-ImpliedPsatBracket))
	hi := math.Min(use[0].Pressure, reported*(1+ImpliedPsatBracket))
	if !(hi > lo) {
		return PsatEstimate{}, fmt.Errorf("lab: implied Psat: empty bracket (%g, %g) psia", lo, hi)
	}
	obj := func(ps float64) (float64, float64, []YPoint) {
		var above []CCEPoint
		for i := len(use) - 1; i >= 0 && len(above) < 3; i-- {
			if use[i].Pressure >= ps {
				above = append(above, use[i])
			}
		}
		if len(above) == 0 {
			return math.Inf(1), 0, nil
		}
		vs := above[0].RelVolume
		if len(above) >= 2 {
			x := make([]float64, len(above))
			y := make([]float64, len(above))
			for i, c := range above {
				x[i], y[i] = c.Pressure, math.Log(c.RelVolume)
			}
			if l, ok := yLine(x, y); ok {
				vs = math.Exp(l.at(ps))
			}
		}
		var yp []YPoint
		for _, c := range use {
			if c.Pressure >= ps {
				continue
			}
			v := c.RelVolume / vs
			y, err := YValue(ps, c.Pressure, v)
			if err != nil {
				return math.Inf(1), 0, nil
			}
			yp = append(yp, YPoint{Line: c.Line, Pressure: c.Pressure, RelVolume: v, Y: y})
		}
		if len(yp) < 3 {
			return math.Inf(1), 0, nil
		}
		x := make([]float64, len(yp))
		y := make([]float64, len(yp))
		var sy2 float64
		for i, pt := range yp {
			x[i], y[i] = pt.Pressure, pt.Y
			sy2 += pt.Y * pt.Y
		}
		l, ok := yLine(x, y)
		if !ok || !(sy2 > 0) {
			return math.Inf(1), 0, nil
		}
		var rss float64
		for i := range x {
			e := y[i] - l.at(x[i])
			rss += e * e
		}
		return rss / sy2, vs, yp
	}
	const ngrid = 200
	step := (hi - lo) / ngrid
	best, bestP := math.Inf(1), 0.0
	for i := 1; i < ngrid; i++ { // open bracket: the ends are data pressures or limits
		p := lo + float64(i)*step
		if g, _, _ := obj(p); g < best {
			best, bestP = g, p
		}
	}
	if math.IsInf(best, 1) {
		return PsatEstimate{}, fmt.Errorf("lab: implied Psat: no pressure in (%g, %g) psia gives a usable Y-function", lo, hi)
	}
	// Golden-section refinement around the best grid point.
	a, b := math.Max(lo, bestP-step), math.Min(hi, bestP+step)
	const gr = 0.6180339887498949
	c, d := b-gr*(b-a), a+gr*(b-a)
	gc, _, _ := obj(c)
	gd, _, _ := obj(d)
	for i := 0; i < 100 && b-a > 1e-9*reported; i++ {
		if gc < gd {
			b, d, gd = d, c, gc
			c = b - gr*(b-a)
			gc, _, _ = obj(c)
		} else {
			a, c, gc = c, d, gd
			d = a + gr*(b-a)
			gd, _, _ = obj(d)
		}
	}
	ps := (a + b) / 2
	g, vs, yp := obj(ps)
	if g > best || math.IsInf(g, 1) {
		ps = bestP
		_, vs, yp = obj(ps)
	}
	fit, err := fitYPoints(ps, yp)
	if err != nil {
		return PsatEstimate{}, err
	}
	return PsatEstimate{Psat: ps, Reported: reported, Lo: lo, Hi: hi, VsatRel: vs, Fit: fit}, nil
}

// CoPoint is the undersaturated oil compressibility between two neighbouring CCE points
// above the saturation pressure: co = −ln(V2/V1)/(p2 − p1), p2 > p1.
type CoPoint struct {
	Line     int     // cce.csv line of the higher-pressure point of the pair
	P1, P2   float64 // psia, P1 < P2
	Pressure float64 // (P1 + P2)/2, psia
	Co       float64 // 1/psi
}

// CoFit is a least-squares fit ln(V/Vsat) = C0 + C1·x + C2·x², x = p − Psat, to the CCE
// points at and above Psat (quadratic with four or more points, linear with two or three),
// so that co(p) = −d ln V/dp = −(C1 + 2·C2·x) (definition of isothermal compressibility;
// McCain, The Properties of Petroleum Fluids, 2nd ed., ch. 10).
type CoFit struct {
	Psat       float64 // psia
	C0, C1, C2 float64 // C1 in 1/psi, C2 in 1/psi²
	Degree     int     // 1 or 2
	Pmax       float64 // highest CCE pressure fitted, psia
}

// Co returns the fitted compressibility at p psia, 1/psi.
func (f CoFit) Co(p float64) float64 { return -(f.C1 + 2*f.C2*(p-f.Psat)) }

// RelVolume returns the fitted V/Vsat at p psia.
func (f CoFit) RelVolume(p float64) float64 {
	x := p - f.Psat
	return math.Exp(f.C0 + f.C1*x + f.C2*x*x)
}

// UndersaturatedCo returns the pointwise compressibility between neighbouring CCE points at
// or above psat (in increasing pressure) and a fit of ln V over them.
func UndersaturatedCo(psat float64, pts []CCEPoint) ([]CoPoint, CoFit, error) {
	if !(psat > 0) || math.IsInf(psat, 0) {
		return nil, CoFit{}, fmt.Errorf("lab: compressibility: saturation pressure %g psia, want > 0", psat)
	}
	var up []CCEPoint
	for _, c := range pts {
		if c.Pressure >= psat*(1-1e-9) && c.RelVolume > 0 && !math.IsInf(c.RelVolume, 0) && !math.IsInf(c.Pressure, 0) {
			up = append(up, c)
		}
	}
	sort.SliceStable(up, func(i, j int) bool { return up[i].Pressure < up[j].Pressure })
	if len(up) < 2 {
		return nil, CoFit{}, ErrCoTooFewPoints
	}
	var cp []CoPoint
	for i := 1; i < len(up); i++ {
		p1, p2 := up[i-1], up[i]
		if p2.Pressure == p1.Pressure {
			return nil, CoFit{}, fmt.Errorf("lab: compressibility: two CCE points at %g psia (cce.csv lines %d and %d)", p1.Pressure, p1.Line, p2.Line)
		}
		cp = append(cp, CoPoint{Line: p2.Line, P1: p1.Pressure, P2: p2.Pressure,
			Pressure: (p1.Pressure + p2.Pressure) / 2,
			Co:       -math.Log(p2.RelVolume/p1.RelVolume) / (p2.Pressure - p1.Pressure)})
	}
	deg := 1
	if len(up) >= 4 {
		deg = 2
	}
	// Scale x by 1000 psi for a well-conditioned normal-equation solve.
	const scale = 1000.0
	var m [3][3]float64
	var r [3]float64
	for _, c := range up {
		x := (c.Pressure - psat) / scale
		y := math.Log(c.RelVolume)
		basis := [3]float64{1, x, x * x}
		for i := 0; i <= deg; i++ {
			for j := 0; j <= deg; j++ {
				m[i][j] += basis[i] * basis[j]
			}
			r[i] += basis[i] * y
		}
	}
	sol, ok := qcSolve(m, r, deg+1)
	if !ok {
		return nil, CoFit{}, fmt.Errorf("lab: compressibility: the CCE points above Psat do not determine a fit")
	}
	f := CoFit{Psat: psat, C0: sol[0], C1: sol[1] / scale, Degree: deg, Pmax: up[len(up)-1].Pressure}
	if deg == 2 {
		f.C2 = sol[2] / (scale * scale)
	}
	return cp, f, nil
}

// qcSolve solves the n×n (n ≤ 3) system m·x = r by Gaussian elimination with partial
// pivoting; ok is false when the system is singular.
func qcSolve(m [3][3]float64, r [3]float64, n int) ([3]float64, bool) {
	var x [3]float64
	for c := 0; c < n; c++ {
		p := c
		for i := c + 1; i < n; i++ {
			if math.Abs(m[i][c]) > math.Abs(m[p][c]) {
				p = i
			}
		}
		if math.Abs(m[p][c]) < 1e-300 {
			return x, false
		}
		m[c], m[p] = m[p], m[c]
		r[c], r[p] = r[p], r[c]
		for i := c + 1; i < n; i++ {
			f := m[i][c] / m[c][c]
			for j := c; j < n; j++ {
				m[i][j] -= f * m[c][j]
			}
			r[i] -= f * r[c]
		}
	}
	for i := n - 1; i >= 0; i-- {
		s := r[i]
		for j := i + 1; j < n; j++ {
			s -= m[i][j] * x[j]
		}
		x[i] = s / m[i][i]
	}
	for i := 0; i < n; i++ {
		if math.IsNaN(x[i]) || math.IsInf(x[i], 0) {
			return x, false
		}
	}
	return x, true
}
