package export

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"labmatch/fit"
	"labmatch/lab"
)

func surveyInput(t *testing.T, data []byte, refit bool) SurveyReportInput {
	t.Helper()
	sv, err := lab.ParseSurvey("db.csv", data)
	if err != nil {
		t.Fatal(err)
	}
	res, err := fit.RunSurvey(sv, fit.SurveyOptions{Refit: refit, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	return SurveyReportInput{Tool: "labmatch test", Survey: sv, Result: res, Folds: 10, Generated: time.Date(2026, 12, 1, 0, 0, 0, 0, time.UTC)}
}

// The survey report of the six-oil table (Ahmed, Reservoir Engineering Handbook, ch. 2; the
// values themselves are checked in fit): self-contained (no script, no external reference), in
// the report's style, one cross-plot per family with a 45° line, the refit coefficients, the
// cautions and the fingerprint.
func TestSurveyReport(t *testing.T) {
	data, err := os.ReadFile("../testdata/survey/six-oils-field.csv")
	if err != nil {
		t.Fatal(err)
	}
	in := surveyInput(t, data, true)
	var b bytes.Buffer
	if err := WriteSurveyReport(&b, in); err != nil {
		t.Fatal(err)
	}
	html := b.String()
	for _, want := range []string{"<style>", "--teal", "Bubble point from Rsb (pb)", "Oil FVF at the bubble point (bo)",
		"Refitted coefficients", "45° line", "qualified engineers", in.Survey.Fingerprint, "labmatch test", "1 December 2026",
		"leave-one-out"} {
		if !strings.Contains(html, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	for _, bad := range []string{"<script", "http://", "https://", "NaN", "{{"} {
		if strings.Contains(html, bad) {
			t.Errorf("report holds %q", bad)
		}
	}
	fams := 0
	for _, sp := range in.Result.Properties {
		fams += len(sp.Families)
	}
	if n := strings.Count(html, "<svg"); n != fams {
		t.Errorf("%d plots for %d families", n, fams)
	}
	if n := strings.Count(html, "<details open>"); n != len(in.Result.Properties) {
		t.Errorf("%d open plots, want the best family's of each property", n)
	}
}

// A large database is thinned in the plots (so the report stays small) and the caption says so.
func TestSurveyReportThinned(t *testing.T) {
	var b bytes.Buffer
	b.WriteString("sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia]\n")
	for i := 0; i < 4000; i++ {
		rsb := 200 + float64(i%1300)
		fmt.Fprintf(&b, "S%d,%d,%.1f,%.3f,%.0f,%.0f\n", i, 150+i%100, 25+float64(i%20), 0.7+float64(i%30)/100, rsb, 3.2*rsb+float64(i%97))
	}
	in := surveyInput(t, b.Bytes(), false)
	var out bytes.Buffer
	if err := WriteSurveyReport(&out, in); err != nil {
		t.Fatal(err)
	}
	html := out.String()
	if !strings.Contains(html, "one sample in 3 drawn (1334 of 4000)") {
		t.Error("caption does not say the plot is thinned")
	}
	// Circles per plot: published and tuned at each drawn sample, plus the legend's.
	svgs := regexp.MustCompile(`(?s)<svg.*?</svg>`).FindAllString(html, -1)
	if len(svgs) == 0 {
		t.Fatal("no plots")
	}
	if len(html) > 12<<20 {
		t.Errorf("report of %d bytes", len(html))
	}
}

func TestSaveSurveyReport(t *testing.T) {
	data, err := os.ReadFile("../testdata/survey/six-oils-metric.csv")
	if err != nil {
		t.Fatal(err)
	}
	in := surveyInput(t, data, false)
	p := filepath.Join(t.TempDir(), "s.html")
	if err := SaveSurveyReport(p, in, false); err != nil {
		t.Fatal(err)
	}
	if err := SaveSurveyReport(p, in, false); !errors.Is(err, fs.ErrExist) {
		t.Errorf("second save without force: %v", err)
	}
	if err := SaveSurveyReport(p, in, true); err != nil {
		t.Errorf("with force: %v", err)
	}
	if err := WriteSurveyReport(&bytes.Buffer{}, SurveyReportInput{}); err == nil {
		t.Error("no survey: want an error")
	}
}
