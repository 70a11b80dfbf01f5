// Package fit tunes published black-oil correlation families to a laboratory PVT report.
//
// Each property (DESIGN.md §5) is tuned on its own on a ladder of depths: published, one
// bounded multiplier, a shape parameter (a shift, or the bend of the pb pair) and the
// family's own coefficients held near their published values by a ridge. A multiplier and
// shift of an affine model are solved in closed form; every other fit is Levenberg–Marquardt
// on the weighted residuals (relative errors by default; the Huber loss as the sum of squares
// of its signed square roots). The multiplier is kept in [0.5, 2] by the smooth transform
// m = 2^tanh(θ), so that θ = 0 is the published correlation. Statistics are given before and
// after tuning, with the leave-one-out error of every rung, and a 95 % interval of each
// parameter comes from the Jacobian at the optimum (Gauss–Newton covariance, Student's t
// quantile).
package fit
