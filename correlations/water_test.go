package correlations

import (
	"errors"
	"testing"
)

const (
	// tolWater4 and tolWater5: a published value printed to 4 or 5 significant figures.
	tolWater4 = 5e-4
	tolWater5 = 1e-4
	// tolTwoDigits: a published value printed to two significant figures (0.52 ± 0.005).
	tolTwoDigits = 1e-2
	// tolBrineDensity: McCain's standard-condition brine density against a handbook table of
	// NaCl solutions at 15 °C (0.56 °C colder than 60 °F moves the table by < 0.03 %); McCain
	// fitted oilfield brines, so some tenths of a percent are expected.
	tolBrineDensity = 4e-3
	// tolPureWaterViscosity: McCain fitted brines from 100 °F up; against pure water at
	// 212 °F it is 4–5 % low, within the scatter McCain reports for the correlation.
	tolPureWaterViscosity = 6e-2
)

func TestMcCainWaterFVF(t *testing.T) {
	// McCain (1990), The Properties of Petroleum Fluids, 2nd ed., ch. 16 example, as worked on
	// wiki.pengtools.com "Water formation volume factor": 3176 psia, 165 °F →
	// ΔVwp = −0.0047241, ΔVwt = 0.027, Bw = 1.022 res bbl/STB.
	bw, err := McCainWaterFVF(3176, 165)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(bw, 1.022); e > tolWater4 {
		t.Errorf("Bw(3176 psia, 165 °F) = %.5f, want 1.022 (rel. err %.2g)", bw, e)
	}
	if e := relErr(bw, (1-0.0047241)*(1+0.027)); e > tolWater4 {
		t.Errorf("Bw = %.6f, want (1 + ΔVwp)(1 + ΔVwt) = %.6f", bw, (1-0.0047241)*(1+0.027))
	}
	// Common practice (the definition of a formation volume factor): Bw = 1 at standard
	// conditions.
	if bw, _ := McCainWaterFVF(14.696, 60); relErr(bw, 1) > 1e-4 {
		t.Errorf("Bw(14.696 psia, 60 °F) = %.6f, want 1", bw)
	}
	// Trends (common practice): water shrinks under pressure and swells with heat.
	lo, _ := McCainWaterFVF(1000, 200)
	hi, _ := McCainWaterFVF(5000, 200)
	hot, _ := McCainWaterFVF(1000, 250)
	if !(hi < lo && hot > lo) {
		t.Errorf("Bw trends: 1000 psia %g, 5000 psia %g, 250 °F %g", lo, hi, hot)
	}
}

func TestMcCainWaterViscosity(t *testing.T) {
	// McCain (1990) example as worked on wiki.pengtools.com "Water viscosity": 74,289.3 mg/L
	// at SG 1.0476, so S = 74289.3/1.0476/10⁴ wt %; 3176 psia, 165 °F → μw1 = 0.45 cP, pressure
	// factor 1.1587, μw = 0.52 cP.
	s := 74289.3 / 1.0476 / 1e4
	mu, err := McCainWaterViscosity(3176, 165, s)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(mu, 0.52); e > tolTwoDigits {
		t.Errorf("μw = %.4f cP, want 0.52 (rel. err %.2g)", mu, e)
	}
	mu1, _ := McCainWaterViscosity(14.696, 165, s)
	if e := relErr(mu1, 0.45); e > tolTwoDigits {
		t.Errorf("μw1 = %.4f cP, want 0.45", mu1)
	}
	if e := relErr(mu/mu1, 1.1587); e > tolWater5 {
		t.Errorf("pressure factor = %.5f, want 1.1587", mu/mu1)
	}
	// Pure water at 212 °F: 0.2818 cP (Lyons, ed., Standard Handbook of Petroleum & Natural
	// Gas Engineering, Vol. 2, Table 5-1, viscosity of pure water).
	pure, _ := McCainWaterViscosity(14.696, 212, 0)
	if e := relErr(pure, 0.2818); e > tolPureWaterViscosity {
		t.Errorf("pure water at 212 °F: %.4f cP, want 0.2818 within %.0f %%", pure, 100*tolPureWaterViscosity)
	}
	// Trends (common practice): brine is more viscous than fresh water, hot water less.
	salty, _ := McCainWaterViscosity(14.696, 212, 10)
	hot, _ := McCainWaterViscosity(14.696, 300, 0)
	if !(salty > pure && hot < pure) {
		t.Errorf("μw trends: pure %g, 10 %% %g, 300 °F %g", pure, salty, hot)
	}
	// The viscosibility is the logarithmic slope of the pressure factor.
	const p, dp = 3000.0, 1.0
	a, _ := McCainWaterViscosity(p-dp, 200, 5)
	b, _ := McCainWaterViscosity(p+dp, 200, 5)
	c, _ := McCainWaterViscosity(p, 200, 5)
	cv, err := McCainWaterViscosibility(p)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(cv, (b-a)/(2*dp)/c); e > 1e-6 {
		t.Errorf("viscosibility %g, finite difference %g", cv, (b-a)/(2*dp)/c)
	}
}

