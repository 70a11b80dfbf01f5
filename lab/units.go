package lab

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
)

// Quantity is a kind of physical quantity; it decides which units a value may carry.
// Internally every quantity is held in its field unit (Quantity.FieldUnit).
type Quantity int

// Quantities known to the reader, the writer and the command line.
const (
	Dimensionless   Quantity = iota // ratios, gravities (air = 1, water = 1), Z: "", "-", "fraction"
	Pressure                        // psia
	Temperature                     // °F
	GOR                             // gas–oil ratio, scf/STB
	FVF                             // oil formation volume factor, relative volume: rb/STB
	GasFVF                          // gas formation volume factor, rcf/scf
	Viscosity                       // cP
	Density                         // lbm/ft³
	Compressibility                 // 1/psi
	MolePercent                     // mol%
	APIGravity                      // °API; a bare number is accepted
	numQuantities
)

var quantityNames = [numQuantities]string{
	"dimensionless", "pressure", "temperature", "GOR", "FVF", "gas FVF", "viscosity",
	"density", "compressibility", "mole percent", "API gravity",
}

// String returns the name of the quantity, as used in messages.
func (q Quantity) String() string {
	if q < 0 || q >= numQuantities {
		return "Quantity(" + strconv.Itoa(int(q)) + ")"
	}
	return quantityNames[q]
}

// FieldUnit returns the unit in which the quantity is held internally.
func (q Quantity) FieldUnit() string {
	if q < 0 || q >= numQuantities {
		return ""
	}
	return unitTable[q][0].name
}

// Units returns the canonical names of the accepted units of q, field unit first.
func (q Quantity) Units() []string {
	if q < 0 || q >= numQuantities {
		return nil
	}
	var out []string
	for _, u := range unitTable[q] {
		out = append(out, u.name)
	}
	return out
}

// needsUnit reports whether a value of q must state its unit (in a header or fluid.csv).
func (q Quantity) needsUnit() bool {
	_, ok := lookupUnit(q, "")
	return !ok
}

// Conversion factors. Each is exact or taken from the named source; compound factors are
// derived from these so that they stay mutually consistent.
const (
	// paPerPsi: 1 psi = 6894.757293168 Pa. NIST SP 811 (2008), App. B.8, lists
	// 6.894 757 E+03; the digits follow exactly from 1 lbf = 4.4482216152605 N and
	// 1 in = 0.0254 m.
	paPerPsi = 6894.757293168
	// paPerBar: 1 bar = 1e5 Pa exactly (NIST SP 811, App. B.8).
	paPerBar = 1e5
	// Gauge bases: one standard atmosphere, 14.696 psi or 1.01325 bar (= 101.325 kPa).
	// Common practice: gauge pressures in lab reports are read against a standard
	// atmosphere, not the barometer of the day; DESIGN.md §3.
	atmPsi = 14.696
	atmBar = 1.01325
	// m3PerBbl: 1 bbl = 42 US gal × 231 in³/gal × (0.0254 m/in)³ = 0.158987294928 m³,
	// exact by definition (NIST SP 811, App. B.8).
	m3PerBbl = 0.158987294928
	// m3PerFt3: 1 ft³ = (0.3048 m)³ = 0.028316846592 m³, exact.
	m3PerFt3 = 0.028316846592
	// ft3PerBbl = 5.6145833… ft³/bbl (9702/1728 exactly); often rounded to 5.614583.
	ft3PerBbl = m3PerBbl / m3PerFt3
	// kgPerLbm: 1 lbm = 0.45359237 kg, exact by definition.
	kgPerLbm = 0.45359237
	// kgm3PerLbmft3 = 16.01846337… kg/m³ per lbm/ft³ (NIST SP 811, App. B.8: 1.601 846 E+01).
	kgm3PerLbmft3 = kgPerLbm / m3PerFt3
	// degFPerK: a kelvin is 1.8 °F (°R) wide; °F = 1.8·K − 459.67 and °F = 1.8·°C + 32,
	// exact by definition (NIST SP 811, App. B.9).
	degFPerK = 1.8
)

