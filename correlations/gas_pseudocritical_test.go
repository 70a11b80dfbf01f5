package correlations

import (
	"errors"
	"math"
	"testing"
)

// relErr is |got/want − 1|.
func relErr(got, want float64) float64 { return math.Abs(got/want - 1) }

const (
	// tolPrinted is for values printed to four or five significant figures.
	tolPrinted = 5e-4
	// tolMethaneCritical: a gravity-only fit is not expected to hit a pure component's
	// critical point; 3 % separates "right physics" from a wrong coefficient.
	tolMethaneCritical = 0.03
	// tolGasFromMemory is for a textbook value recalled but not re-checked against the book.
	tolGasFromMemory = 5e-3
)

func TestSuttonCritical(t *testing.T) {
	// Sutton (1985), SPE 14265, as quoted with a worked default on the "Sutton Pseudo-Critical
	// Gas Properties" formula page (petrocalchub.com): γg = 0.65 gives Tpc = 365.11 °R.
	_, tpc, err := SuttonCritical(0.65)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(tpc, 365.11); e > tolPrinted {
		t.Errorf("Sutton Tpc(0.65) = %.3f °R, want 365.11 (rel. err %.2g)", tpc, e)
	}
}

func TestPseudoCriticalsNearMethane(t *testing.T) {
	// Common practice: a gas of methane's gravity (16.043/28.96 = 0.554) should have
	// pseudo-criticals near methane's critical point, 343.0 °R and 667 psia (NIST Webbook:
	// 190.56 K, 4.599 MPa).
	const gMethane = 16.043 / 28.96
	for _, f := range PseudoCriticalFamilies() {
		ppc, tpc, err := f.Critical(gMethane)
		if err != nil {
			t.Fatalf("%s: %v", f.ID, err)
		}
		if e := relErr(tpc, 343.0); e > tolMethaneCritical {
			t.Errorf("%s: Tpc = %.1f °R, want ≈ 343 (rel. err %.3f)", f.ID, tpc, e)
		}
		if e := relErr(ppc, 667); e > tolMethaneCritical {
			t.Errorf("%s: ppc = %.1f psia, want ≈ 667 (rel. err %.3f)", f.ID, ppc, e)
		}
	}
}

func TestPseudoCriticalTrends(t *testing.T) {
	// Common practice: heavier gases have higher Tpc and lower ppc over the natural-gas range.
	for _, f := range PseudoCriticalFamilies() {
		prevP, prevT := math.Inf(1), 0.0
		for g := 0.57; g <= 1.68; g += 0.01 {
			ppc, tpc, err := f.Critical(g)
			if err != nil {
				t.Fatalf("%s(%g): %v", f.ID, g, err)
			}
			if !(tpc > prevT) || !(ppc < prevP) {
				t.Fatalf("%s: not monotonic at γg = %.2f (ppc %.1f, Tpc %.1f)", f.ID, g, ppc, tpc)
			}
			prevP, prevT = ppc, tpc
		}
	}
}

func TestPseudoCriticalBadInput(t *testing.T) {
	for _, g := range []float64{0, -0.7, math.NaN(), math.Inf(1), 7} {
		for _, f := range PseudoCriticalFamilies() {
			if _, _, err := f.Critical(g); !errors.Is(err, ErrInput) {
				t.Errorf("%s(%g): err = %v, want ErrInput", f.ID, g, err)
			}
		}
	}
}

func TestWichertAziz(t *testing.T) {
	// Identity: a sweet gas is unchanged.
	p, tc, err := WichertAziz(670, 380, 0, 0)
	if err != nil || p != 670 || tc != 380 {
		t.Errorf("sweet gas changed: %v %v %v", p, tc, err)
	}

	// From memory: Ahmed, Reservoir Engineering Handbook, ch. 2, sour-gas example
	// (γg = 0.7, 5 % CO2, 10 % H2S; chart Tpc = 395.5 °R, ppc = 668.4 psia) gives
	// T'pc ≈ 374.6 °R and p'pc ≈ 630.4 psia.
	p, tc, err = WichertAziz(668.4, 395.5, 0.10, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(tc, 374.6); e > tolGasFromMemory {
		t.Errorf("T'pc = %.2f, want ≈ 374.6 (from memory; rel. err %.3g)", tc, e)
	}
	if e := relErr(p, 630.4); e > tolGasFromMemory {
		t.Errorf("p'pc = %.2f, want ≈ 630.4 (from memory; rel. err %.3g)", p, e)
	}

	// Common practice: acid gases lower both pseudo-criticals (ε > 0).
	for _, y := range [][2]float64{{0.01, 0}, {0, 0.01}, {0.2, 0.1}, {0.5, 0.3}} {
		p, tc, err := WichertAziz(670, 380, y[0], y[1])
		if err != nil || !(p < 670) || !(tc < 380) {
			t.Errorf("yH2S %g yCO2 %g: %g %g %v, want both lowered", y[0], y[1], p, tc, err)
		}
	}

	// Percentages instead of fractions, and impossible totals, are refused.
	for _, y := range [][2]float64{{5, 0}, {0, 10}, {-0.1, 0}, {0.6, 0.6}, {math.NaN(), 0}} {
		if _, _, err := WichertAziz(670, 380, y[0], y[1]); !errors.Is(err, ErrInput) {
			t.Errorf("yH2S %g yCO2 %g: err = %v, want ErrInput", y[0], y[1], err)
		}
	}
	if _, _, err := WichertAziz(-1, 380, 0.1, 0); !errors.Is(err, ErrInput) {
		t.Errorf("negative ppc: err = %v", err)
	}
}