func TestOsifWaterCompressibility(t *testing.T) {
	// McCain (1990) example as worked on wiki.pengtools.com "Water compressibility": 3500 psia,
	// 165 °F, 74,289.3 mg/L → cw = 2.6348e−6 1/psi.
	cw, err := OsifWaterCompressibility(3500, 165, 74.2893)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(cw, 2.6348e-6); e > tolWater5 {
		t.Errorf("cw = %.5g 1/psi, want 2.6348e-6 (rel. err %.2g)", cw, e)
	}
	// petroleumoffice.com, PO.PVT.Cw.UnSat.ByOsif.SI example: 17,237 kPa, 93.33 °C, 10 g/L →
	// 4.54805142e−7 1/kPa (1 psi = 6.894757 kPa).
	const kPaPerPsi = 6.894757293168
	cw, err = OsifWaterCompressibility(17237/kPaPerPsi, 93.33*1.8+32, 10)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(cw/kPaPerPsi, 4.54805142e-7); e > tolWater5 {
		t.Errorf("cw = %.9g 1/kPa, want 4.54805142e-7 (rel. err %.2g)", cw/kPaPerPsi, e)
	}
	// Trend (Osif): salt and pressure make water stiffer.
	fresh, _ := OsifWaterCompressibility(3000, 220, 0)
	brine, _ := OsifWaterCompressibility(3000, 220, 100)
	deep, _ := OsifWaterCompressibility(8000, 220, 0)
	if !(brine < fresh && deep < fresh) {
		t.Errorf("cw trends: fresh %g, 100 g/L %g, 8000 psia %g", fresh, brine, deep)
	}
}

func TestMcCainBrineDensity(t *testing.T) {
	const kgm3PerLbmft3 = 16.01846337
	for _, c := range []struct{ s, want float64 }{
		// Poradnik fizykochemiczny, WNT, Warsaw (1974), density of aqueous NaCl at 15 °C, as
		// tabulated by the physics laboratory of Nicolaus Copernicus University (fizyka.umk.pl):
		{10, 1074.2}, // kg/m³ at 10 wt %
		{20, 1152.5}, // kg/m³ at 20 wt %
		// Pure water at 60 °F: 999.0 kg/m³ (62.37 lbm/ft³; common practice).
		{0, 999.0},
	} {
		rho, err := McCainBrineDensity(c.s)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(rho*kgm3PerLbmft3, c.want); e > tolBrineDensity {
			t.Errorf("ρw(%g %%) = %.1f kg/m³, want %.1f (rel. err %.2g)", c.s, rho*kgm3PerLbmft3, c.want, e)
		}
	}
	// The pengtools example above (74,289.3 mg/L at SG 1.0476, 7.09 wt %) converts back to
	// the same concentration within the difference of the two densities (0.25 %).
	c, err := BrineConcentration(74289.3 / 1.0476 / 1e4)
	if err != nil {
		t.Fatal(err)
	}
	if e := relErr(c, 74.2893); e > 5e-3 {
		t.Errorf("concentration %.2f g/L, want 74.29", c)
	}
}

func TestWaterInputErrors(t *testing.T) {
	for name, err := range map[string]error{
		"salinity above saturation": func() error { _, err := McCainWaterViscosity(3000, 200, 30); return err }(),
		"negative salinity":         func() error { _, err := McCainBrineDensity(-1); return err }(),
		"zero pressure":             func() error { _, err := McCainWaterFVF(0, 200); return err }(),
		"negative concentration":    func() error { _, err := OsifWaterCompressibility(3000, 200, -5); return err }(),
		"temperature at 0 °F":       func() error { _, err := McCainWaterViscosity(3000, 0, 1); return err }(),
	} {
		if !errors.Is(err, ErrInput) {
			t.Errorf("%s: error %v, want ErrInput", name, err)
		}
	}
}

func TestWaterCatalog(t *testing.T) {
	for _, p := range []Property{WaterFVF, WaterCompressibility, WaterViscosity, WaterDensity} {
		ids := IDs(p)
		if len(ids) != 1 {
			t.Fatalf("%s: ids %v, want one", p, ids)
		}
		e, err := Lookup(p, ids[0])
		if err != nil {
			t.Fatal(err)
		}
		if e.Reference == "" || len(e.Ranges) == 0 || e.Year == 0 {
			t.Errorf("%s %s: entry without reference, ranges or year: %+v", p, e.ID, e)
		}
	}
	e, _ := Lookup(WaterCompressibility, "osif")
	if msgs := e.Check(map[string]float64{"temperature": 150, "p": 3000}); len(msgs) != 1 {
		t.Errorf("osif at 150 °F: %v, want one message (below 200 °F)", msgs)
	}
}

func BenchmarkMcCainWaterFVF(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := McCainWaterFVF(3000, 200)
		benchSink += v
	}
}

func BenchmarkMcCainWaterViscosity(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := McCainWaterViscosity(3000, 200, 3)
		benchSink += v
	}
}

func BenchmarkOsifWaterCompressibility(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := OsifWaterCompressibility(3000, 200, 30)
		benchSink += v
	}
}