// unitDef is one accepted unit: field = v·scale + offset.
type unitDef struct {
	name    string   // canonical spelling, written by WriteFolder
	aliases []string // further accepted spellings, in normalised form (see normUnit)
	scale   float64
	offset  float64
	gauge   bool // a gauge pressure unit
}

// unitTable lists the accepted units of each quantity, field unit first. Read-only.
//
// GOR and gas FVF in metric units: 1 sm³/sm³ = 5.614583 scf/STB treats the metric standard
// state (15 °C, 101.325 kPa) and the field standard state (60 °F, 14.696 psia) as the same
// gas state, as is common practice; the true volume ratio of the two states differs by
// about 0.2 %, below the precision of lab GOR measurements.
var unitTable = [numQuantities][]unitDef{
	Dimensionless: {
		{name: "", aliases: []string{"-", "fraction", "frac", "dimensionless", "air=1", "water=1"}, scale: 1},
	},
	Pressure: {
		{name: "psia", aliases: []string{"psi(a)", "lbf/in2a"}, scale: 1},
		{name: "psig", aliases: []string{"psi(g)"}, scale: 1, offset: atmPsi, gauge: true},
		{name: "bara", aliases: []string{"bar", "bar(a)"}, scale: paPerBar / paPerPsi},
		{name: "barg", aliases: []string{"bar(g)"}, scale: paPerBar / paPerPsi, offset: atmBar * paPerBar / paPerPsi, gauge: true},
		{name: "kPa", aliases: []string{"kpaa", "kpa(a)"}, scale: 1e3 / paPerPsi},
		{name: "kPag", aliases: []string{"kpa(g)"}, scale: 1e3 / paPerPsi, offset: atmBar * 100 * 1e3 / paPerPsi, gauge: true},
		{name: "MPa", aliases: []string{"mpaa", "mpa(a)"}, scale: 1e6 / paPerPsi},
		{name: "MPag", aliases: []string{"mpa(g)"}, scale: 1e6 / paPerPsi, offset: atmBar / 10 * 1e6 / paPerPsi, gauge: true},
	},
	Temperature: {
		{name: "degF", aliases: []string{"°f", "f", "fahrenheit", "deg.f"}, scale: 1},
		{name: "degC", aliases: []string{"°c", "c", "celsius", "deg.c"}, scale: degFPerK, offset: 32},
		{name: "K", aliases: []string{"kelvin"}, scale: degFPerK, offset: -459.67},
	},
	GOR: {
		{name: "scf/STB", aliases: []string{"scf/bbl", "ft3/bbl"}, scale: 1},
		{name: "sm3/sm3", aliases: []string{"m3/m3", "sm3/stm3"}, scale: ft3PerBbl},
	},
	FVF: {
		{name: "rb/STB", aliases: []string{"bbl/stb", "rbbl/stb", "bbl/bbl", "rb/bbl", "vol/vol", "v/v"}, scale: 1},
		{name: "m3/sm3", aliases: []string{"rm3/sm3", "m3/m3", "rm3/stm3"}, scale: 1},
	},
	GasFVF: {
		{name: "rcf/scf", aliases: []string{"ft3/scf", "cf/scf", "rft3/scf"}, scale: 1},
		{name: "rb/Mscf", aliases: []string{"bbl/mscf"}, scale: ft3PerBbl / 1000},
		{name: "rb/scf", aliases: []string{"bbl/scf"}, scale: ft3PerBbl},
		{name: "m3/sm3", aliases: []string{"rm3/sm3", "m3/m3"}, scale: 1},
	},
	Viscosity: {
		{name: "cP", aliases: []string{"mpa.s", "mpas", "centipoise", "cps"}, scale: 1},
		{name: "Pa.s", aliases: []string{"pas"}, scale: 1000},
	},
	Density: {
		{name: "lbm/ft3", aliases: []string{"lb/ft3", "lbm/cf", "lb/cf"}, scale: 1},
		{name: "g/cm3", aliases: []string{"g/cc", "g/ml", "gm/cc"}, scale: 1000 / kgm3PerLbmft3},
		{name: "kg/m3", scale: 1 / kgm3PerLbmft3},
	},
	Compressibility: {
		{name: "1/psi", aliases: []string{"1/psia", "psi-1", "psi^-1", "/psi"}, scale: 1},
		{name: "1/bar", aliases: []string{"bar-1", "bar^-1", "/bar"}, scale: paPerPsi / paPerBar},
		{name: "1/kPa", aliases: []string{"kpa-1", "kpa^-1", "/kpa"}, scale: paPerPsi / 1e3},
		{name: "1/MPa", aliases: []string{"mpa-1", "mpa^-1", "/mpa"}, scale: paPerPsi / 1e6},
	},
	MolePercent: {
		{name: "mol%", aliases: []string{"%", "mole%", "mol-%", "molepercent"}, scale: 1},
	},
	APIGravity: {
		{name: "API", aliases: []string{"°api", "degapi", ""}, scale: 1},
	},
}

