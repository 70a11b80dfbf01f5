package correlations

import (
	"fmt"
	"math"
)

// Domain of the Z solvers. Below Tpr 0.7 neither equation describes a gas (DAK's density
// polynomial changes sign at high density below Tpr ≈ 0.25, and both were fitted to the
// Standing–Katz chart, whose lowest isotherm is 1.05 with liquid-side curves down to 0.7);
// Ppr 100 (≈ 67,000 psia) is far beyond any reservoir.
const (
	minTpr = 0.7
	maxTpr = 10
	maxPpr = 100
	// zTol is the relative change in reduced density at which the Newton iteration stops;
	// Newton converges quadratically, so Z is then correct to far better than 1e-10.
	zTol     = 1e-12
	zQuadTol = 1e-7
	zMaxIter = 100
)

func checkReduced(tpr, ppr float64) error {
	if !(tpr >= minTpr && tpr <= maxTpr) {
		return inputError("Tpr", tpr, fmt.Sprintf("%g ≤ Tpr ≤ %g", float64(minTpr), float64(maxTpr)))
	}
	if !(ppr >= 0 && ppr <= maxPpr) {
		return inputError("Ppr", ppr, fmt.Sprintf("0 ≤ Ppr ≤ %g", float64(maxPpr)))
	}
	return nil
}

// zGuess seeds the Newton iteration, which a bracket safeguards, so it only needs to be
// roughly right: Papay's (1968) explicit estimate up to Ppr 3, and above Ppr 5 a straight
// line Z ≈ 1.15 + 0.12·(Ppr − 10)/Tpr^1.5 that follows the nearly linear high-pressure
// isotherms of the Standing–Katz chart (our rough fit to DAK values, within about 10 %),
// blended linearly in between.
func zGuess(tpr, ppr float64) float64 {
	papay := func() float64 {
		z := 1 - 3.53*ppr/math.Exp(0.9813*math.Ln10*tpr) + 0.274*ppr*ppr/math.Exp(0.8157*math.Ln10*tpr)
		return math.Min(math.Max(z, 0.25), 2.0)
	}
	line := func() float64 { return math.Max(1.15+0.12*(ppr-10)/(tpr*math.Sqrt(tpr)), 0.25) }
	switch {
	case ppr <= 3:
		return papay()
	case ppr >= 5:
		return line()
	default:
		w := (ppr - 3) / 2
		return (1-w)*papay() + w*line()
	}
}

// Dranchuk–Abou-Kassem constants A1…A11 (Dranchuk and Abou-Kassem, 1975, Table 1).
const (
	dakA1  = 0.3265
	dakA2  = -1.0700
	dakA3  = -0.5339
	dakA4  = 0.01569
	dakA5  = -0.05165
	dakA6  = 0.5475
	dakA7  = -0.7361
	dakA8  = 0.1844
	dakA9  = 0.1056
	dakA10 = 0.6134
	dakA11 = 0.7210
)

// DranchukAbouKassem returns the gas compressibility factor Z at pseudo-reduced temperature
// tpr and pressure ppr, after Dranchuk, P.M. and Abou-Kassem, J.H. (1975), "Calculation of Z
// Factors for Natural Gases Using Equations of State", J. Can. Petrol. Technol. 14 (3): 34–36.
// Their 11-constant equation of state, fitted to 1,500 points of the Standing–Katz chart
// (1.0 < Tpr ≤ 3.0, 0.2 ≤ Ppr < 30), is written in the reduced density ρr = 0.27·Ppr/(Z·Tpr):
//
//	Z = 1 + (A1 + A2/Tr + A3/Tr³ + A4/Tr⁴ + A5/Tr⁵)·ρr + (A6 + A7/Tr + A8/Tr²)·ρr²
//	      − A9·(A7/Tr + A8/Tr²)·ρr⁵ + A10·(1 + A11·ρr²)·(ρr²/Tr³)·exp(−A11·ρr²)
//
// It is solved for ρr by Newton's method inside a bracket [0, ρmax] that always holds a root
// (a bisection step replaces any Newton step that leaves it), to a relative change of 1e-12.
// Near the critical point (Tpr < 1.05) the equation can have several roots; the one found is
// the root reached from the seed (usually the vapour root), and values there are rough.
func DranchukAbouKassem(tpr, ppr float64) (float64, error) {
	if err := checkReduced(tpr, ppr); err != nil {
		return 0, err
	}
	if ppr == 0 {
		return 1, nil
	}
	t := 1 / tpr
	t2 := t * t
	t3 := t2 * t
	c1 := dakA1 + dakA2*t + dakA3*t3 + dakA4*t3*t + dakA5*t3*t2
	c2 := dakA6 + dakA7*t + dakA8*t2
	c3 := dakA9 * (dakA7*t + dakA8*t2)
	c4 := dakA10 * t3
	k := 0.27 * ppr * t // ρr·Z

	// g(ρ) = ρ·Z(ρ) − k: g(0) = −k < 0 and g → +∞ because c3 < 0 for Tpr ≥ 0.7.
	g := func(r float64) (f, df float64) {
		r2 := r * r
		e := math.Exp(-dakA11 * r2)
		f = r + c1*r2 + c2*r2*r - c3*r2*r2*r2 + c4*r2*r*(1+dakA11*r2)*e - k
		df = 1 + 2*c1*r + 3*c2*r2 - 6*c3*r2*r2*r + c4*e*(3*r2+3*dakA11*r2*r2-2*dakA11*dakA11*r2*r2*r2)
		return f, df
	}
	lo, hi := 0.0, k/0.25
	for i := 0; ; i++ {
		if f, _ := g(hi); f > 0 {
			break
		}
		if i == 60 {
			return 0, ErrNoConvergence
		}
		lo, hi = hi, 2*hi
	}
	r, err := newtonBracketed(g, k, lo, hi, k/zGuess(tpr, ppr))
	if err != nil {
		return 0, err
	}
	return finite(k / r)
}

