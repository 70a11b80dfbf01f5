package fit

import (
	"fmt"
	"math"
	"strings"
)

// Depth choice (DESIGN.md §5, DEVELOPERS.md): a deeper rung replaces the one chosen so far only
// when its leave-one-out AARE is lower by at least chooseRelMargin of the chosen rung's and by
// at least chooseAbsMargin percentage points, so that noise does not buy parameters.
const (
	chooseRelMargin = 0.10
	chooseAbsMargin = 0.05
)

// No-fit thresholds: when the chosen rung still leaves more than this AARE over the free
// points, or this error at one point, the result says so in words.
const (
	noFitAARE = 5.0
	noFitMax  = 10.0
)

// rungFit is one fitted rung with the predictions it made.
type rungFit struct {
	rung  Rung
	lay   layout
	x     []float64
	q     Params
	vals  []float64 // predictions at every point
	evals int
}

// layoutFor returns the parameters a rung frees for this problem, or why the rung is skipped.
func (pr *problem) layoutFor(d Depth) (layout, string) {
	var l layout
	switch d {
	case DepthPublished:
		return l, ""
	case DepthMultiplier:
		l.anchor, l.mult = pr.anchored, !pr.anchored
	case DepthShape:
		l.anchor, l.mult = pr.anchored, !pr.anchored
		if pr.prop == Pb {
			l.exp = true
		} else if pr.prop == MuUnder {
			return l, "a shift would break the viscosity's continuity at Pb"
		} else if pr.prop == Z {
			return l, "a shift would break the ideal-gas limit (Z → 1 as the pressure falls)"
		} else {
			l.shift = true
		}
	case DepthRefit:
		l.anchor, l.mult = pr.anchored, !pr.anchored
		l.shift = pr.prop != Pb && pr.prop != MuUnder && pr.prop != Z
		if len(pr.coef0) == 0 {
			return l, "the family declares no coefficients to refit"
		}
		l.coef = pr.identifiable(l)
		if len(l.coef) == 0 {
			// Name the real reason: with no point to spare beyond the multiplier and shift,
			// no coefficient can be freed, whatever it does to the curve.
			switch n, base := pr.freePoints(), l.size(); {
			case n == 0:
				return l, "no free point to refit the coefficients to"
			case n <= base:
				return l, fmt.Sprintf("%s for the %s before the coefficients: none to spare for them", plural(n, "free point"), plural(base, "parameter"))
			}
			return l, "no declared coefficient changes the curve beyond the shallower rungs' parameters"
		}
	}
	return l, ""
}

// identifiable returns the declared coefficients that move the predictions at the free points
// in a direction that the layout's other parameters (and the coefficients kept before them)
// do not already cover: Gram–Schmidt on the columns of the residual Jacobian at the published
// correlation, in declaration order. Coefficients that only rescale pressure (which the anchor
// fixes), that belong to another API class, or that duplicate the multiplier or shift drop out.
func (pr *problem) identifiable(base layout) []int {
	var rows []int
	for i := range pr.pts {
		if pr.free(i) {
			rows = append(rows, i)
		}
	}
	if len(rows) == 0 {
		return nil
	}
	column := func(set func(q *Params, h float64) bool) []float64 {
		const h = 1e-4
		qu, qd := Params{Multiplier: 1}, Params{Multiplier: 1}
		if !set(&qu, h) || !set(&qd, -h) {
			return nil
		}
		if base.anchor && (!pr.reanchor(&qu) || !pr.reanchor(&qd)) {
			return nil
		}
		up, dn := make([]float64, len(pr.pts)), make([]float64, len(pr.pts))
		if pr.predict(qu, up) != nil || pr.predict(qd, dn) != nil {
			return nil
		}
		col := make([]float64, len(rows))
		for a, i := range rows {
			col[a] = (pr.residual(i, up[i]) - pr.residual(i, dn[i])) / (2 * h)
		}
		return col
	}
	// Columns are derivatives of the (relative) residuals by the relative change of a
	// parameter: a coefficient that matters moves them by 1e-3 or more; a column below
	// minColumn is round-off.
	const minColumn = 1e-6
	var basis [][]float64
	add := func(col []float64, keepTol float64) bool {
		if col == nil {
			return false
		}
		norm0 := math.Sqrt(dot(col, col))
		if norm0 <= minColumn {
			return false
		}
		v := append([]float64(nil), col...)
		for _, u := range basis {
			d := dot(v, u)
			for i := range v {
				v[i] -= d * u[i]
			}
		}
		nv := math.Sqrt(dot(v, v))
		if nv <= keepTol*norm0 || nv <= minColumn {
			return false
		}
		for i := range v {
			v[i] /= nv
		}
		basis = append(basis, v)
		return true
	}
	if base.mult {
		add(column(func(q *Params, h float64) bool { q.Multiplier = 1 + h; return true }), 0)
	}
	if base.shift {
		add(column(func(q *Params, h float64) bool { q.Shift = h * pr.shiftMax; return true }), 0)
	}
	var keep []int
	for j := range pr.coef0 {
		col := column(func(q *Params, h float64) bool {
			q.Coefficients = append([]float64(nil), pr.coef0...)
			q.Coefficients[j] *= 1 + h
			return true
		})
		if len(basis) >= len(rows) {
			break
		}
		if add(col, 1e-3) {
			keep = append(keep, j)
		}
	}
	return keep
}