// normUnit folds a unit spelling for comparison: lower case, no spaces, "·" → ".",
// "³" → "3", "º" → "°".
func normUnit(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case unicode.IsSpace(r):
			continue
		case r == '·' || r == '⋅':
			r = '.'
		case r == '³':
			r = '3'
		case r == 'º':
			r = '°'
		case r == '−':
			r = '-'
		}
		b.WriteRune(unicode.ToLower(r))
	}
	return b.String()
}

func lookupUnit(q Quantity, unit string) (unitDef, bool) {
	if q < 0 || q >= numQuantities {
		return unitDef{}, false
	}
	n := normUnit(unit)
	for _, u := range unitTable[q] {
		if normUnit(u.name) == n {
			return u, true
		}
		for _, a := range u.aliases {
			if a == n {
				return u, true
			}
		}
	}
	return unitDef{}, false
}

// unitError explains why unit is not a unit of q, with a hint for common slips.
func unitError(q Quantity, unit string) *ParseError {
	e := &ParseError{Err: ErrUnknownUnit}
	if strings.TrimSpace(unit) == "" {
		e.Err = ErrMissingUnit
		e.Msg = fmt.Sprintf("a %s needs a unit (accepted: %s)", q, acceptedUnits(q))
		return e
	}
	e.Msg = fmt.Sprintf("%q is not a %s unit (accepted: %s)", unit, q, acceptedUnits(q))
	n := normUnit(unit)
	switch {
	case q == Pressure && (n == "psi" || n == "lbf/in2"):
		e.Msg = fmt.Sprintf("%q does not say absolute or gauge (accepted: %s)", unit, acceptedUnits(q))
		e.Hint = "a bare psi does not say absolute or gauge: write psia or psig"
	default:
		for o := Quantity(0); o < numQuantities; o++ {
			if o == q || o == APIGravity || o == Dimensionless {
				continue
			}
			if _, ok := lookupUnit(o, unit); ok {
				e.Hint = fmt.Sprintf("%s is a %s unit; this value is a %s", unit, o, q)
				break
			}
		}
	}
	return e
}

func acceptedUnits(q Quantity) string {
	var names []string
	for _, u := range q.Units() {
		if u == "" {
			u = `"" (none)`
		}
		names = append(names, u)
	}
	return strings.Join(names, ", ")
}

// ToField converts v from unit to the field unit of q (psia, °F, scf/STB, rb/STB, rcf/scf,
// cP, lbm/ft³, 1/psi, mol%, °API). Unit names are case-insensitive and spaces are ignored.
// An unknown unit gives a *ParseError wrapping ErrUnknownUnit (ErrMissingUnit when unit
// is empty and q has units).
func ToField(q Quantity, unit string, v float64) (float64, error) {
	u, ok := lookupUnit(q, unit)
	if !ok {
		return 0, unitError(q, unit)
	}
	return u.scale*v + u.offset, nil
}

// FromField converts v from the field unit of q to unit; it is the inverse of ToField.
func FromField(q Quantity, unit string, v float64) (float64, error) {
	u, ok := lookupUnit(q, unit)
	if !ok {
		return 0, unitError(q, unit)
	}
	return (v - u.offset) / u.scale, nil
}

// CanonicalUnit returns the canonical spelling of unit for q ("PSIA" → "psia",
// "mPa·s" → "cP"), or the error ToField would give.
func CanonicalUnit(q Quantity, unit string) (string, error) {
	u, ok := lookupUnit(q, unit)
	if !ok {
		return "", unitError(q, unit)
	}
	return u.name, nil
}

