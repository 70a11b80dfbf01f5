package correlations

import (
	"math"
	"testing"
)

// The With forms at the published coefficients are the published correlations, and with
// changed coefficients the solution-gas pair stays an exact inverse (the refit depth relies
// on both). Identity checks, no outside values.
func TestCoefficientForms(t *testing.T) {
	oils := []Oil{
		{API: 24, GasGravity: 0.8, Temperature: 180, SepPressure: 114.7, SepTemperature: 60},
		{API: 40.7, GasGravity: 0.855, Temperature: 220, SepPressure: 114.7, SepTemperature: 75},
	}
	for _, f := range SolutionGasFamilies() {
		if f.Coefficients == nil {
			continue
		}
		pub := Published(f.Coefficients)
		for _, o := range oils {
			for _, rs := range []float64{50, 300, 768, 1400} {
				a, err1 := f.BubblePoint(rs, o)
				b, err2 := f.BubblePointWith(rs, o, pub)
				if err1 != nil || err2 != nil || a != b {
					t.Errorf("%s: Pb(%g) = %g (%v), With %g (%v)", f.ID, rs, a, err1, b, err2)
				}
			}
			for j := range pub {
				c := append([]float64(nil), pub...)
				c[j] *= 1.05
				for _, rs := range []float64{60, 400, 900} {
					pb, err := f.BubblePointWith(rs, o, c)
					if err != nil {
						t.Errorf("%s coefficient %s ×1.05: Pb(%g): %v", f.ID, f.Coefficients[j].ID, rs, err)
						continue
					}
					back, err := f.SolutionGORWith(pb, o, c)
					if err != nil || math.Abs(back/rs-1) > 1e-9 {
						t.Errorf("%s coefficient %s ×1.05: Rs(Pb(%g)) = %g (%v)", f.ID, f.Coefficients[j].ID, rs, back, err)
					}
				}
			}
		}
	}
	for _, f := range OilFVFFamilies() {
		if f.Coefficients == nil {
			continue
		}
		pub := Published(f.Coefficients)
		for _, o := range oils {
			for _, rs := range []float64{50, 300, 768} {
				a, err1 := f.FVF(2000, rs, o)
				b, err2 := f.FVFWith(2000, rs, o, pub)
				if err1 != nil || err2 != nil || math.Abs(a/b-1) > 1e-14 {
					t.Errorf("%s: Bo(%g) = %g (%v), With %g (%v)", f.ID, rs, a, err1, b, err2)
				}
			}
		}
	}
}

// A wrong number of coefficients is an input error, not a panic.
func TestCoefficientCount(t *testing.T) {
	o := Oil{API: 35, GasGravity: 0.8, Temperature: 200}
	if _, err := StandingBubblePointWith(500, o, []float64{18.2}); err == nil {
		t.Error("one coefficient for Standing: want an error")
	}
	if _, err := GlasoOilFVFWith(0, 500, o, nil); err == nil {
		t.Error("no coefficients for Glasø Bo: want an error")
	}
}
