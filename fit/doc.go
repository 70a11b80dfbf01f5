// Package fit tunes published black-oil correlation families to a laboratory PVT report.
//
// Each property (DESIGN.md §5) is tuned on its own with one bounded multiplier, or a
// multiplier and a shift, by gonum's Nelder–Mead simplex method (Nelder and Mead, 1965, as
// implemented in gonum.org/v1/gonum/optimize) on the weighted sum of squared relative errors.
// The multiplier is kept in [0.5, 2] by the smooth transform m = 2^tanh(θ), so that θ = 0
// is the published correlation. Statistics are given before and after tuning, and a 95 %
// interval of each parameter comes from the Jacobian at the optimum (Gauss–Newton
// covariance, Student's t quantile).
package fit