// maxValueLen bounds the text ParseValue accepts; a flag value is short.
const maxValueLen = 64

// ParseValue reads a number with an optional unit suffix, such as "2000psia",
// "2000 psia", "150bar", "93degC" or "107sm3/sm3", and returns it in the field unit of q.
// A plain number is taken to be in the field unit already. Errors are *ParseError values
// wrapping ErrNumber, ErrNotFinite, ErrUnknownUnit or ErrRange (an absolute pressure ≤ 0).
func ParseValue(q Quantity, s string) (float64, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, &ParseError{Err: ErrNumber, Msg: "empty value; expected a number such as " + example(q)}
	}
	if len(s) > maxValueLen {
		return 0, &ParseError{Err: ErrNumber, Msg: fmt.Sprintf("value of %d characters is too long for a number", len(s))}
	}
	// The longest prefix that parses as a number is the number; the rest is the unit.
	end := 0
	var v float64
	for i := len(s); i > 0; i-- {
		if x, err := strconv.ParseFloat(s[:i], 64); err == nil || isRangeErr(err) {
			v, end = x, i
			break
		}
	}
	if end == 0 {
		return 0, &ParseError{Err: ErrNumber, Msg: fmt.Sprintf("%q is not a number; expected a number such as %s", s, example(q))}
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, &ParseError{Err: ErrNotFinite, Msg: fmt.Sprintf("%q is not a finite number", s[:end])}
	}
	unit := strings.TrimSpace(s[end:])
	u := unitTable[q][0]
	if unit != "" {
		var ok bool
		if u, ok = lookupUnit(q, unit); !ok {
			return 0, unitError(q, unit)
		}
	}
	f := u.scale*v + u.offset
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return 0, &ParseError{Err: ErrNotFinite, Msg: fmt.Sprintf("%q is too large", s)}
	}
	if q == Pressure && f <= 0 {
		pe := &ParseError{Err: ErrRange, Msg: fmt.Sprintf("%q is %s psia; an absolute pressure must be above 0", s, fmtNum(f))}
		if u.gauge {
			pe.Hint = "a gauge pressure is measured from one atmosphere (14.696 psia); was it an absolute pressure?"
		}
		return 0, pe
	}
	return f, nil
}

func isRangeErr(err error) bool {
	ne, ok := err.(*strconv.NumError)
	return ok && ne.Err == strconv.ErrRange
}

func example(q Quantity) string {
	switch q {
	case Pressure:
		return "2000psia or 150bara"
	case Temperature:
		return "200degF or 93degC"
	case GOR:
		return "600scf/STB or 107sm3/sm3"
	}
	if q >= 0 && q < numQuantities && unitTable[q][0].name != "" {
		return "1.2" + unitTable[q][0].name
	}
	return "0.8"
}

// fmtNum formats a number the shortest way that reads back exactly.
func fmtNum(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// APIToSG returns the specific gravity (water = 1, both at 60 °F) of an oil of gravity api
// °API: γo = 141.5/(131.5 + API), the definition of API gravity (API Manual of Petroleum
// Measurement Standards, ch. 11.1; common practice). api must be finite and above −131.5,
// else the error wraps ErrRange.
func APIToSG(api float64) (float64, error) {
	if !(api > -131.5) || math.IsInf(api, 0) {
		return 0, &ParseError{Err: ErrRange, Msg: fmt.Sprintf("API gravity %s is outside the definition (above -131.5)", fmtNum(api))}
	}
	return 141.5 / (131.5 + api), nil
}

// SGToAPI returns the gravity in °API of an oil of specific gravity sg (water = 1, 60 °F):
// API = 141.5/γo − 131.5, the inverse of APIToSG. sg must be positive and finite, else the
// error wraps ErrRange.
func SGToAPI(sg float64) (float64, error) {
	api := 141.5/sg - 131.5
	if !(sg > 0) || math.IsInf(api, 0) || math.IsInf(sg, 0) {
		return 0, &ParseError{Err: ErrRange, Msg: fmt.Sprintf("specific gravity %s must be positive and finite", fmtNum(sg))}
	}
	return api, nil
}