func dot(a, b []float64) float64 {
	s := 0.0
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}

// fitRung fits one rung from the start coordinates (nil: the published correlation).
func (pr *problem) fitRung(d Depth, l layout, start []float64) (rungFit, error) {
	pr.lay = l
	rf := rungFit{rung: Rung{Depth: d, Free: l.size()}, lay: l, vals: make([]float64, len(pr.pts))}
	x0 := start
	if x0 == nil {
		x0 = pr.coords(Params{Multiplier: 1})
	}
	x, evals, err := pr.minimize(x0)
	rf.evals = evals
	if err != nil {
		return rf, err
	}
	q, err := pr.params(x)
	if err != nil {
		return rf, err
	}
	rf.x, rf.q = x, q.clone()
	rf.rung.Params = rf.q
	if rf.rung.Tuned, err = pr.stats(rf.q, rf.vals); err != nil {
		return rf, err
	}
	rf.rung.Flags = multiplierFlags(pr.prop, rf.q, l)
	return rf, nil
}

// leaveOneOut refits the rung with each free point left out in turn and predicts it. The
// anchor of pb is not left out (it is honoured exactly at every depth), and enters the average
// with its training error, like every point of a rung without free parameters.
func (pr *problem) leaveOneOut(rf *rungFit) {
	pr.lay = rf.lay
	k := rf.lay.size()
	nFree := pr.freePoints()
	switch {
	case k > 0 && nFree < 2:
		rf.rung.LOONote = "one free point: nothing is left to fit when it is left out"
		return
	case k > 0 && nFree-1 < k && len(rf.lay.coef) == 0:
		rf.rung.LOONote = fmt.Sprintf("%d free points for %d parameters: a fit without one of them is undetermined", nFree, k)
		return
	}
	var sum, worst float64
	n := 0
	one := make([]float64, len(pr.pts))
	for i := range pr.pts {
		if !pr.use[i] || pr.w[i] == 0 {
			continue
		}
		lab := pr.pts[i].Lab
		v := rf.vals[i]
		if k > 0 && pr.free(i) {
			pr.use[i] = false
			x, evals, err := pr.minimize(rf.x)
			rf.evals += evals
			var q Params
			if err == nil {
				q, err = pr.params(x)
			}
			if err == nil {
				err = pr.predict(q, one)
			}
			pr.use[i] = true
			if err != nil {
				rf.rung.LOONote = fmt.Sprintf("the fit without the point at %.6g psia failed: %v", pr.pts[i].Pressure, err)
				return
			}
			v = one[i]
		}
		re := 100 * math.Abs(v-lab) / lab
		if math.IsNaN(re) || math.IsInf(re, 0) {
			rf.rung.LOONote = fmt.Sprintf("the prediction at %.6g psia without that point is not finite", pr.pts[i].Pressure)
			return
		}
		sum += re
		worst = math.Max(worst, re)
		n++
	}
	if n == 0 {
		return
	}
	loo := sum / float64(n)
	rf.rung.LOO, rf.rung.LOOMax = &loo, &worst
}

// chooseRung returns the index of the default rung among the fitted ones (DESIGN.md §5): the
// smallest leave-one-out error, a deeper rung only when it wins by the margins above. For pb
// the anchor (multiplier rung) is the floor: it has no free parameter, so it cannot overfit,
// and it honours the report's Pb. A one-point multiplier (no leave-one-out error) replaces the
// published correlation: the measurement is honoured rather than a correlation preferred
// (common practice).
func chooseRung(prop PropertyID, fits []*rungFit) int {
	best := -1
	for i, rf := range fits {
		if rf == nil {
			continue
		}
		r := rf.rung
		if best < 0 {
			best = i
			continue
		}
		cur := fits[best].rung
		switch {
		case r.Depth == DepthMultiplier && (prop == Pb || r.LOO == nil) && cur.Depth == DepthPublished:
			best = i
		case r.LOO == nil || cur.LOO == nil:
		case *r.LOO <= (1-chooseRelMargin)*(*cur.LOO) && *cur.LOO-*r.LOO >= chooseAbsMargin:
			best = i
		}
	}
	return best
}

