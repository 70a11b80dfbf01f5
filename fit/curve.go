package fit

import (
	"fmt"
	"math"
	"sort"
)

// Curve evaluates one family of one property with parameters q at the pressures ps (psia),
// for plotting a published or tuned curve over the whole pressure range. The context that a
// property needs at a pressure comes from the lab points: Rs for bo and mu_sat, the gas
// gravity for z, interpolated linearly in pressure between the points and held beyond them.
// pb gives Rs(p) (Rsb above the bubble point); co the average compressibility from the CCE's
// Psat (pressures at or below it give NaN, as do pressures where the family fails, so that a
// plot leaves a gap); mu_dead is a constant; mu_under starts at Pb.
func Curve(ds *Dataset, prop PropertyID, family string, q Params, opts Options, ps []float64) ([]float64, error) {
	muDead, muB := 0.0, 0.0
	if prop == MuSat || prop == MuUnder {
		var err error
		if muDead, muB, err = ds.chainInputs(nil, nil); err != nil {
			return nil, fmt.Errorf("fit: %s: %w", prop, err)
		}
	}
	m, err := newModel(ds, prop, family, opts, muDead, muB)
	if err != nil {
		return nil, err
	}
	lab := ds.Points[prop]
	out := make([]float64, len(ps))
	one := make([]Point, 1)
	val := make([]float64, 1)
	a, b := make([]float64, 1), make([]float64, 1)
	for i, p := range ps {
		out[i] = math.NaN()
		pt := Point{Quantity: curveQuantity(prop), Pressure: p}
		switch prop {
		case Pb:
			if p >= ds.Pb {
				out[i] = ds.Rsb
				continue
			}
		case Bo, MuSat:
			pt.Rs = interpAt(lab, p, func(x Point) float64 { return x.Rs })
		case Co:
			if p <= ds.CCEPsat {
				continue
			}
		case MuUnder:
			if p < ds.Pb {
				continue
			}
		case Z:
			pt.GasGravity = interpAt(lab, p, func(x Point) float64 { return x.GasGravity })
			if !(pt.GasGravity > 0) {
				pt.GasGravity = ds.Oil.GasGravity
			}
		}
		one[0] = pt
		switch m := m.(type) {
		case nonlinear:
			if m.predict(q, one, val) != nil {
				continue
			}
			out[i] = val[0]
		case affine:
			if m.basis(q.Coefficients, one, a, b) != nil {
				continue
			}
			out[i] = a[0] + q.Multiplier*b[0] + q.Shift
		}
		if math.IsInf(out[i], 0) {
			out[i] = math.NaN()
		}
	}
	return out, nil
}

func curveQuantity(prop PropertyID) string {
	if prop == Pb {
		return "Rs"
	}
	return string(prop)
}

// interpAt interpolates a per-point value linearly in pressure between the points, holding the
// end values beyond them; 0 when there are no points.
func interpAt(pts []Point, p float64, f func(Point) float64) float64 {
	var xs []Point
	for _, pt := range pts {
		if pt.Quantity != "Pb" || f(pt) > 0 {
			xs = append(xs, pt)
		}
	}
	if len(xs) == 0 {
		return 0
	}
	sort.Slice(xs, func(i, j int) bool { return xs[i].Pressure < xs[j].Pressure })
	if p <= xs[0].Pressure {
		return f(xs[0])
	}
	for k := 1; k < len(xs); k++ {
		if p <= xs[k].Pressure {
			x0, x1 := xs[k-1], xs[k]
			if x1.Pressure == x0.Pressure {
				return f(x1)
			}
			t := (p - x0.Pressure) / (x1.Pressure - x0.Pressure)
			return f(x0) + t*(f(x1)-f(x0))
		}
	}
	return f(xs[len(xs)-1])
}
