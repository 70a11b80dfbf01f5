package correlations

import "math"

// brent finds a root of f in [a, b], where f(a) and f(b) have opposite signs, by Brent's
// method (R.P. Brent, Algorithms for Minimization without Derivatives, 1973, ch. 4):
// inverse quadratic interpolation and secant steps, safeguarded by bisection so that the
// bracket always shrinks. It stops when the bracket is narrower than xtol (plus a few ulps of
// the root). It does not allocate as long as f does not escape, which the callers ensure.
func brent(f func(float64) float64, a, b, xtol float64, maxIter int) (float64, error) {
	fa, fb := f(a), f(b)
	switch {
	case math.IsNaN(fa) || math.IsNaN(fb):
		return 0, ErrNotFinite
	case fa == 0:
		return a, nil
	case fb == 0:
		return b, nil
	case (fa > 0) == (fb > 0):
		return 0, ErrNoConvergence
	}
	c, fc := a, fa
	d := b - a
	e := d
	for range maxIter {
		if (fb > 0) == (fc > 0) {
			// Keep the root between b and c.
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol := 2*epsilon*math.Abs(b) + 0.5*xtol
		m := 0.5 * (c - b)
		if math.Abs(m) <= tol || fb == 0 {
			return b, nil
		}
		if math.Abs(e) >= tol && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				// Secant step.
				p = 2 * m * s
				q = 1 - s
			} else {
				// Inverse quadratic interpolation.
				q = fa / fc
				r := fb / fc
				p = s * (2*m*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*m*q-math.Abs(tol*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = m // interpolation would leave the bracket or converge too slowly: bisect
				e = m
			}
		} else {
			d = m
			e = m
		}
		a, fa = b, fb
		if math.Abs(d) > tol {
			b += d
		} else {
			b += math.Copysign(tol, m)
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return 0, ErrNotFinite
		}
	}
	return b, ErrNoConvergence
}

// epsilon is the float64 machine epsilon.
const epsilon = 0x1p-52
