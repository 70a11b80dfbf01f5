package lab

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// Tolerances. Each reflects the number of digits its source prints.
const (
	tolExact   = 1e-12 // exact definitions, to float64 rounding
	tolNIST7   = 1e-6  // NIST SP 811 factors printed to 7 significant digits
	tolRound   = 1e-12 // ToField∘FromField round trips
	tolAPI2dec = 0.005 // °API printed to 2 decimals
)

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// TestFactorsAgainstSources checks each conversion against the figure its source prints.
func TestFactorsAgainstSources(t *testing.T) {
	tests := []struct {
		name  string
		q     Quantity
		unit  string
		in    float64 // in unit
		field float64 // expected, field unit
		tol   float64
		src   string
	}{
		// NIST SP 811 (2008) App. B.8: pound-force per square inch → Pa, 6.894 757 E+03.
		{"psi in kPa", Pressure, "kPa", 6.894757, 1, tolNIST7, "NIST SP 811 B.8"},
		{"psi in MPa", Pressure, "MPa", 6.894757e-3, 1, tolNIST7, "NIST SP 811 B.8"},
		// NIST SP 811 App. B.8: bar → Pa 1.0 E+05 (exact) and psi → Pa 6.894 757 E+03:
		// 1 bar = 14.50377 psi.
		{"bar in psi", Pressure, "bara", 1, 14.50377, tolNIST7, "NIST SP 811 B.8"},
		{"bare bar is absolute", Pressure, "bar", 1, 14.50377, tolNIST7, "NIST SP 811 B.8"},
		// Gauge base one standard atmosphere: 14.696 psia, or 1.01325 bar
		// (NIST SP 811 B.8: standard atmosphere → Pa 1.013 25 E+05, exact) = 14.69595 psia.
		{"0 psig", Pressure, "psig", 0, 14.696, tolExact, "check-values.md standard conditions; common practice"},
		{"100 psig", Pressure, "psig", 100, 114.696, tolExact, "common practice"},
		{"0 barg", Pressure, "barg", 0, 14.69595, tolNIST7, "NIST SP 811 B.8 standard atmosphere"},
		{"0 kPag", Pressure, "kPag", 0, 14.69595, tolNIST7, "NIST SP 811 B.8 standard atmosphere"},
		{"101.325 kPa", Pressure, "kPa", 101.325, 14.69595, tolNIST7, "NIST SP 811 B.8 standard atmosphere"},
		// NIST SP 811 App. B.9: t/°F = 1.8·t/°C + 32, T/K = (t/°F + 459.67)/1.8; exact.
		{"water boils", Temperature, "degC", 100, 212, tolExact, "NIST SP 811 B.9"},
		{"water freezes", Temperature, "°C", 0, 32, tolExact, "NIST SP 811 B.9"},
		{"-40 is -40", Temperature, "C", -40, -40, tolExact, "NIST SP 811 B.9"},
		{"ice point in K", Temperature, "K", 273.15, 32, tolExact, "NIST SP 811 B.9"},
		{"absolute zero", Temperature, "K", 0, -459.67, tolExact, "NIST SP 811 B.9"},
		{"°F is °F", Temperature, "°F", 220, 220, tolExact, "identity"},
		// 1 bbl = 5.614583 ft³ (check-values.md: common practice, exact by definition), so
		// 1 m³/m³ of gas per oil = 5.614583 scf/STB (standard states taken as equal).
		{"sm3/sm3", GOR, "sm3/sm3", 1, 5.614583, 1e-7, "check-values.md barrel"},
		{"m3/m3", GOR, "m3/m3", 100, 561.4583, 1e-7, "check-values.md barrel"},
		{"rb/Mscf", GasFVF, "rb/Mscf", 1000, 5.614583, 1e-7, "check-values.md barrel"},
		{"rb/scf", GasFVF, "rb/scf", 1, 5.614583, 1e-7, "check-values.md barrel"},
		{"m3/sm3 gas", GasFVF, "m3/sm3", 0.005, 0.005, tolExact, "volume ratio, unit-free"},
		{"m3/sm3 oil", FVF, "m3/sm3", 1.3, 1.3, tolExact, "volume ratio, unit-free"},
		// NIST SP 811 App. B.8: centipoise → Pa·s 1.0 E-03 (exact), so 1 cP = 1 mPa·s.
		{"mPa·s", Viscosity, "mPa·s", 0.85, 0.85, tolExact, "NIST SP 811 B.8"},
		{"mPa.s", Viscosity, "mPa.s", 0.85, 0.85, tolExact, "NIST SP 811 B.8"},
		{"Pa.s", Viscosity, "Pa.s", 0.001, 1, tolExact, "NIST SP 811 B.8"},
		// NIST SP 811 App. B.8: pound per cubic foot → kg/m³ 1.601 846 E+01.
		{"lbm/ft3 in kg/m3", Density, "kg/m3", 16.01846, 1, tolNIST7, "NIST SP 811 B.8"},
		{"g/cm3", Density, "g/cm3", 1, 62.42796, tolNIST7, "NIST SP 811 B.8 (1000/16.01846)"},
		// Compressibility is per pressure: 1/bar = (1/14.50377) 1/psi.
		{"1/bar", Compressibility, "1/bar", 14.50377e-6, 1e-6, tolNIST7, "NIST SP 811 B.8"},
		{"1/kPa", Compressibility, "1/kPa", 1, 6.894757, tolNIST7, "NIST SP 811 B.8"},
		{"1/MPa", Compressibility, "1/MPa", 1, 6.894757e-3, tolNIST7, "NIST SP 811 B.8"},
		{"mol%", MolePercent, "%", 2.5, 2.5, tolExact, "identity"},
		{"fraction", Dimensionless, "fraction", 0.8, 0.8, tolExact, "identity"},
	}
	for _, tc := range tests {
		got, err := ToField(tc.q, tc.unit, tc.in)
		if err != nil {
			t.Errorf("%s: ToField(%v, %q, %g): %v", tc.name, tc.q, tc.unit, tc.in, err)
			continue
		}
		if e := relErr(got, tc.field); e > tc.tol {
			t.Errorf("%s: ToField(%v, %q, %g) = %.10g, want %.10g (%s), rel err %.2g > %.2g",
				tc.name, tc.q, tc.unit, tc.in, got, tc.field, tc.src, e, tc.tol)
		}
	}
}

