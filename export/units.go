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

func (u Units) set() lab.UnitSet {
	if u == Metric {
		return lab.MetricUnits()
	}
	return lab.FieldUnits()
}

// converter turns field values into the units of a unit set and keeps the first error.
type converter struct {
	units lab.UnitSet
	err   error
}

func (c *converter) unit(q lab.Quantity) string { return c.units.Unit(q) }

func (c *converter) to(q lab.Quantity, v float64) float64 {
	out, err := lab.FromField(q, c.units.Unit(q), v)
	if err != nil && c.err == nil {
		c.err = err
	}
	return out
}

// num formats a number with d significant digits, the shortest way ("0.62", "1.2345e-05").
func num(v float64, d int) string { return strconv.FormatFloat(v, 'g', d, 64) }
