package fit

import (
	"math"
	"testing"

	"labmatch/correlations"
	"labmatch/lab"
	"labmatch/samples"
)

// A single flash to the stock tank: its conditions are the separator conditions that
// Vasquez–Beggs normalise the gas gravity from, γgs = γg·[1 + 5.912e−5·API·Tsep·log10(psep/114.7)]
// (Vasquez and Beggs, J. Pet. Tech. 32, 1980, the separator-gas equation as commonly
// reproduced). By hand for 30.5 °API, 60 °F, 14.7 psia and γg = 1.20:
// 5.912e−5·30.5·60 = 0.1081896; log10(14.7/114.7) = −0.8922446; γgs = 1.20·0.9034690 = 1.0841628.
func TestSingleStageSeparatorReachesVasquezBeggs(t *testing.T) {
	r, err := samples.Load("tr3-black")
	if err != nil {
		t.Fatal(err)
	}
	sel, ok := r.SelectedSeparator()
	if !ok {
		t.Fatal("no separator test")
	}
	one := lab.SeparatorTest{ID: "flash", Bofb: sel.Bofb, API: sel.API, Stages: []lab.SeparatorStage{
		{Line: 2, Stage: "stock tank", Pressure: 14.7, Temperature: 60, GOR: sel.Rsfb(), GasGravity: 1.20}}}
	r.Separator = []lab.SeparatorTest{one}
	r.Fluid.SelectedTest = ""
	r.Fluid.SepGasGravity = 0
	ds, err := NewDataset(r)
	if err != nil {
		t.Fatal(err)
	}
	if ds.Oil.SepPressure != 14.7 || ds.Oil.SepTemperature != 60 || ds.Oil.SepGasGravity != 1.20 || ds.Oil.SepStagesGasGravity != 1.20 {
		t.Fatalf("separator conditions %+v, want the stock tank's", ds.Oil)
	}
	g, err := correlations.VasquezBeggsGasGravity(ds.Oil)
	if err != nil {
		t.Fatal(err)
	}
	if ds.Oil.API != 30.5 {
		t.Fatalf("API %g, the hand value is for 30.5", ds.Oil.API)
	}
	if math.Abs(g-1.0841628) > 1e-6 {
		t.Errorf("normalised gas gravity %.7f, by hand 1.0841628", g)
	}
}
