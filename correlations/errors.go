package correlations

import (
	"errors"
	"fmt"
	"math"
)

// Sentinel errors. Functions wrap them with the numbers involved; test with errors.Is.
var (
	// ErrInput means an input cannot be used at all (negative pressure, zero gravity…).
	ErrInput = errors.New("correlations: input out of the physical domain")
	// ErrNotFinite means the equation produced NaN or ±Inf for these inputs.
	ErrNotFinite = errors.New("correlations: result is not finite")
	// ErrNoConvergence means an iterative solution did not converge.
	ErrNoConvergence = errors.New("correlations: no convergence")
	// ErrUnknownID means no catalog entry has the requested id for the property.
	ErrUnknownID = errors.New("correlations: unknown correlation id")
)

// finite returns v, or ErrNotFinite when v is NaN or infinite. The error is a preallocated
// sentinel so that the hot path does not allocate.
func finite(v float64) (float64, error) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, ErrNotFinite
	}
	return v, nil
}

// checkCoefficients validates a coefficient vector given to a With function: n finite values.
func checkCoefficients(c []float64, n int) error {
	if len(c) != n {
		return fmt.Errorf("%w: %d coefficients, want %d", ErrInput, len(c), n)
	}
	for _, v := range c {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%w: coefficient %g is not a finite number", ErrInput, v)
		}
	}
	return nil
}

// inputError reports an unusable input value.
func inputError(name string, v float64, want string) error {
	return fmt.Errorf("%w: %s = %g, want %s", ErrInput, name, v, want)
}
