package correlations

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// catalog is built once from the per-group entry lists and never modified.
var catalog = buildCatalog()

func buildCatalog() []Entry {
	var all []Entry
	all = append(all, oilEntries()...)
	all = append(all, viscosityEntries()...)
	all = append(all, gasEntries()...)
	all = append(all, waterEntries()...)
	return all
}

// Catalog returns every catalog entry, grouped by property. The slice is a copy.
func Catalog() []Entry {
	out := make([]Entry, len(catalog))
	copy(out, catalog)
	return out
}

// Lookup returns the catalog entry of a property and id.
func Lookup(p Property, id string) (Entry, error) {
	for _, e := range catalog {
		if e.Property == p && e.ID == id {
			return e, nil
		}
	}
	return Entry{}, fmt.Errorf("%w: no %s correlation %q", ErrUnknownID, p, id)
}

// IDs returns the ids of one property in catalog order.
func IDs(p Property) []string {
	var ids []string
	for _, e := range catalog {
		if e.Property == p {
			ids = append(ids, e.ID)
		}
	}
	return ids
}

// Side says on which side of an entry's data range an input lies.
type Side string

// Sides of a range.
const (
	Below Side = "below"
	Above Side = "above"
)

// OutOfRange is one input outside an entry's data range, as data, so that a caller can state
// it in units of its own. Value, Min and Max are in Unit, the catalog's (field) unit of the
// input.
type OutOfRange struct {
	Input   string  // the input's name, as in Range.Input: "temperature", "p", "API"
	Value   float64 // the value checked
	Min     float64 // smallest value in the original data
	Max     float64 // largest value in the original data
	Unit    string  // unit of Value, Min and Max: "°F", "psia", "" …
	Side    Side    // Below or Above
	Authors string  // the entry's authors, for the message
}

// String states the fact in words, for example "API 62 is above the 16–58 range of Glasø's
// data", in the units the value carries (no unit is written for °API).
func (o OutOfRange) String() string {
	unit := ""
	if o.Unit != "" && o.Unit != "°API" {
		unit = " " + o.Unit
	}
	return fmt.Sprintf("%s %s%s is %s the %s–%s range of %s data",
		o.Input, fmtNum(o.Value), unit, o.Side, fmtNum(o.Min), fmtNum(o.Max), possessive(o.Authors))
}

// CheckValues compares the named inputs with the entry's data ranges and returns one
// OutOfRange per input outside them, in the order of the entry's ranges. Inputs the entry
// has no range for, and names absent from values, are ignored.
func (e Entry) CheckValues(values map[string]float64) []OutOfRange {
	var out []OutOfRange
	for _, r := range e.Ranges {
		v, ok := values[r.Input]
		if !ok || math.IsNaN(v) {
			continue
		}
		var side Side
		switch {
		case v < r.Min:
			side = Below
		case v > r.Max:
			side = Above
		default:
			continue
		}
		out = append(out, OutOfRange{Input: r.Input, Value: v, Min: r.Min, Max: r.Max, Unit: r.Unit, Side: side, Authors: e.Authors})
	}
	return out
}

// Check is CheckValues in words, in the catalog's field units: one message per input outside
// the entry's data, for example "API 62 is above the 16–58 range of Glasø's data".
func (e Entry) Check(values map[string]float64) []string {
	var msgs []string
	for _, o := range e.CheckValues(values) {
		msgs = append(msgs, o.String())
	}
	return msgs
}

// possessive gives "Glasø's", "Vasquez and Beggs'".
func possessive(name string) string {
	if strings.HasSuffix(name, "s") {
		return name + "'"
	}
	return name + "'s"
}

func fmtNum(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }

func lookupFamily[F any](p Property, id string, fams []F, idOf func(F) string) (F, error) {
	for _, f := range fams {
		if idOf(f) == id {
			return f, nil
		}
	}
	var zero F
	return zero, fmt.Errorf("%w: no %s family %q (known: %v)", ErrUnknownID, p, id, IDs(p))
}

