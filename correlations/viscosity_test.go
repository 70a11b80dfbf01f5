package correlations

import (
	"errors"
	"math"
	"sort"
	"testing"
)

const (
	// tolBeggsExample: check-values.md example 1 prints four significant figures (H/M);
	// the brief allows about 0.5 %.
	tolBeggsExample = 5e-3
	// tolDeadScatter: common practice — published dead-oil correlations for a mid-range
	// crude scatter by some tens of percent; each must lie within ±40 % of their median.
	tolDeadScatter = 0.40
)

func TestBeggsRobinsonExample(t *testing.T) {
	// Beggs (1987), Petroleum Engineering Handbook (SPE), ch. 22, via check-values.md
	// example 1: T = 137 °F, 22 °API, Rs = 90 scf/STB → μod = 17.44 cP, A = 0.719,
	// B = 0.853, μob = 8.24 cP.
	o := Oil{API: 22, Temperature: 137}
	mud, err := BeggsRobinsonDeadViscosity(o)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(mud, 17.44); e > tolBeggsExample {
		t.Errorf("μod = %.3f cP, want 17.44 (rel. err %.2g)", mud, e)
	}
	// A is μob for μod = 1 cP; B is the log-slope ln(μob(e)/A).
	a, _ := BeggsRobinsonSatViscosity(1, 90, o)
	ae, _ := BeggsRobinsonSatViscosity(math.E, 90, o)
	if e := relErr(a, 0.719); e > tolBeggsExample {
		t.Errorf("A = %.4f, want 0.719", a)
	}
	if b := math.Log(ae / a); relErr(b, 0.853) > tolBeggsExample {
		t.Errorf("B = %.4f, want 0.853", b)
	}
	mob, err := BeggsRobinsonSatViscosity(17.44, 90, o)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(mob, 8.24); e > tolBeggsExample {
		t.Errorf("μob = %.3f cP, want 8.24 (rel. err %.2g)", mob, e)
	}
	// The chained value (our μod) agrees too.
	mob2, _ := BeggsRobinsonSatViscosity(mud, 90, o)
	if e := relErr(mob2, 8.24); e > tolBeggsExample {
		t.Errorf("chained μob = %.3f cP, want 8.24", mob2)
	}
}

func TestDeadViscosityCrossCheck(t *testing.T) {
	// Common practice: inside their data ranges the six dead-oil correlations agree to some
	// tens of percent for ordinary crudes.
	for _, o := range []Oil{{API: 25, Temperature: 150}, {API: 35, Temperature: 150}, {API: 40, Temperature: 200}} {
		var vs []float64
		for _, f := range DeadViscosityFamilies() {
			v, err := f.Viscosity(o)
			if err != nil {
				t.Fatalf("%s: %v", f.ID, err)
			}
			vs = append(vs, v)
		}
		s := append([]float64(nil), vs...)
		sort.Float64s(s)
		med := 0.5 * (s[len(s)/2-1] + s[len(s)/2])
		for i, f := range DeadViscosityFamilies() {
			if e := relErr(vs[i], med); e > tolDeadScatter {
				t.Errorf("%s at %g °API, %g °F: %.3g cP, median %.3g", f.ID, o.API, o.Temperature, vs[i], med)
			}
		}
	}
}

func TestDeadViscosityTrends(t *testing.T) {
	// Common practice: dead-oil viscosity falls as temperature rises and rises as the oil
	// gets heavier. Exception: Standing's fit of Beal's chart is not monotonic in API below
	// 14 °API above 220 °F (see BealDeadViscosity), so Beal is checked from 14 °API there.
	for _, f := range DeadViscosityFamilies() {
		for api := 10.0; api <= 55; api++ {
			for tF := 80.0; tF <= 300; tF += 5 {
				v, err := f.Viscosity(Oil{API: api, Temperature: tF})
				if err != nil {
					t.Fatalf("%s API %g T %g: %v", f.ID, api, tF, err)
				}
				if tF < 300 {
					hot, _ := f.Viscosity(Oil{API: api, Temperature: tF + 5})
					if !(hot < v) {
						t.Errorf("%s API %g: μod does not fall from %g to %g °F", f.ID, api, tF, tF+5)
					}
				}
				if api > 10 && !(f.ID == "beal" && api <= 14 && tF >= 220) {
					heavier, _ := f.Viscosity(Oil{API: api - 1, Temperature: tF})
					if !(heavier > v) {
						t.Errorf("%s T %g: μod does not rise from %g to %g °API", f.ID, tF, api, api-1)
					}
				}
			}
		}
	}
}

func TestSatViscosityTrends(t *testing.T) {
	// Common practice: dissolved gas thins the oil, so μob falls as Rs rises. Checked for
	// μod 0.5–1000 cP and Rs 0–1,500 scf/STB. Exceptions, all outside the data: the usual
	// Chew–Connally fit turns upward above Rs ≈ 1,550–1,850 (A's parabola), and the A·μod^B
	// forms rise with Rs when μod is below about 0.3 cP (a falling exponent on a number < 1).
	for _, f := range SatViscosityFamilies() {
		for _, mud := range []float64{0.5, 1, 3, 10, 50, 200, 1000} {
			prev := math.Inf(1)
			for rs := 0.0; rs <= 1500; rs += 10 {
				v, err := f.Viscosity(mud, rs, Oil{})
				if err != nil {
					t.Fatalf("%s μod %g Rs %g: %v", f.ID, mud, rs, err)
				}
				if !(v < prev) {
					t.Errorf("%s μod %g: μob does not fall at Rs %g", f.ID, mud, rs)
					break
				}
				prev = v
			}
			// At Rs = 0 the live oil is the dead oil; the fits reproduce that roughly.
			v0, _ := f.Viscosity(mud, 0, Oil{})
			if relErr(v0, mud) > 0.35 {
				t.Errorf("%s: μob(Rs=0) = %.3g, μod = %g", f.ID, v0, mud)
			}
		}
	}
}

