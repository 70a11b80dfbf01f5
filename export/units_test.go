package export

import (
	"bytes"
	"fmt"
	"math"
	"strings"
	"testing"

	"labmatch/correlations"
	"labmatch/lab"
)

// The export package's warnings are the fit engine's, as data: in field units their text is
// fit.Model.RangeWarnings word for word.
func TestModelWarningsMatchFit(t *testing.T) {
	for _, id := range []string{"tr7-light", "good-oil-well-4", "tr12-heavy"} {
		tu := loadTuned(t, id)
		want := tu.m.RangeWarnings()
		got := warningTexts(ModelWarnings(tu.m), &converter{units: lab.FieldUnits()})
		if strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Errorf("%s: ModelWarnings in field units =\n%q\nfit.Model.RangeWarnings =\n%q", id, got, want)
		}
	}
}

// A metric CSV or deck states every out-of-range warning in metric units: no °F, psia or
// scf/STB in its header. The published report (220 °F) lies above the 176 °F of
// Egbogah and Ng's data, so the header must have a temperature warning to convert.
func TestMetricHeaderWarnings(t *testing.T) {
	tu := loadTuned(t, "good-oil-well-4")
	tab := buildTable(t, tu, TableOptions{Salinity: DefaultSalinity})
	if len(tab.Warnings) == 0 {
		t.Fatal("the published report gives no range warning; the test needs one")
	}
	for _, f := range []Format{CSV, Deck} {
		data, err := RenderTable(tab, f, Metric)
		if err != nil {
			t.Fatal(err)
		}
		var warnings, temps int
		for _, l := range strings.Split(string(data), "\n") {
			if !strings.HasPrefix(l, "#") && !strings.HasPrefix(l, "--") {
				continue
			}
			for _, field := range []string{"°F", "degF", "psia", "psi", "scf/STB", "rb/STB", "lbm/ft3"} {
				if strings.Contains(l, field) {
					t.Errorf("%s metric header line quotes %s: %s", f, field, l)
				}
			}
			if strings.Contains(l, "outside the data:") {
				warnings++
				if strings.Contains(l, "temperature") && strings.Contains(l, "degC") {
					temps++
				}
			}
		}
		if warnings != len(tab.Warnings) {
			t.Errorf("%s: %d warning lines, the table has %d warnings", f, warnings, len(tab.Warnings))
		}
		if temps == 0 {
			t.Errorf("%s: no temperature warning in degC", f)
		}
	}
}

// A warning converts its value and range with lab's factors.
func TestWarningTextConverts(t *testing.T) {
	w := Warning{Property: "bw", Family: "mccain", OutOfRange: correlations.OutOfRange{
		Input: "p", Value: 5015, Min: 14.7, Max: 5000, Unit: "psia", Side: correlations.Above, Authors: "McCain"}}
	// 1 psi = 6.894757 kPa (NIST SP 811, 2008, App. B.8: 6.894 757 E+03 Pa); 1 bar = 100 kPa,
	// so 5000 psia = 344.7379 bara and 5015 psia = 345.7721 bara.
	if got, want := w.Text(Metric), "bw (mccain): p 345.8 bara is above the 1.014–344.7 range of McCain's data"; got != want {
		t.Errorf("metric text = %q, want %q", got, want)
	}
	if got, want := w.Text(Field), "bw (mccain): p 5015 psia is above the 14.7–5000 range of McCain's data"; got != want {
		t.Errorf("field text = %q, want %q", got, want)
	}
	// Temperature: °C = (°F − 32)/1.8, exact by definition (NIST SP 811, App. B.9):
	// 176 °F = 80 °C, 59 °F = 15 °C, 220 °F = 104.44 °C.
	w = Warning{Property: "mu_dead", Family: "egbogah-ng", OutOfRange: correlations.OutOfRange{
		Input: "temperature", Value: 220, Min: 59, Max: 176, Unit: "°F", Side: correlations.Above, Authors: "Egbogah and Ng"}}
	if got, want := w.Text(Metric), "mu_dead (egbogah-ng): temperature 104.4 degC is above the 15–80 range of Egbogah and Ng's data"; got != want {
		t.Errorf("metric text = %q, want %q", got, want)
	}
}

