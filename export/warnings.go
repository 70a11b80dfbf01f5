package export

import (
	"fmt"

	"labmatch/correlations"
	"labmatch/fit"
	"labmatch/lab"
)

// Warning is one input of a table or report outside the data of a family used: the catalog's
// facts in field units, stated in the units of the file that quotes them (Text).
type Warning struct {
	Property string // the property, as in files: "co", "mu_dead", "bw"
	Family   string // the family's id: "petrosky-farshad"
	correlations.OutOfRange
}

// Text states the warning in the units of u, for example (metric) "mu_dead (egbogah-ng):
// temperature 104.4 degC is above the 15–80 range of Egbogah and Ng's data". In field
// units it is the catalog's own text (correlations.Entry.Check).
func (w Warning) Text(u Units) string {
	return w.text(&converter{units: u.set()})
}

func (w Warning) text(c *converter) string {
	return fmt.Sprintf("%s (%s): %s", w.Property, w.Family, w.fact(c, (*converter).unit))
}

// fact is the out-of-range fact alone, in the converter's units, each named by unitName.
func (w Warning) fact(c *converter, unitName func(*converter, lab.Quantity) string) string {
	o := w.OutOfRange
	if q, ok := catalogQuantity(o.Unit); ok && c.unit(q) != q.FieldUnit() {
		o.Value, o.Min, o.Max, o.Unit = c.to(q, o.Value), c.to(q, o.Min), c.to(q, o.Max), unitName(c, q)
	}
	return o.String()
}

// catalogQuantity is the quantity of a unit of the catalog's ranges ("°F", "psia", "scf/STB",
// "cP"); false for units that no unit system changes (°API, wt %, g/L, none).
func catalogQuantity(unit string) (lab.Quantity, bool) {
	if unit == "" {
		return 0, false
	}
	for _, q := range []lab.Quantity{lab.Pressure, lab.Temperature, lab.GOR, lab.FVF, lab.GasFVF, lab.Viscosity, lab.Density, lab.Compressibility} {
		if u, err := lab.CanonicalUnit(q, unit); err == nil && u == q.FieldUnit() {
			return q, true
		}
	}
	return 0, false
}

// warningTexts states warnings in the converter's units.
func warningTexts(ws []Warning, c *converter) []string {
	var out []string
	for _, w := range ws {
		out = append(out, w.text(c))
	}
	return out
}

// ModelWarnings lists, for every family of the model, the inputs outside the range of the
// family's original data: fit.Model.RangeWarnings as data, on the same inputs
// (TestModelWarningsMatchFit keeps the two in step).
func ModelWarnings(m *fit.Model) []Warning {
	in := m.RangeInputs()
	var ws []Warning
	for _, p := range fit.Properties {
		fam := m.Families[p]
		e, err := fit.CatalogEntry(p, fam)
		if err != nil {
			continue
		}
		for _, o := range e.CheckValues(in) {
			ws = append(ws, Warning{Property: string(p), Family: fam, OutOfRange: o})
		}
	}
	return ws
}

// DatasetWarnings is ModelWarnings for one family of a property on a dataset (the report's
// Pb and Rsb): fit.RankEntry.OutOfRange as data.
func DatasetWarnings(ds *fit.Dataset, p fit.PropertyID, family string) []Warning {
	in := ds.RangeInputs()
	e, err := fit.CatalogEntry(p, family)
	if err != nil {
		return nil
	}
	var ws []Warning
	for _, o := range e.CheckValues(in) {
		ws = append(ws, Warning{Property: string(p), Family: family, OutOfRange: o})
	}
	return ws
}

// waterWarnings checks the water correlations' data ranges at the table's conditions: the
// reference pressure of PVTW, and for Bw (evaluated on every row) the table's highest pressure.
func waterWarnings(w Water, tF, pmax float64) []Warning {
	in := map[string]float64{"temperature": tF, "p": w.RefPressure, "salinity": w.Salinity, "salt concentration": w.Concentration}
	var ws []Warning
	for _, p := range []correlations.Property{correlations.WaterFVF, correlations.WaterCompressibility, correlations.WaterViscosity, correlations.WaterDensity} {
		for _, id := range correlations.IDs(p) {
			e, err := correlations.Lookup(p, id)
			if err != nil {
				continue
			}
			for _, o := range e.CheckValues(in) {
				ws = append(ws, Warning{Property: string(p), Family: id, OutOfRange: o})
			}
			if p != correlations.WaterFVF {
				continue
			}
			for _, o := range e.CheckValues(map[string]float64{"p": pmax}) {
				if o.Side == correlations.Above && pmax > w.RefPressure {
					o.Input = "the table's highest pressure"
					ws = append(ws, Warning{Property: string(p), Family: id, OutOfRange: o})
				}
			}
		}
	}
	return ws
}