// multiplierFlags warns of a multiplier, bend or coefficient far from its published value or
// at its bound.
func multiplierFlags(prop PropertyID, q Params, l layout) []string {
	var fl []string
	name := "multiplier"
	if prop == Pb {
		name = "pressure scale"
	}
	m := q.Multiplier
	switch {
	case l.anchor && len(l.coef) > 0: // refitted coefficients move the scale with them
	case l.anchor:
		if m < FlagLowMult || m > FlagHighMult {
			fl = append(fl, fmt.Sprintf("the %s %.3f that honours the report's Pb is outside [%g, %g]: the family's bubble point is far from this oil's", name, m, FlagLowMult, FlagHighMult))
		}
	case !l.mult:
	case len(l.coef) > 0:
		// Beside refitted coefficients the multiplier trades against them: its distance
		// from 1 says nothing about the family, but a multiplier pinned at its bound says
		// the refit has moved far from the published correlation.
		if m <= MinMultiplier*1.001 || m >= MaxMultiplier*0.999 {
			fl = append(fl, fmt.Sprintf("%s %.3f is at its bound [%g, %g] beside the refitted coefficients: the refit is far from the published correlation", name, m, MinMultiplier, MaxMultiplier))
		}
	case m <= MinMultiplier*1.001 || m >= MaxMultiplier*0.999:
		fl = append(fl, fmt.Sprintf("%s %.3f is at its bound [%g, %g]: this family cannot describe the oil", name, m, MinMultiplier, MaxMultiplier))
	case m < FlagLowMult || m > FlagHighMult:
		fl = append(fl, fmt.Sprintf("%s %.3f is outside [%g, %g]: the family describes this oil poorly", name, m, FlagLowMult, FlagHighMult))
	}
	if l.exp {
		e := q.bend()
		if e <= MinMultiplier*1.001 || e >= MaxMultiplier*0.999 {
			fl = append(fl, fmt.Sprintf("bend exponent %.3f is at its bound [%g, %g]", e, MinMultiplier, MaxMultiplier))
		}
	}
	return fl
}

// noFitRemark says in words when the fitted values still miss the lab points: more than
// noFitAARE % on average over the free points, or more than noFitMax % at one.
func noFitRemark(prop PropertyID, family string, pts []Point, use func(int) bool, vals []float64) string {
	var sum, worst, wp float64
	n := 0
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, pt := range pts {
		if !use(i) {
			continue
		}
		re := 100 * math.Abs(vals[i]-pt.Lab) / pt.Lab
		sum += re
		n++
		if re > worst {
			worst, wp = re, pt.Pressure
		}
		lo, hi = math.Min(lo, pt.Pressure), math.Max(hi, pt.Pressure)
	}
	if n == 0 {
		return ""
	}
	aare := sum / float64(n)
	if aare <= noFitAARE && worst <= noFitMax {
		return ""
	}
	what := map[PropertyID]string{Pb: "Rs curve", Bo: "Bo curve", Co: "compressibility", MuDead: "dead-oil viscosity",
		MuSat: "saturated viscosity curve", MuUnder: "undersaturated viscosity", Z: "gas Z-factors"}[prop]
	s := fmt.Sprintf("%s does not follow this oil's %s within %g %% (%.1f %% on average, %.1f %% at %s psia)",
		family, what, noFitAARE, aare, worst, groupDigits(wp))
	if n > 1 && hi > lo {
		s += fmt.Sprintf("; between %s and %s psia the lab table itself is the better description", groupDigits(lo), groupDigits(hi))
	}
	return s
}

// groupDigits writes a pressure rounded to the psi with thousands separators: 2,620.
func groupDigits(p float64) string {
	s := fmt.Sprintf("%.0f", p)
	var b strings.Builder
	for i, r := range s {
		if i > 0 && (len(s)-i)%3 == 0 && s[i-1] != '-' {
			b.WriteByte(',')
		}
		b.WriteRune(r)
	}
	return b.String()
}
