package correlations

import "testing"

// Below the chart's dead-oil end the Lasater pair is continued through the origin: low
// pressures give a small positive Rs, falling to zero with pressure, and the pair stays
// inverse there (behaviour check; Ahmed's oil 2 inputs, from memory, as a plausible oil).
func TestLasaterLowEnd(t *testing.T) {
	o := Oil{API: 40.7, GasGravity: 0.855, Temperature: 220}
	prev := -1.0
	for _, p := range []float64{20, 60, 120, 200, 300} {
		rs, err := LasaterSolutionGOR(p, o)
		if err != nil {
			t.Fatal(err)
		}
		if !(rs > prev && rs > 0) {
			t.Errorf("Rs(%g) = %g: want positive and rising with pressure", p, rs)
		}
		prev = rs
		pb, err := LasaterBubblePoint(rs, o)
		if err != nil {
			t.Fatal(err)
		}
		if d := pb/p - 1; d > 1e-9 || d < -1e-9 {
			t.Errorf("Pb(Rs(%g)) = %g", p, pb)
		}
	}
}

// Petrosky–Farshad's co is a power of Rsb: zero for dead oil, which is refused.
func TestPetroskyFarshadCoDeadOil(t *testing.T) {
	o := Oil{API: 35, GasGravity: 0.8, Temperature: 200}
	if _, err := PetroskyFarshadCo(3000, 2000, 0, o); err == nil {
		t.Error("Rsb = 0: want an error")
	}
	if _, err := PetroskyFarshadRelativeVolume(3000, 2000, 0, o); err == nil {
		t.Error("Rsb = 0: want an error")
	}
}