// TestExactDefinitions checks the exact constants against their definitions.
func TestExactDefinitions(t *testing.T) {
	const in = 0.0254 // m, exact (NIST SP 811 B.8, inch)
	// 1 bbl = 42 US gal, 1 US gal = 231 in³ (NIST SP 811 B.8, barrel for petroleum).
	if bbl := 42 * 231 * in * in * in; relErr(m3PerBbl, bbl) > tolExact {
		t.Errorf("m3PerBbl = %.15g, want 42·231·0.0254³ = %.15g", m3PerBbl, bbl)
	}
	if ft3 := math.Pow(12*in, 3); relErr(m3PerFt3, ft3) > tolExact {
		t.Errorf("m3PerFt3 = %.15g, want 0.3048³ = %.15g", m3PerFt3, ft3)
	}
	// 42·231/1728 ft³ exactly.
	if relErr(ft3PerBbl, 42.0*231/1728) > tolExact {
		t.Errorf("ft3PerBbl = %.15g, want 9702/1728", ft3PerBbl)
	}
	// 1 psi = 1 lbf/in², 1 lbf = 4.4482216152605 N (NIST SP 811 B.8, exact by definition).
	if psi := 4.4482216152605 / (in * in); relErr(paPerPsi, psi) > tolExact {
		t.Errorf("paPerPsi = %.15g, want %.15g", paPerPsi, psi)
	}
}