// HallYarborough returns the gas compressibility factor Z at pseudo-reduced temperature tpr
// and pressure ppr, after Hall, K.R. and Yarborough, L. (1973), "A New Equation of State for
// Z-factor Calculations", Oil and Gas Journal 71 (25): 82–92. With t = 1/Tpr the reduced
// density y solves the augmented hard-sphere (Starling–Carnahan) equation
//
//	−A·Ppr + (y + y² + y³ − y⁴)/(1 − y)³ − B·y² + C·y^D = 0
//	A = 0.06125·t·exp(−1.2·(1 − t)²)
//	B = t·(14.76 − 9.76·t + 4.58·t²)
//	C = t·(90.7 − 242.2·t + 42.4·t²)
//	D = 2.18 + 2.82·t
//
// and Z = A·Ppr/y. Fitted to the Standing–Katz chart (Tpr 1.05–3, Ppr to 15; average error
// 0.3 % excluding the 1.05–1.15 isotherms, per the paper). Solved by Newton's method on y
// inside the bracket (0, 1) with bisection fallback, to a relative change of 1e-12.
func HallYarborough(tpr, ppr float64) (float64, error) {
	if err := checkReduced(tpr, ppr); err != nil {
		return 0, err
	}
	if ppr == 0 {
		return 1, nil
	}
	t := 1 / tpr
	a := 0.06125 * t * math.Exp(-1.2*(1-t)*(1-t))
	b := t * (14.76 - 9.76*t + 4.58*t*t)
	c := t * (90.7 - 242.2*t + 42.4*t*t)
	d := 2.18 + 2.82*t
	k := a * ppr

	// f(y): f(0) = −k < 0 and f → +∞ as y → 1, so (0, 1) brackets a root.
	f := func(y float64) (fy, dfy float64) {
		y2 := y * y
		om := 1 - y
		om3 := om * om * om
		yd := math.Exp(d * math.Log(y))
		fy = -k + (y+y2+y2*y-y2*y2)/om3 - b*y2 + c*yd
		dfy = (1+4*y+4*y2-4*y2*y+y2*y2)/(om3*om) - 2*b*y + c*d*yd/y
		return fy, dfy
	}
	y, err := newtonBracketed(f, k, 0, 1, k/zGuess(tpr, ppr))
	if err != nil {
		return 0, err
	}
	return finite(k / y)
}

// newtonBracketed solves P(x) = k for x in (lo, hi), where P(lo) < k < P(hi) and P is
// increasing there, starting from x0. fn returns P(x) − k and its derivative. Far from the
// root (|P/k − 1| > 0.05) it takes Newton steps on ln P against ln x, which converge in a
// few steps for the steep power-law growth of P at high density where plain Newton would
// crawl; near the root it takes plain Newton steps. Any step that leaves the bracket, or a
// non-positive slope, is replaced by bisection. It stops when the step is below zTol
// relative to x.
func newtonBracketed(fn func(float64) (float64, float64), k, lo, hi, x0 float64) (float64, error) {
	x := x0
	if !(x > lo && x < hi) {
		x = 0.5 * (lo + hi)
	}
	for i := 0; i < zMaxIter; i++ {
		f, df := fn(x)
		if f == 0 {
			return x, nil
		}
		if f < 0 {
			lo = x
		} else {
			hi = x
		}
		var next float64
		plain := false
		switch p := f + k; {
		case !(df > 0):
			next = 0.5 * (lo + hi)
		case math.Abs(f) > 0.05*k && p > 0:
			next = x * math.Exp(-math.Log(p/k)*p/(x*df))
		default:
			next = x - f/df
			plain = true
		}
		// Test convergence before the bracket: a converged Newton step can round onto the
		// bracket end that x itself has just become. Newton converges quadratically, so
		// after a plain step smaller than zQuadTol the error of next is of order
		// (f''/2f')·step², below zTol, and the confirming evaluation is skipped.
		if next >= lo && next <= hi {
			if d := math.Abs(next - x); d <= zTol*x || (plain && d <= zQuadTol*x) {
				return next, nil
			}
		}
		if !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		if hi-lo <= zTol*x {
			return next, nil
		}
		x = next
	}
	return 0, ErrNoConvergence
}
