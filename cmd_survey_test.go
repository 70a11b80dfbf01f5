package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The demo survey as a user runs it: text with the left-out rows, every property ranked, a
// best family per property and the cautions.
func TestSurveyDemoText(t *testing.T) {
	code, out, errs := runCLI(t, "survey", filepath.Join("samples", "survey", "tamsin-ridge.csv"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	for _, want := range []string{
		"73 rows read, 70 samples used, 3 left out",
		"line 53 (TR-048), row: gas gravity",
		"the same values as line 68",
		"pb — bubble point from Rsb (70 samples, 10 folds)",
		"bo — oil FVF", "mu_dead — dead-oil viscosity", "mu_sat — oil viscosity",
		"best for an unseen oil:",
		"qualified engineers",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q", want)
		}
	}
	if errs != "" {
		t.Errorf("stderr %q, want nothing", errs)
	}
}

type surveyOut struct {
	Samples  int `json:"samples"`
	Excluded []struct {
		Row     int      `json:"row"`
		Columns []string `json:"columns"`
		Reason  string   `json:"reason"`
	} `json:"excluded"`
	Properties map[string][]struct {
		Family      string   `json:"family"`
		AAREPub     float64  `json:"aare_pct_published"`
		BiasPub     float64  `json:"bias_pct_published"`
		AARETuned   float64  `json:"aare_pct_tuned"`
		AARECV      *float64 `json:"aare_pct_cv"`
		Multiplier  float64  `json:"multiplier"`
		AARERefit   *float64 `json:"aare_pct_refit"`
		AARERefitCV *float64 `json:"aare_pct_refit_cv"`
		Coeffs      []struct {
			ID        string  `json:"id"`
			Published float64 `json:"published"`
			Refit     float64 `json:"refit"`
		} `json:"coefficients"`
	} `json:"properties"`
	Predictions []struct {
		Sample    string   `json:"sample"`
		Row       int      `json:"row"`
		Property  string   `json:"property"`
		Family    string   `json:"family"`
		Lab       float64  `json:"lab"`
		Published float64  `json:"published"`
		Tuned     float64  `json:"tuned"`
		Refit     *float64 `json:"refit"`
	} `json:"predictions"`
}

// --json has the keys of the issue, lists in rank order (by cross-validated AARE), and one
// prediction per sample, property and family.
func TestSurveyJSON(t *testing.T) {
	code, out, errs := runCLI(t, "survey", "demo:tamsin-ridge", "--refit", "--json", "--seed", "3")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var s surveyOut
	if err := json.Unmarshal([]byte(out), &s); err != nil {
		t.Fatal(err)
	}
	if s.Samples != 70 || len(s.Excluded) != 5 || s.Excluded[0].Row == 0 || s.Excluded[0].Reason == "" {
		t.Errorf("samples %d, excluded %+v", s.Samples, s.Excluded)
	}
	n := 0
	for _, p := range []string{"pb", "bo", "mu_dead", "mu_sat"} {
		fams := s.Properties[p]
		if len(fams) == 0 {
			t.Errorf("no %s", p)
			continue
		}
		for i, f := range fams {
			if f.AARECV == nil {
				t.Errorf("%s %s: no CV error", p, f.Family)
				continue
			}
			if i > 0 && fams[i-1].AARECV != nil && *fams[i-1].AARECV > *f.AARECV {
				t.Errorf("%s: %s before %s is not in CV order", p, fams[i-1].Family, f.Family)
			}
			if (f.AARERefit == nil) != (len(f.Coeffs) == 0) {
				t.Errorf("%s %s: refit %v with %d coefficients", p, f.Family, f.AARERefit, len(f.Coeffs))
			}
		}
		n += len(fams)
	}
	if len(s.Predictions) < 70*8 {
		t.Errorf("%d predictions", len(s.Predictions))
	}
	first := s.Predictions[0]
	if first.Property != "pb" || first.Family != s.Properties["pb"][0].Family || first.Sample != "TR-001" || first.Row != 6 || first.Refit == nil {
		t.Errorf("first prediction %+v", first)
	}
	// TR-001's Pb is written as 3305 psig: 3319.696 psia.
	if first.Lab != 3305+14.696 {
		t.Errorf("TR-001 lab Pb %g psia", first.Lab)
	}
}

// --out writes the predictions atomically, refuses to overwrite without --force, and matches
// --json.
func TestSurveyOutCSV(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "pred.csv")
	if code, _, errs := runCLI(t, "survey", "demo:tamsin-ridge", "--properties", "pb,bo", "--out", f); code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	data, err := os.ReadFile(f)
	if err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(bytes.NewReader(data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if strings.Join(recs[0], ",") != "sample,row,property,family,rank,unit,lab,published,tuned,tuned_cv,refit,refit_cv" {
		t.Errorf("header %v", recs[0])
	}
	props := map[string]int{}
	for _, r := range recs[1:] {
		props[r[2]]++
		if r[10] != "" {
			t.Errorf("refit value without --refit: %v", r)
		}
	}
	if props["pb"] != 70*8 || props["bo"] != 63*7 || len(props) != 2 {
		t.Errorf("rows per property %v", props)
	}
	if code, _, errs := runCLI(t, "survey", "demo:tamsin-ridge", "--out", f); code != exitData || !strings.Contains(errs, "--force") {
		t.Errorf("existing file without --force: exit %d, %q", code, errs)
	}
	if again, _ := os.ReadFile(f); !bytes.Equal(again, data) {
		t.Error("the refused run changed the file")
	}
	if code, _, errs := runCLI(t, "survey", "demo:tamsin-ridge", "--out", f, "--force", "--refit", "--properties", "mu_dead"); code != exitOK {
		t.Errorf("--force: exit %d: %s", code, errs)
	}
	data, _ = os.ReadFile(f)
	if !strings.Contains(string(data), ",mu_dead,") || strings.Contains(string(data), ",pb,") {
		t.Error("--force did not replace the file")
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Errorf("%d files in the folder, want only pred.csv (no temporary left)", len(ents))
	}
}

// A broken file names the file, line and column and exits 1; usage mistakes exit 2.
func TestSurveyErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "db.csv")
	os.WriteFile(bad, []byte("sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia]\nA,200,35,0.8,500,2000\nB,200,35,0.8,five hundred,2000\n"), 0o644)
	code, out, errs := runCLI(t, "survey", bad)
	if code != exitData || out != "" || !strings.Contains(errs, "db.csv:3:5 (Rsb [scf/STB])") || !strings.Contains(errs, "not a number") {
		t.Errorf("bad cell: exit %d, stdout %q, stderr %q", code, out, errs)
	}
	// Every row left out: the reasons, then the error.
	os.WriteFile(bad, []byte("sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia]\nA,200,35,0.3,500,2000\n"), 0o644)
	code, _, errs = runCLI(t, "survey", bad)
	if code != exitData || !strings.Contains(errs, "line 2 (A), row: gas gravity") || !strings.Contains(errs, "no usable samples") {
		t.Errorf("no usable row: exit %d, %q", code, errs)
	}
	if code, _, errs := runCLI(t, "survey", filepath.Join(dir, "missing.csv")); code != exitData || !strings.Contains(errs, "missing.csv") {
		t.Errorf("missing file: exit %d, %q", code, errs)
	}
	for _, args := range [][]string{
		{"survey"},
		{"survey", "a.csv", "b.csv"},
		{"survey", "demo:tamsin-ridge", "--folds", "1"},
		{"survey", "demo:tamsin-ridge", "--properties", "pb,co"},
		{"survey", "demo:tamsin-ridge", "--seed", "-1"},
	} {
		if code, _, errs := runCLI(t, args...); code != exitUsage || !strings.Contains(errs, "Usage") {
			t.Errorf("%v: exit %d, %q", args, code, errs)
		}
	}
}

// Progress goes to stderr only when it is a terminal: a file gets nothing.
func TestSurveyProgressOnlyOnTerminal(t *testing.T) {
	f, err := os.Create(filepath.Join(t.TempDir(), "stderr"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var out bytes.Buffer
	if code := run([]string{"survey", "demo:tamsin-ridge", "--refit"}, &out, f); code != exitOK {
		t.Fatalf("exit %d", code)
	}
	if isTerminal(f) {
		t.Fatal("a regular file reported as a terminal")
	}
	if fi, _ := f.Stat(); fi.Size() != 0 {
		t.Errorf("%d bytes of progress written to a file", fi.Size())
	}
	var b bytes.Buffer
	p := &progressLine{w: &b, label: "survey"}
	p.update(3, 12)
	p.clear()
	if got := b.String(); !strings.HasPrefix(got, "\rsurvey: 3 of 12 fits (25 %)") || !strings.HasSuffix(got, "\r") {
		t.Errorf("progress line %q", got)
	}
	var none *progressLine
	none.clear() // a nil line does nothing
}
