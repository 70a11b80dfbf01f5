package correlations

import (
	"math"
	"testing"
)

// The viscosity families' With forms at the published coefficients are the published
// correlations, and every declared coefficient enters the equation: a 1 % change of it moves
// the result for at least one oil. Identity checks, no outside values; the published values
// themselves are checked in viscosity_test.go (Beggs (1987), Petroleum Engineering Handbook,
// ch. 22).
func TestViscosityCoefficientForms(t *testing.T) {
	oils := []Oil{
		{API: 22, Temperature: 137},
		{API: 35, Temperature: 200},
		{API: 45, Temperature: 260},
	}
	for _, f := range DeadViscosityFamilies() {
		if f.Coefficients == nil || f.ViscosityWith == nil {
			t.Errorf("dead-oil %s declares no coefficients", f.ID)
			continue
		}
		checkDeclaration(t, "dead-oil "+f.ID, f.Coefficients)
		pub := Published(f.Coefficients)
		moved := make([]bool, len(pub))
		for _, o := range oils {
			a, err1 := f.Viscosity(o)
			b, err2 := f.ViscosityWith(o, pub)
			if err1 != nil || err2 != nil || a != b {
				t.Errorf("dead-oil %s at %+v: %g (%v), With %g (%v)", f.ID, o, a, err1, b, err2)
			}
			for j := range pub {
				c := append([]float64(nil), pub...)
				c[j] *= 1.01
				if v, err := f.ViscosityWith(o, c); err == nil && math.Abs(v/a-1) > 1e-6 {
					moved[j] = true
				}
			}
		}
		for j, m := range moved {
			if !m {
				t.Errorf("dead-oil %s: coefficient %s changes nothing", f.ID, f.Coefficients[j].ID)
			}
		}
	}
	for _, f := range SatViscosityFamilies() {
		if f.Coefficients == nil || f.ViscosityWith == nil {
			t.Errorf("live-oil %s declares no coefficients", f.ID)
			continue
		}
		checkDeclaration(t, "live-oil "+f.ID, f.Coefficients)
		pub := Published(f.Coefficients)
		moved := make([]bool, len(pub))
		for _, o := range oils {
			for _, rs := range []float64{90, 500, 1200} {
				for _, mud := range []float64{0.8, 3, 17.44} {
					a, err1 := f.Viscosity(mud, rs, o)
					b, err2 := f.ViscosityWith(mud, rs, o, pub)
					if err1 != nil || err2 != nil || a != b {
						t.Errorf("live-oil %s μod %g Rs %g: %g (%v), With %g (%v)", f.ID, mud, rs, a, err1, b, err2)
					}
					for j := range pub {
						c := append([]float64(nil), pub...)
						c[j] *= 1.01
						if v, err := f.ViscosityWith(mud, rs, o, c); err == nil && math.Abs(v/a-1) > 1e-6 {
							moved[j] = true
						}
					}
				}
			}
		}
		for j, m := range moved {
			if !m {
				t.Errorf("live-oil %s: coefficient %s changes nothing", f.ID, f.Coefficients[j].ID)
			}
		}
	}
	if _, err := BeggsRobinsonDeadViscosityWith(oils[0], []float64{1.163}); err == nil {
		t.Error("one coefficient for Beggs–Robinson μod: want an error")
	}
	if _, err := ChewConnallySatViscosityWith(3, 500, oils[0], nil); err == nil {
		t.Error("no coefficients for Chew–Connally: want an error")
	}
}

// checkDeclaration: unique ids, a role for each, published values finite and non-zero (the
// refit works on ratios to them).
func checkDeclaration(t *testing.T, name string, cs []Coefficient) {
	t.Helper()
	seen := map[string]bool{}
	for _, c := range cs {
		if c.ID == "" || c.Role == "" || seen[c.ID] || c.Value == 0 || math.IsNaN(c.Value) || math.IsInf(c.Value, 0) {
			t.Errorf("%s: bad declaration %+v", name, c)
		}
		seen[c.ID] = true
	}
}
