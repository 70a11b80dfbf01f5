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

// Check compares the named inputs with the entry's data ranges and returns one message per
// input outside them, for example "API 62 is above the 16–58 range of Glasø's data".
// Inputs the entry has no range for, and names absent from values, are ignored.
func (e Entry) Check(values map[string]float64) []string {
	var msgs []string
	for _, r := range e.Ranges {
		v, ok := values[r.Input]
		if !ok || math.IsNaN(v) {
			continue
		}
		var side string
		switch {
		case v < r.Min:
			side = "below"
		case v > r.Max:
			side = "above"
		default:
			continue
		}
		unit := ""
		if r.Unit != "" && r.Unit != "°API" {
			unit = " " + r.Unit
		}
		msgs = append(msgs, fmt.Sprintf("%s %s%s is %s the %s–%s range of %s data",
			r.Input, fmtNum(v), unit, side, fmtNum(r.Min), fmtNum(r.Max), possessive(e.Authors)))
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
