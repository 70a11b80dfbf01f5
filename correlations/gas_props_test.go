package correlations

import (
	"encoding/csv"
	"errors"
	"math"
	"os"
	"strconv"
	"testing"
)

const (
	// tolExpansionAGA8: the AGA8 expansion factor includes Z at standard conditions (0.9968),
	// which the trade's Bg takes as 1, and gravity-only Z is within about 1 % for this gas.
	tolExpansionAGA8 = 0.015
	// tolRuleOfThumb: "about 270-fold" is a rounded figure of the trade.
	tolRuleOfThumb = 0.02
	// tolLGEFromMemory: a textbook result recalled to three significant figures.
	tolLGEFromMemory = 0.02
	tolExact         = 1e-12
)

func TestGasExpansionAGA8(t *testing.T) {
	// AGA Report No. 8 (2017), GERG-2008 equation, computed with the @sctg/aga8-js 1.0.9
	// package; see ../shared/reference/aga8 (expansion_factor.csv): the 0.70 gas at
	// 5,000 psia and 200 °F expands to E = 269.4469 scf/rcf at 14.696 psia and 60 °F.
	f, err := os.Open("testdata/aga8/expansion_factor.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	var eRef float64
	for _, r := range recs[1:] {
		if r[1] == "GERG-2008" {
			eRef, _ = strconv.ParseFloat(r[8], 64)
		}
	}
	if eRef == 0 {
		t.Fatal("no GERG-2008 row in expansion_factor.csv")
	}
	const gravity = 0.69992 // gases.csv, G070
	for _, zid := range []string{"dak", "hall-yarborough"} {
		z, _, _, err := GasZFromGravity(5000, 200, gravity, 0, 0, "sutton", zid)
		if err != nil {
			t.Fatal(err)
		}
		e, err := GasExpansion(z, 5000, 200)
		if err != nil {
			t.Fatal(err)
		}
		if r := relErr(e, eRef); r > tolExpansionAGA8 {
			t.Errorf("%s: E = %.1f scf/rcf, want %.1f (rel. err %.3f)", zid, e, eRef, r)
		}
		// Common practice (check-values.md example 7): a 0.7 gas at 5,000 psi and 200 °F
		// expands "about 270-fold".
		if r := relErr(e, 270); r > tolRuleOfThumb {
			t.Errorf("%s: E = %.1f, want about 270", zid, e)
		}
	}
}

func TestGasFVFIdentities(t *testing.T) {
	const z, p, tF = 0.85, 3000.0, 180.0
	bg, err := GasFVF(z, p, tF)
	if err != nil {
		t.Fatal(err)
	}
	// Common practice: Bg = 0.02827·Z·T/p rcf/scf at 14.696 psia and 60 °F (the constant is
	// psc/Tsc = 14.696/519.67 rounded).
	if e := relErr(bg, 0.02827*z*(tF+459.67)/p); e > 5e-4 {
		t.Errorf("Bg = %.6g, rel. err %.2g against the 0.02827 form", bg, e)
	}
	std, _ := GasFVFStd(z, p, tF, 14.696, 60)
	if std != bg {
		t.Errorf("GasFVFStd at 14.696 psia, 60 °F = %v, GasFVF = %v", std, bg)
	}
	// A 14.65-psia standard scales Bg by 14.65/14.696.
	b1465, _ := GasFVFStd(z, p, tF, 14.65, 60)
	if e := relErr(b1465/bg, 14.65/14.696); e > tolExact {
		t.Errorf("14.65-psia Bg ratio off by %.2g", e)
	}
	// rb/Mscf: 1 bbl = 5.614583 ft³ (check-values.md, common practice).
	rb, _ := GasFVFBarrels(z, p, tF)
	if e := relErr(rb, bg*1000/5.614583); e > tolExact {
		t.Errorf("rb/Mscf = %v", rb)
	}
	e, _ := GasExpansion(z, p, tF)
	if math.Abs(e*bg-1) > tolExact {
		t.Errorf("E·Bg = %v, want 1", e*bg)
	}
}

func TestGasDensity(t *testing.T) {
	// Common practice: dry air at 14.696 psia and 60 °F weighs about 0.0763 lbm/ft³
	// (ideal gas with M = 28.96; 379.4 scf/lb-mol gives 28.96/379.4 = 0.07633).
	rho, err := GasDensity(14.696, 60, 1, 1)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(rho, 28.96/379.4); e > 1e-3 {
		t.Errorf("air density = %.5f lbm/ft³, want 0.0763 (rel. err %.2g)", rho, e)
	}
}

func TestLeeGonzalezEakin(t *testing.T) {
	// From memory: Ahmed, Reservoir Engineering Handbook, ch. 2, Lee–Gonzalez–Eakin example:
	// γg = 0.72, 140 °F, 2,000 psia, Z = 0.78 (ρg ≈ 8.3 lbm/ft³, K ≈ 119.7, X ≈ 5.35,
	// Y ≈ 1.33) gives μg ≈ 0.0173 cP.
	mu, err := LeeGonzalezEakin(140, 2000, 0.78, 0.72)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(mu, 0.0173); e > tolLGEFromMemory {
		t.Errorf("μg = %.5f cP, want ≈ 0.0173 (from memory; rel. err %.3f)", mu, e)
	}

	// Common practice: natural-gas viscosity near atmospheric pressure is about 0.01 cP
	// (from memory, the Carr–Kobayashi–Burrows chart gives roughly 0.009–0.015 cP for 0.6–0.9
	// gases at 60–250 °F); it rises with pressure, and at low pressure with temperature.
	for _, g := range []float64{0.6, 0.75, 0.9} {
		for _, tF := range []float64{60, 150, 250} {
			mu, err := LeeGonzalezEakin(tF, 14.696, 1, g)
			if err != nil || mu < 0.008 || mu > 0.016 {
				t.Errorf("γg %g, %g °F, 1 atm: μg = %v %v, want ≈ 0.01 cP", g, tF, mu, err)
			}
		}
		prev := 0.0
		for p := 100.0; p <= 10000; p += 100 {
			z, _, _, err := GasZFromGravity(p, 200, g, 0, 0, "sutton", "dak")
			if err != nil {
				t.Fatal(err)
			}
			mu, err := LeeGonzalezEakin(200, p, z, g)
			if err != nil || !(mu > prev) {
				t.Fatalf("γg %g, %g psia: μg = %v (previous %v) %v", g, p, mu, prev, err)
			}
			prev = mu
		}
	}
	cold, _ := LeeGonzalezEakin(60, 14.696, 1, 0.7)
	hot, _ := LeeGonzalezEakin(250, 14.696, 1, 0.7)
	if !(hot > cold) {
		t.Errorf("low-pressure μg does not rise with T: %v → %v", cold, hot)
	}
}

func TestGasZFromGravity(t *testing.T) {
	z, tpr, ppr, err := GasZFromGravity(2000, 150, 0.65, 0, 0, "sutton", "hall-yarborough")
	if err != nil {
		t.Fatal(err)
	}
	ppc, tpc, _ := SuttonCritical(0.65)
	want, _ := HallYarborough((150+459.67)/tpc, 2000/ppc)
	if relErr(z, want) > tolExact || relErr(tpr, (150+459.67)/tpc) > tolExact || relErr(ppr, 2000/ppc) > tolExact {
		t.Errorf("chain gives %v %v %v, want %v", z, tpr, ppr, want)
	}
	// The sour correction lowers the pseudo-criticals, so Tpr and Ppr rise.
	_, tprSour, pprSour, err := GasZFromGravity(2000, 150, 0.65, 0.1, 0.05, "sutton", "dak")
	if err != nil || !(tprSour > tpr) || !(pprSour > ppr) {
		t.Errorf("sour: Tpr %v Ppr %v %v", tprSour, pprSour, err)
	}
	if _, _, _, err := GasZFromGravity(2000, 150, 0.65, 0, 0, "nope", "dak"); !errors.Is(err, ErrUnknownID) {
		t.Errorf("unknown ppc id: %v", err)
	}
	if _, _, _, err := GasZFromGravity(2000, 150, 0.65, 0, 0, "sutton", "nope"); !errors.Is(err, ErrUnknownID) {
		t.Errorf("unknown z id: %v", err)
	}
}

func TestGasPropsBadInput(t *testing.T) {
	bad := []struct {
		name string
		err  error
	}{}
	add := func(name string, _ float64, err error) {
		bad = append(bad, struct {
			name string
			err  error
		}{name, err})
	}
	v, err := GasFVF(0, 1000, 100)
	add("Bg z=0", v, err)
	v, err = GasFVF(0.9, -5, 100)
	add("Bg p<0", v, err)
	v, err = GasFVF(0.9, 1000, math.NaN())
	add("Bg T NaN", v, err)
	v, err = GasFVF(0.9, 1000, -500)
	add("Bg T below absolute zero", v, err)
	v, err = GasFVFStd(0.9, 1000, 100, 101.325, 60)
	add("Bg psc in kPa", v, err)
	v, err = GasFVFStd(0.9, 1000, 100, 14.65, 288.15)
	add("Bg Tsc in K", v, err)
	v, err = GasDensity(1000, 100, 0.9, 0)
	add("density γg=0", v, err)
	v, err = LeeGonzalezEakin(100, 0, 0.9, 0.7)
	add("LGE p=0", v, err)
	v, err = LeeGonzalezEakin(100, 1000, math.Inf(1), 0.7)
	add("LGE z=Inf", v, err)
	v, _, _, err = GasZFromGravity(1000, 100, 0.7, 5, 0, "sutton", "dak")
	add("chain H2S in percent", v, err)
	for _, b := range bad {
		if !errors.Is(b.err, ErrInput) {
			t.Errorf("%s: err = %v, want ErrInput", b.name, b.err)
		}
	}
}