func TestRoundTrips(t *testing.T) {
	values := []float64{0, 1e-7, 0.0123, 1, 14.696, 60, 212.5, 2620, 12345.678, 1e6}
	for q := Quantity(0); q < numQuantities; q++ {
		for _, u := range unitTable[q] {
			spellings := append([]string{u.name}, u.aliases...)
			for _, unit := range spellings {
				for _, v := range values {
					f, err := ToField(q, unit, v)
					if err != nil {
						t.Fatalf("ToField(%v, %q, %g): %v", q, unit, v, err)
					}
					back, err := FromField(q, unit, f)
					if err != nil {
						t.Fatalf("FromField(%v, %q): %v", q, unit, err)
					}
					if d := math.Abs(back - v); d > tolRound*math.Max(1, math.Abs(v)) {
						t.Errorf("%v %q: %g → %g → %g", q, unit, v, f, back)
					}
				}
			}
		}
	}
}

func TestUnitSpelling(t *testing.T) {
	for _, tc := range []struct {
		q          Quantity
		unit, want string
	}{
		{Pressure, "PSIA", "psia"}, {Pressure, " psi g ", "psig"}, {Pressure, "BarA", "bara"},
		{Pressure, "kpa", "kPa"}, {Temperature, "deg F", "degF"}, {Temperature, "ºC", "degC"},
		{GOR, "Sm³/Sm³", "sm3/sm3"}, {GOR, "SCF/STB", "scf/STB"}, {FVF, "bbl/STB", "rb/STB"},
		{Viscosity, "mPa s", "cP"}, {Viscosity, "mPa⋅s", "cP"}, {Density, "G/CC", "g/cm3"},
		{Compressibility, "psi^-1", "1/psi"}, {MolePercent, "mol %", "mol%"},
		{Dimensionless, "-", ""}, {Dimensionless, "", ""}, {APIGravity, "°API", "API"},
	} {
		got, err := CanonicalUnit(tc.q, tc.unit)
		if err != nil || got != tc.want {
			t.Errorf("CanonicalUnit(%v, %q) = %q, %v; want %q", tc.q, tc.unit, got, err, tc.want)
		}
	}
}

func TestUnitErrors(t *testing.T) {
	for _, tc := range []struct {
		q        Quantity
		unit     string
		sentinel error
		hint     string
	}{
		{Pressure, "psi", ErrUnknownUnit, "write psia or psig"},
		{Pressure, "", ErrMissingUnit, ""},
		{GOR, "psia", ErrUnknownUnit, "psia is a pressure unit"},
		{Temperature, "degR", ErrUnknownUnit, ""},
		{Quantity(99), "x", ErrUnknownUnit, ""},
	} {
		_, err := ToField(tc.q, tc.unit, 1)
		var pe *ParseError
		if !errors.Is(err, tc.sentinel) || !errors.As(err, &pe) {
			t.Errorf("ToField(%v, %q): %v, want %v", tc.q, tc.unit, err, tc.sentinel)
			continue
		}
		if tc.hint != "" && !strings.Contains(pe.Hint, tc.hint) {
			t.Errorf("ToField(%v, %q): hint %q, want it to contain %q", tc.q, tc.unit, pe.Hint, tc.hint)
		}
	}
}