func TestUnderViscosityTrends(t *testing.T) {
	// Common practice: an undersaturated oil gets more viscous as it is compressed. Checked
	// for μob 0.1–2,000 cP up to 10,000 psia; Kartoatmodjo–Schmidt's bracket changes sign near
	// μob 2,500 cP, and Petrosky–Farshad's increment underflows to zero for very viscous oils,
	// so for them only "does not fall" is required above 100 cP.
	for _, f := range UnderViscosityFamilies() {
		for _, mub := range []float64{0.1, 0.5, 1, 5, 20, 100, 500, 2000} {
			for _, pb := range []float64{500, 2500, 5000} {
				prev, err := f.Viscosity(pb, pb, mub, Oil{})
				if err != nil || math.Abs(prev-mub) > 1e-3*mub {
					t.Errorf("%s: μo(pb) = %v (%v), want μob = %g", f.ID, prev, err, mub)
				}
				for p := pb + 100; p <= 10000; p += 100 {
					v, err := f.Viscosity(p, pb, mub, Oil{})
					if err != nil {
						t.Fatalf("%s μob %g p %g: %v", f.ID, mub, p, err)
					}
					if v < prev || (v == prev && mub <= 100) {
						t.Errorf("%s μob %g pb %g: μo does not rise at %g psia", f.ID, mub, pb, p)
						break
					}
					prev = v
				}
			}
		}
	}
}

func TestViscosityChainFinite(t *testing.T) {
	// Every dead → saturated → undersaturated chain gives a finite positive value or an
	// explicit error over API 10–55, 80–300 °F, Rs 0–2,000 scf/STB and p up to 10,000 psia.
	// Only Kartoatmodjo–Schmidt's saturated fit may refuse (non-positive result for very
	// thin oils); everything else must give a value.
	for api := 10.0; api <= 55; api += 5 {
		for tF := 80.0; tF <= 300; tF += 20 {
			o := Oil{API: api, Temperature: tF}
			for _, d := range DeadViscosityFamilies() {
				mud, err := d.Viscosity(o)
				if err != nil || !(mud > 0) || math.IsInf(mud, 0) {
					t.Fatalf("%s %+v: %v %v", d.ID, o, mud, err)
				}
				for _, s := range SatViscosityFamilies() {
					for rs := 0.0; rs <= 2000; rs += 250 {
						mub, err := s.Viscosity(mud, rs, o)
						if err != nil {
							if s.ID != "kartoatmodjo-schmidt" || !errors.Is(err, ErrInput) {
								t.Fatalf("%s(%g, %g): %v", s.ID, mud, rs, err)
							}
							continue
						}
						if !(mub > 0) || math.IsInf(mub, 0) {
							t.Fatalf("%s(%g, %g) = %v", s.ID, mud, rs, mub)
						}
						for _, u := range UnderViscosityFamilies() {
							for _, p := range []float64{3000, 6000, 10000} {
								v, err := u.Viscosity(p, 3000, mub, o)
								if err != nil {
									if !errors.Is(err, ErrInput) {
										t.Fatalf("%s: %v", u.ID, err)
									}
									continue
								}
								if !(v > 0) || math.IsInf(v, 0) {
									t.Fatalf("%s(%g, 3000, %g) = %v", u.ID, p, mub, v)
								}
							}
						}
					}
				}
			}
		}
	}
}

func TestViscosityBadInput(t *testing.T) {
	for _, f := range DeadViscosityFamilies() {
		for _, o := range []Oil{{API: 0, Temperature: 150}, {API: -5, Temperature: 150}, {API: 0.85, Temperature: 150},
			{API: 30, Temperature: 0}, {API: 30, Temperature: -40}, {API: math.NaN(), Temperature: 150}, {API: 30, Temperature: math.Inf(1)}} {
			if _, err := f.Viscosity(o); !errors.Is(err, ErrInput) {
				t.Errorf("%s(%+v): err = %v, want ErrInput", f.ID, o, err)
			}
		}
	}
	for _, f := range SatViscosityFamilies() {
		for _, c := range [][2]float64{{0, 100}, {-1, 100}, {5, -1}, {math.NaN(), 100}, {5, math.Inf(1)}} {
			if _, err := f.Viscosity(c[0], c[1], Oil{}); !errors.Is(err, ErrInput) {
				t.Errorf("%s(%g, %g): err = %v, want ErrInput", f.ID, c[0], c[1], err)
			}
		}
	}
	for _, f := range UnderViscosityFamilies() {
		for _, c := range [][3]float64{{2000, 3000, 1}, {3000, 0, 1}, {3000, 2000, 0}, {math.NaN(), 2000, 1}, {3000, 2000, math.Inf(1)}} {
			if _, err := f.Viscosity(c[0], c[1], c[2], Oil{}); !errors.Is(err, ErrInput) {
				t.Errorf("%s(%v): err = %v, want ErrInput", f.ID, c, err)
			}
		}
	}
}