// The shift of a tuned property is stated in the file's units: a compressibility shift of
// 1e-6 1/psi is 1.450377e-5 1/bar (1 psi = 6894.757 Pa, NIST SP 811, 2008, App. B.8;
// 1 bar = 1e5 Pa exactly).
func TestShiftInMetric(t *testing.T) {
	c := &converter{units: lab.MetricUnits()}
	got := shiftText(1e-6, "1/psi", c, "%.7g", false)
	var v float64
	var unit string
	if _, err := fmt.Sscan(got, &v, &unit); err != nil {
		t.Fatalf("shiftText = %q: %v", got, err)
	}
	const want = 1e5 / 6894.757 * 1e-6
	if unit != "1/bar" || math.Abs(v-want) > 1e-6*want {
		t.Errorf("shiftText = %q, want %.7g 1/bar", got, want)
	}
	if got := shiftText(1e-6, "1/psi", c, "%.4g", true); got != "1e-06 1/psi (1.45e-05 1/bar)" {
		t.Errorf("shiftText with the engine's unit = %q", got)
	}
	if got := shiftText(0.03, "rb/STB", &converter{units: lab.FieldUnits()}, "%.4g", true); got != "0.03 rb/STB" {
		t.Errorf("field shiftText = %q", got)
	}
}

// The no-branch note of a table is written in the file's units too.
func TestMetricHeaderNoBranchNote(t *testing.T) {
	tu := loadTuned(t, "tr7-light")
	tab := buildTable(t, tu, TableOptions{})
	tab.Rows[0].NoBranch = "test reason"
	var b bytes.Buffer
	if err := WriteCSV(&b, tab, Metric); err != nil {
		t.Fatal(err)
	}
	want := "note: the saturated row at 1.01325 bara (Rs "
	if !strings.Contains(b.String(), want) || !strings.Contains(b.String(), "sm3/sm3) has no undersaturated branch (test reason)") {
		t.Errorf("metric CSV header lacks %q…:\n%s", want, b.String()[:min(b.Len(), 3000)])
	}
}

// The metric report shows its numbers and plot axes in metric units: bara and °C in the axis
// titles, the tables and the summary, and no field pressure axis left.
func TestReportMetric(t *testing.T) {
	tu := loadTuned(t, "good-oil-well-4")
	in := reportInput(tu)
	in.Units = Metric
	var b bytes.Buffer
	if err := WriteReport(&b, in); err != nil {
		t.Fatal(err)
	}
	page := b.String()
	for _, want := range []string{
		"pressure [bara]</text>",          // every plot's x axis
		"average co from Psat [1e-5/bar]", // co's y axis
		"oil viscosity [mPa·s]</text>",
		"Rs [sm3/sm3]</text>",
		`<th class="n">p [bara]</th>`, // the residual and fluid tables
		"<th scope=\"row\">reservoir temperature</th><td>104.4 °C</td>",
		"temperature 104.4 °C is above the 15–80 range of Egbogah and Ng", // a range warning
	} {
		if !strings.Contains(page, want) {
			t.Errorf("metric report lacks %q", want)
		}
	}
	for _, bad := range []string{"pressure [psia]", "p [psia]", "[scf/STB]", "[1e-6/psi]", "220 °F is above"} {
		if strings.Contains(page, bad) {
			t.Errorf("metric report still shows %q", bad)
		}
	}
	// The report's Pb, 2634.7 psia (fluid.csv of the published report), is 181.656 bara:
	// 1 psi = 6.894757 kPa (NIST SP 811, 2008, App. B.8), 1 bar = 100 kPa.
	if want := fmt.Sprintf("%.6g bara", 2634.7*6.894757/100); !strings.Contains(page, "<th scope=\"row\">saturation pressure (report)</th><td>"+want) {
		t.Errorf("metric report lacks the saturation pressure %s", want)
	}
	// The field report is unchanged in its units.
	in.Units = ""
	b.Reset()
	if err := WriteReport(&b, in); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "pressure [psia]</text>") || strings.Contains(b.String(), "bara") {
		t.Error("field report: want psia axes and no bara")
	}
}

// Every demo report's metric deck and CSV header is free of field units, the no-branch note
// of TR-12's dead-oil row among them (its reason is the correlation's own complaint).
func TestMetricHeadersOfDemoReports(t *testing.T) {
	for _, id := range []string{"tr3-black", "tr7-light", "tr12-heavy"} {
		tab := buildTable(t, loadTuned(t, id), TableOptions{Salinity: DefaultSalinity})
		for _, f := range []Format{CSV, Deck} {
			data, err := RenderTable(tab, f, Metric)
			if err != nil {
				t.Fatal(err)
			}
			for _, l := range strings.Split(string(data), "\n") {
				if !strings.HasPrefix(l, "#") && !strings.HasPrefix(l, "--") {
					continue
				}
				for _, field := range []string{"°F", "degF", "psi", "scf", "STB", "lbm"} {
					if strings.Contains(l, field) {
						t.Errorf("%s %s metric header line quotes %s: %s", id, f, field, l)
					}
				}
			}
		}
	}
}
