package export

import (
	"fmt"
	"strconv"

	"labmatch/lab"
)

// Units is the unit system of a table file or deck.
type Units string

// Unit systems.
const (
	Field  Units = "field"  // psia, scf/STB, rb/STB, rcf/scf, cP, lbm/ft³, 1/psi (deck: FIELD)
	Metric Units = "metric" // bara, sm³/sm³, m³/sm³, mPa·s, kg/m³, 1/bar (deck: METRIC)
)

// ParseUnits reads "field" or "metric".
func ParseUnits(s string) (Units, error) {
	switch Units(s) {
	case Field, Metric:
		return Units(s), nil
	}
	return "", fmt.Errorf("export: units %q: want field or metric", s)
}

// UnitSet returns the units of each quantity in u: lab.MetricUnits or lab.FieldUnits.
func (u Units) UnitSet() lab.UnitSet { return u.set() }

func (u Units) set() lab.UnitSet {
	if u == Metric {
		return lab.MetricUnits()
	}
	return lab.FieldUnits()
}

// converter turns field values into the units of a unit set and keeps the first error. The
// conversions are affine; their coefficients are looked up once per quantity.
type converter struct {
	units lab.UnitSet
	err   error
	coef  map[lab.Quantity][2]float64
}

func (c *converter) unit(q lab.Quantity) string { return c.units.Unit(q) }

func (c *converter) to(q lab.Quantity, v float64) float64 {
	k, ok := c.coef[q]
	if !ok {
		a, err := lab.FromField(q, c.units.Unit(q), 0)
		b, err1 := lab.FromField(q, c.units.Unit(q), 1)
		if err == nil {
			err = err1
		}
		if err != nil && c.err == nil {
			c.err = err
		}
		k = [2]float64{a, b - a}
		if c.coef == nil {
			c.coef = map[lab.Quantity][2]float64{}
		}
		c.coef[q] = k
	}
	if k[1] == 1 && k[0] == 0 {
		return v
	}
	return k[0] + k[1]*v
}

// num formats a number with d significant digits, the shortest way ("0.62", "1.2345e-05").
func num(v float64, d int) string { return strconv.FormatFloat(v, 'g', d, 64) }