// SolutionGasFamilies returns every solution-gas family in catalog order.
func SolutionGasFamilies() []SolutionGasFamily {
	return append([]SolutionGasFamily(nil), solutionGasFamilies...)
}

// SolutionGasByID returns the solution-gas family with the given id.
func SolutionGasByID(id string) (SolutionGasFamily, error) {
	return lookupFamily(SolutionGas, id, solutionGasFamilies, func(f SolutionGasFamily) string { return f.ID })
}

// OilFVFFamilies returns every saturated-Bo family in catalog order.
func OilFVFFamilies() []OilFVFFamily { return append([]OilFVFFamily(nil), oilFVFFamilies...) }

// OilFVFByID returns the saturated-Bo family with the given id.
func OilFVFByID(id string) (OilFVFFamily, error) {
	return lookupFamily(OilFVF, id, oilFVFFamilies, func(f OilFVFFamily) string { return f.ID })
}

// CompressibilityFamilies returns every undersaturated-compressibility family.
func CompressibilityFamilies() []CompressibilityFamily {
	return append([]CompressibilityFamily(nil), compressibilityFamilies...)
}

// CompressibilityByID returns the undersaturated-compressibility family with the given id.
func CompressibilityByID(id string) (CompressibilityFamily, error) {
	return lookupFamily(Compressibility, id, compressibilityFamilies, func(f CompressibilityFamily) string { return f.ID })
}

// DeadViscosityFamilies returns every dead-oil viscosity family.
func DeadViscosityFamilies() []DeadViscosityFamily {
	return append([]DeadViscosityFamily(nil), deadViscosityFamilies...)
}

// DeadViscosityByID returns the dead-oil viscosity family with the given id.
func DeadViscosityByID(id string) (DeadViscosityFamily, error) {
	return lookupFamily(DeadViscosity, id, deadViscosityFamilies, func(f DeadViscosityFamily) string { return f.ID })
}

// SatViscosityFamilies returns every saturated-oil viscosity family.
func SatViscosityFamilies() []SatViscosityFamily {
	return append([]SatViscosityFamily(nil), satViscosityFamilies...)
}

// SatViscosityByID returns the saturated-oil viscosity family with the given id.
func SatViscosityByID(id string) (SatViscosityFamily, error) {
	return lookupFamily(SatViscosity, id, satViscosityFamilies, func(f SatViscosityFamily) string { return f.ID })
}

// UnderViscosityFamilies returns every undersaturated-oil viscosity family.
func UnderViscosityFamilies() []UnderViscosityFamily {
	return append([]UnderViscosityFamily(nil), underViscosityFamilies...)
}

// UnderViscosityByID returns the undersaturated-oil viscosity family with the given id.
func UnderViscosityByID(id string) (UnderViscosityFamily, error) {
	return lookupFamily(UnderViscosity, id, underViscosityFamilies, func(f UnderViscosityFamily) string { return f.ID })
}

// PseudoCriticalFamilies returns every gas pseudo-critical family.
func PseudoCriticalFamilies() []PseudoCriticalFamily {
	return append([]PseudoCriticalFamily(nil), pseudoCriticalFamilies...)
}

// PseudoCriticalByID returns the pseudo-critical family with the given id.
func PseudoCriticalByID(id string) (PseudoCriticalFamily, error) {
	return lookupFamily(PseudoCritical, id, pseudoCriticalFamilies, func(f PseudoCriticalFamily) string { return f.ID })
}

// ZFamilies returns every Z-factor family.
func ZFamilies() []ZFamily { return append([]ZFamily(nil), zFamilies...) }

// ZByID returns the Z-factor family with the given id.
func ZByID(id string) (ZFamily, error) {
	return lookupFamily(GasZ, id, zFamilies, func(f ZFamily) string { return f.ID })
}
