package correlations

import (
	"errors"
	"math"
	"testing"
)

// TestBrent checks the root finder on functions with known roots, including ones where plain
// secant or inverse quadratic steps misbehave.
func TestBrent(t *testing.T) {
	tests := []struct {
		name string
		f    func(float64) float64
		a, b float64
		root float64
	}{
		{"cubic x³ − 2x − 5 (Wallis' example, root 2.0945514815423265)", func(x float64) float64 { return x*x*x - 2*x - 5 }, 2, 3, 2.0945514815423265},
		{"cos x − x (Dottie number 0.7390851332151607)", func(x float64) float64 { return math.Cos(x) - x }, 0, 1, 0.7390851332151607},
		{"flat near root (x − 1)^5", func(x float64) float64 { return math.Pow(x-1, 5) }, 0, 3, 1},
		{"step-like atan(1e4·(x − 0.3))", func(x float64) float64 { return math.Atan(1e4 * (x - 0.3)) }, -5, 5, 0.3},
	}
	for _, tc := range tests {
		x, err := brent(tc.f, tc.a, tc.b, 1e-14, 200)
		if err != nil || math.Abs(x-tc.root) > 1e-6*math.Max(1, math.Abs(tc.root)) {
			t.Errorf("%s: x = %.16g, %v", tc.name, x, err)
		}
	}
	if _, err := brent(func(x float64) float64 { return x*x + 1 }, -1, 1, 1e-12, 50); !errors.Is(err, ErrNoConvergence) {
		t.Errorf("no bracket: err = %v", err)
	}
	if _, err := brent(func(x float64) float64 { return math.NaN() }, -1, 1, 1e-12, 50); !errors.Is(err, ErrNotFinite) {
		t.Errorf("NaN: err = %v", err)
	}
}