func TestParseValue(t *testing.T) {
	ok := []struct {
		q    Quantity
		s    string
		want float64
		tol  float64
	}{
		{Pressure, "2000psia", 2000, tolExact},
		{Pressure, "2000 psia", 2000, tolExact},
		{Pressure, " 2000 ", 2000, tolExact}, // a plain number is in field units
		{Pressure, "1985.304psig", 2000, tolExact},
		{Pressure, "150bar", 150 * 14.50377, tolNIST7},       // NIST SP 811 B.8
		{Pressure, "13.79MPa", 13.79e3 / 6.894757, tolNIST7}, // NIST SP 811 B.8
		{Pressure, "2e3psia", 2000, tolExact},
		{Temperature, "93degC", 199.4, tolExact}, // NIST SP 811 B.9
		{Temperature, "93 °C", 199.4, tolExact},
		{Temperature, "-10F", -10, tolExact},
		{GOR, "107sm3/sm3", 107 * 5.614583, 1e-7}, // check-values.md barrel
		{GOR, "600", 600, tolExact},
		{Viscosity, "0.5mPa.s", 0.5, tolExact},
		{Density, "0.8g/cm3", 0.8 * 62.42796, tolNIST7},
		{Dimensionless, "0.75", 0.75, tolExact},
	}
	for _, tc := range ok {
		got, err := ParseValue(tc.q, tc.s)
		if err != nil {
			t.Errorf("ParseValue(%v, %q): %v", tc.q, tc.s, err)
			continue
		}
		if relErr(got, tc.want) > tc.tol {
			t.Errorf("ParseValue(%v, %q) = %.10g, want %.10g", tc.q, tc.s, got, tc.want)
		}
	}
	bad := []struct {
		q        Quantity
		s        string
		sentinel error
	}{
		{Pressure, "", ErrNumber},
		{Pressure, "psia", ErrNumber},
		{Pressure, "2000psi", ErrUnknownUnit},
		{Pressure, "2000 furlongs", ErrUnknownUnit},
		{Pressure, "NaN", ErrNotFinite},
		{Pressure, "Infpsia", ErrNotFinite},
		{Pressure, "1e400psia", ErrNotFinite},
		{Pressure, "1e308MPa", ErrNotFinite},
		{Pressure, "0psia", ErrRange},
		{Pressure, "-20psig", ErrRange},
		{GOR, "600psia", ErrUnknownUnit},
		{Temperature, "1111111111111111111111111111111111111111111111111111111111111111111degF", ErrNumber},
	}
	for _, tc := range bad {
		if _, err := ParseValue(tc.q, tc.s); !errors.Is(err, tc.sentinel) {
			t.Errorf("ParseValue(%v, %q) error %v, want %v", tc.q, tc.s, err, tc.sentinel)
		}
	}
}

func TestAPI(t *testing.T) {
	// McCain, The Properties of Petroleum Fluids, 2nd ed., problem 10-4 (check-values.md
	// row 6): γo = 0.823 → 40.43 °API.
	api, err := SGToAPI(0.823)
	if err != nil || math.Abs(api-40.43) > tolAPI2dec {
		t.Errorf("SGToAPI(0.823) = %.4f, %v; want 40.43", api, err)
	}
	// Water is 10 °API by the definition of the scale (common practice).
	if sg, err := APIToSG(10); err != nil || math.Abs(sg-1) > tolExact {
		t.Errorf("APIToSG(10) = %g, %v; want 1", sg, err)
	}
	for _, a := range []float64{5, 10, 25.3, 35, 47.1, 60} {
		sg, err1 := APIToSG(a)
		back, err2 := SGToAPI(sg)
		if err1 != nil || err2 != nil || math.Abs(back-a) > 1e-12*math.Max(1, a) {
			t.Errorf("API %g → SG %g → API %g (%v, %v)", a, sg, back, err1, err2)
		}
		if a > 10 && sg >= 1 || a < 10 && sg <= 1 {
			t.Errorf("APIToSG(%g) = %g on the wrong side of water", a, sg)
		}
	}
	for _, a := range []float64{-131.5, -200, math.NaN(), math.Inf(1)} {
		if _, err := APIToSG(a); !errors.Is(err, ErrRange) {
			t.Errorf("APIToSG(%g): %v, want ErrRange", a, err)
		}
	}
	for _, sg := range []float64{0, -1, math.NaN(), math.Inf(1), 1e-320} {
		if _, err := SGToAPI(sg); !errors.Is(err, ErrRange) {
			t.Errorf("SGToAPI(%g): %v, want ErrRange", sg, err)
		}
	}
}

func TestQuantityNames(t *testing.T) {
	if Pressure.String() != "pressure" || Pressure.FieldUnit() != "psia" || Temperature.FieldUnit() != "degF" {
		t.Errorf("names: %v %v %v", Pressure, Pressure.FieldUnit(), Temperature.FieldUnit())
	}
	if got := Quantity(-1).String(); got != "Quantity(-1)" {
		t.Errorf("Quantity(-1).String() = %q", got)
	}
	if Quantity(99).Units() != nil || Quantity(99).FieldUnit() != "" {
		t.Error("out-of-range Quantity has units")
	}
}
