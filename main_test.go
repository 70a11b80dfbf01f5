package main

import (
	"bytes"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

func runCLI(t *testing.T, args ...string) (code int, stdout, stderr string) {
	t.Helper()
	var o, e bytes.Buffer
	code = run(args, &o, &e)
	return code, o.String(), e.String()
}

func TestUsageErrors(t *testing.T) {
	for _, args := range [][]string{
		{"no-such-command"},
		{"check"},
		{"check", "--no-such-flag", "x"},
		{"calc"},
		{"calc", "oil", "--api", "30"},
		{"calc", "gas", "--gas-gravity", "0.7", "--temperature", "200", "--pressure", "12parsecs"},
		{"tune", "demo:tr3-black", "--bo", "no-such-family"},
		{"rank", "demo:tr3-black", "--mode", "sideways"},
		{"tune", "demo:tr3-black", "--huber-delta", "0.05"}, // the threshold of a loss not asked for
		{"rank", "demo:tr3-black", "--loss", "absolute", "--huber-delta", "0.05"},
		{"tune", "demo:tr3-black", "--ppc", "sutton", "--z", "standing+dak"}, // two pseudo-critical methods
	} {
		code, _, stderr := runCLI(t, args...)
		if code != exitUsage {
			t.Errorf("%v: exit %d, want %d (stderr %q)", args, code, exitUsage, stderr)
		}
		if !strings.Contains(stderr, "Usage") && !strings.Contains(stderr, "usage") {
			t.Errorf("%v: stderr lacks the usage: %q", args, stderr)
		}
	}
}

func TestHelpEveryCommand(t *testing.T) {
	for _, c := range commands() {
		code, out, _ := runCLI(t, c.name, "--help")
		if code != exitOK || !strings.Contains(out, "Usage: labmatch "+c.name) {
			t.Errorf("%s --help: exit %d, output %q", c.name, code, out)
		}
	}
	code, out, _ := runCLI(t, "--help")
	if code != exitOK || !strings.Contains(out, "qualified engineers") {
		t.Errorf("--help must show the cautions; exit %d", code)
	}
}

// The acceptance path of the foundation issue: write the demo reports, check each, corrupt a
// cell and see the file, line and column named.
func TestSamplesOutCheckAndCorrupt(t *testing.T) {
	dir := t.TempDir()
	if code, _, e := runCLI(t, "samples", "--out", dir); code != exitOK {
		t.Fatalf("samples --out: exit %d: %s", code, e)
	}
	ents, err := os.ReadDir(dir)
	if err != nil || len(ents) != 3 {
		t.Fatalf("want 3 report folders, got %d (%v)", len(ents), err)
	}
	for _, e := range ents {
		if code, out, errs := runCLI(t, "check", filepath.Join(dir, e.Name())); code != exitOK {
			t.Errorf("check %s: exit %d\n%s%s", e.Name(), code, out, errs)
		}
	}
	// Writing again without --force must refuse and keep the files.
	if code, _, _ := runCLI(t, "samples", "--out", dir); code != exitData {
		t.Errorf("samples --out over existing files: exit %d, want %d", code, exitData)
	}
	// Corrupt one cell: the third data cell of dl.csv's second data row.
	dl := filepath.Join(dir, "tr3-black", "dl.csv")
	data, err := os.ReadFile(dl)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(data), "\n")
	row := -1
	seen := 0
	for i, l := range lines {
		if l == "" || strings.HasPrefix(l, "#") {
			continue
		}
		seen++
		if seen == 3 { // header, first row, second row
			row = i
			break
		}
	}
	cells := strings.Split(lines[row], ",")
	cells[2] = "1.2x4"
	lines[row] = strings.Join(cells, ",")
	if err := os.WriteFile(dl, []byte(strings.Join(lines, "\n")), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, stderr := runCLI(t, "check", filepath.Join(dir, "tr3-black"))
	if code != exitData {
		t.Fatalf("corrupted report: exit %d, want %d", code, exitData)
	}
	want := "dl.csv:" + strconv.Itoa(row+1) + ":3"
	if !strings.Contains(stderr, want) || !strings.Contains(stderr, "1.2x4") {
		t.Errorf("error %q does not name %s and the bad text", stderr, want)
	}
}

func TestCalcJSONKeys(t *testing.T) {
	code, out, e := runCLI(t, "calc", "oil", "--api", "35", "--gas-gravity", "0.75", "--temperature", "90degC",
		"--rsb", "60sm3/sm3", "--pressure", "3000psia", "--json")
	if code != exitOK {
		t.Fatalf("calc oil: exit %d: %s", code, e)
	}
	var m map[string]any
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"pb_psia", "rs_scf_stb", "bo_rb_stb", "co_per_psi", "oil_density_lbm_ft3", "dead_oil_viscosity_cp", "oil_viscosity_cp", "warnings"} {
		if _, ok := m[k]; !ok {
			t.Errorf("calc oil --json lacks %q", k)
		}
	}
	code, out, e = runCLI(t, "calc", "gas", "--gas-gravity", "0.7", "--temperature", "200", "--pressure", "5000", "--json")
	if code != exitOK {
		t.Fatalf("calc gas: exit %d: %s", code, e)
	}
	m = nil
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"ppc_psia", "tpc_degr", "z", "bg_rcf_scf", "expansion_scf_rcf", "gas_density_lbm_ft3", "gas_viscosity_cp", "warnings"} {
		if _, ok := m[k]; !ok {
			t.Errorf("calc gas --json lacks %q", k)
		}
	}
	// A 0.7 gas at 5,000 psia and 200 °F expands about 270-fold (common practice; AGA8
	// GERG-2008 gives 269.45, ../shared/reference/aga8/expansion_factor.csv).
	if e := m["expansion_scf_rcf"].(float64); e < 265 || e > 275 {
		t.Errorf("expansion %g, want about 270", e)
	}
}

func TestRankAndTuneJSON(t *testing.T) {
	code, out, e := runCLI(t, "rank", "demo:tr3-black", "--json")
	if code != exitOK {
		t.Fatalf("rank: exit %d: %s", code, e)
	}
	var rk struct {
		Properties map[string][]map[string]any `json:"properties"`
	}
	if err := json.Unmarshal([]byte(out), &rk); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"family", "aare_pct_published", "aare_pct_tuned", "aare_pct_loo", "depth", "multiplier", "in_range", "points"} {
		if _, ok := rk.Properties["bo"][0][k]; !ok {
			t.Errorf("rank --json bo entry lacks %q", k)
		}
	}
	save := filepath.Join(t.TempDir(), "tuning.json")
	code, out, e = runCLI(t, "tune", "demo:tr3-black", "--json", "--save", save)
	if code != exitOK {
		t.Fatalf("tune: exit %d: %s", code, e)
	}
	var tn struct {
		Properties map[string]struct {
			Family     string             `json:"family"`
			Depth      string             `json:"depth"`
			LOO        *float64           `json:"aare_pct_loo"`
			Ladder     []map[string]any   `json:"ladder"`
			Parameters map[string]float64 `json:"parameters"`
			CI95       map[string][2]float64
			Residuals  []map[string]any `json:"residuals"`
		} `json:"properties"`
	}
	if err := json.Unmarshal([]byte(out), &tn); err != nil {
		t.Fatal(err)
	}
	pb := tn.Properties["pb"]
	if pb.Family == "" || pb.Parameters["multiplier"] == 0 || len(pb.Residuals) == 0 {
		t.Errorf("tune --json pb incomplete: %+v", pb)
	}
	// Every rung with its errors, the chosen one marked and named (the demo's pb bends: shape).
	if pb.Depth != "shape" || pb.LOO == nil || len(pb.Ladder) != 4 {
		t.Errorf("tune --json pb: depth %q, aare_pct_loo %v, %d rungs", pb.Depth, pb.LOO, len(pb.Ladder))
	}
	for _, r := range pb.Ladder {
		if _, ok := r["aare_pct_loo"]; !ok {
			t.Errorf("rung %v lacks aare_pct_loo", r["depth"])
		}
		if r["chosen"] == true && r["depth"] != pb.Depth {
			t.Errorf("rung %v marked chosen, depth %q", r["depth"], pb.Depth)
		}
	}
	if _, err := os.Stat(save); err != nil {
		t.Errorf("tuning file not written: %v", err)
	}
	if code, _, _ := runCLI(t, "tune", "demo:tr3-black", "--save", save); code != exitData {
		t.Errorf("tune --save over an existing file without --force: exit %d, want %d", code, exitData)
	}
}

// A tuning file applies to the report it was made from; a changed report is refused unless
// --force is given.
func TestTuningFileRefusedForChangedReport(t *testing.T) {
	dir := t.TempDir()
	if code, _, e := runCLI(t, "samples", "--out", dir); code != exitOK {
		t.Fatalf("samples: %s", e)
	}
	rep := filepath.Join(dir, "tr12-heavy")
	tf := filepath.Join(dir, "t.json")
	if code, _, e := runCLI(t, "tune", rep, "--save", tf); code != exitOK {
		t.Fatalf("tune --save: %s", e)
	}
	if code, out, e := runCLI(t, "tune", rep, "--tuning", tf); code != exitOK || !strings.Contains(out, "parameters from") {
		t.Fatalf("tune --tuning on the same report: exit %d: %s", code, e)
	}
	vis := filepath.Join(rep, "viscosity.csv")
	data, err := os.ReadFile(vis)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(vis, append(data, []byte("# a comment changes the fingerprint\n")...), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, e := runCLI(t, "tune", rep, "--tuning", tf)
	if code != exitData || !strings.Contains(e, "fingerprint") {
		t.Errorf("changed report: exit %d, stderr %q; want exit 1 naming the fingerprint", code, e)
	}
	if code, _, e := runCLI(t, "tune", rep, "--tuning", tf, "--force"); code != exitOK {
		t.Errorf("changed report with --force: exit %d: %s", code, e)
	}
}

// Plain labmatch runs the main job on the demo report and shows the cautions.
func TestDemoSummary(t *testing.T) {
	code, out, e := runCLI(t)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, e)
	}
	for _, want := range []string{"tr3-black", "clean: no errors or warnings", "Best family per property", "pb ", "qualified engineers"} {
		if !strings.Contains(out, want) {
			t.Errorf("summary lacks %q", want)
		}
	}
}

// Without --pressure, calc oil reports the oil at its bubble point. Check value: Standing's Pb
// for Rsb 751 scf/STB, γg 0.851, 47.1 °API, 250 °F is 2,181 psia (Ahmed, Reservoir Engineering
// Handbook, ch. 2, Standing example; from memory, hence 1 %).
func TestCalcOilAtBubblePoint(t *testing.T) {
	code, out, e := runCLI(t, "calc", "oil", "--api", "47.1", "--gas-gravity", "0.851", "--temperature", "250",
		"--rsb", "751", "--pb", "standing", "--json")
	if code != exitOK {
		t.Fatalf("calc oil without --pressure: exit %d: %s", code, e)
	}
	var m struct {
		P  float64 `json:"pressure_psia"`
		Pb float64 `json:"pb_psia"`
		Rs float64 `json:"rs_scf_stb"`
	}
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	if math.Abs(m.Pb/2181-1) > 0.01 || m.P != m.Pb || m.Rs != 751 {
		t.Errorf("at the bubble point: p %.1f, Pb %.1f (want about 2181), Rs %.1f (want 751)", m.P, m.Pb, m.Rs)
	}
}

// A QC error does not stop tune, rank or tables, but each says so on stderr with the file, the
// line and the finding; a clean report gives no such warning (behaviour test on the mutated
// demo report testdata/mutated/swapped-digit, dl.csv line 9).
func TestQCErrorSaidWhenTuning(t *testing.T) {
	for _, args := range [][]string{
		{"tune", "testdata/mutated/swapped-digit"},
		{"rank", "testdata/mutated/swapped-digit"},
		{"tables", "testdata/mutated/swapped-digit"},
	} {
		code, _, stderr := runCLI(t, args...)
		if code != exitOK || !strings.Contains(stderr, "QC error in dl.csv line 9 (dl-rs-rising)") {
			t.Errorf("%v: exit %d, stderr %q; want exit 0 and the QC error named", args, code, stderr)
		}
	}
	if _, _, stderr := runCLI(t, "tune", "demo:tr3-black"); strings.Contains(stderr, "QC error") {
		t.Errorf("clean demo report: %q", stderr)
	}
}

// A tuning file whose pb pressure scale was edited by hand no longer honours the report's Pb:
// tune --tuning must not print it as fixed by the report's Pb, and says which Pb it gives. A
// published depth prints no interval request ("nothing tuned"). Behaviour test.
func TestTuningFileEditedScale(t *testing.T) {
	dir := t.TempDir()
	tf := filepath.Join(dir, "t.json")
	if code, _, e := runCLI(t, "tune", "demo:tr3-black", "--depth", "shape", "--save", tf); code != exitOK {
		t.Fatalf("tune --save: %s", e)
	}
	data, err := os.ReadFile(tf)
	if err != nil {
		t.Fatal(err)
	}
	var doc map[string]any
	if err := json.Unmarshal(data, &doc); err != nil {
		t.Fatal(err)
	}
	pb := doc["properties"].(map[string]any)["pb"].(map[string]any)["parameters"].(map[string]any)
	pb["multiplier"] = pb["multiplier"].(float64) * 1.1
	if data, err = json.Marshal(doc); err != nil {
		t.Fatal(err)
	}
	edited := filepath.Join(dir, "edited.json")
	if err := os.WriteFile(edited, data, 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, e := runCLI(t, "tune", "demo:tr3-black", "--tuning", edited)
	if code != exitOK {
		t.Fatalf("tune --tuning edited: exit %d: %s", code, e)
	}
	sec := out[strings.Index(out, "pb —"):strings.Index(out, "bo —")]
	if strings.Contains(sec, "Pb exact") || !strings.Contains(sec, "not the report's") {
		t.Errorf("edited pb scale printed as:\n%s", sec)
	}
	code, out, e = runCLI(t, "tune", "demo:tr3-black", "--depth", "published")
	if code != exitOK || strings.Contains(out, "interval not determined") || !strings.Contains(out, "nothing tuned") {
		t.Errorf("published depth: exit %d (%s), output:\n%s", code, e, out)
	}
}

// Odd oils (API 10 and 60, Rsb 10 and 3000 scf/STB, 60 and 350 °F) with every pb family, at
// the bubble point and above it: calc oil answers (exit 0), every value it gives is finite
// (the JSON encodes), and a property it cannot evaluate is null with a reason. Behaviour test.
func TestCalcOddOils(t *testing.T) {
	for _, pb := range []string{"standing", "vasquez-beggs", "glaso", "al-marhoun", "petrosky-farshad", "kartoatmodjo-schmidt", "lasater", "valko-mccain"} {
		for _, api := range []string{"10", "60"} {
			for _, rsb := range []string{"10", "3000"} {
				for _, temp := range []string{"60", "350"} {
					for _, p := range [][]string{nil, {"--pressure", "9000"}} {
						args := append([]string{"calc", "oil", "--api", api, "--gas-gravity", "0.75", "--temperature", temp, "--rsb", rsb, "--pb", pb, "--json"}, p...)
						code, out, e := runCLI(t, args...)
						if code != exitOK {
							t.Errorf("%v: exit %d: %s", args, code, e)
							continue
						}
						var m map[string]any
						if err := json.Unmarshal([]byte(out), &m); err != nil {
							t.Errorf("%v: %v", args, err)
							continue
						}
						why, _ := m["not_evaluated"].(map[string]any)
						for _, k := range []string{"bo_rb_stb", "co_per_psi", "oil_density_lbm_ft3", "oil_viscosity_cp"} {
							if m[k] == nil && len(why) == 0 {
								t.Errorf("%v: %s is null with no reason", args, k)
							}
						}
					}
				}
			}
		}
	}
}

// A cold, almost dead oil above its bubble point: Vasquez–Beggs' co is negative there
// (Vasquez and Beggs 1980: co = (−1433 + 5Rsb + 17.2T − 1180γg + 12.61API)/(10⁵p), here
// −1110/(10⁵p)), so Bo above Pb cannot be computed from it; calc oil says so beside Bo and co
// and names the other co families, and one of them gives the answer.
func TestCalcOilCoHint(t *testing.T) {
	base := []string{"calc", "oil", "--api", "10", "--gas-gravity", "0.75", "--temperature", "60", "--rsb", "10", "--pressure", "500", "--json"}
	code, out, e := runCLI(t, base...)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, e)
	}
	var m struct {
		Bo  *float64          `json:"bo_rb_stb"`
		Why map[string]string `json:"not_evaluated"`
	}
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	if m.Bo != nil || !strings.Contains(m.Why["Bo"], "vasquez-beggs compressibility") || !strings.Contains(m.Why["Bo"], "petrosky-farshad") {
		t.Errorf("Bo %v, reason %q", m.Bo, m.Why["Bo"])
	}
	code, out, e = runCLI(t, append(base, "--co", "petrosky-farshad")...)
	if code != exitOK {
		t.Fatalf("--co petrosky-farshad: exit %d: %s", code, e)
	}
	m.Bo, m.Why = nil, nil
	if err := json.Unmarshal([]byte(out), &m); err != nil {
		t.Fatal(err)
	}
	if m.Bo == nil || len(m.Why) != 0 {
		t.Errorf("--co petrosky-farshad: Bo %v, not evaluated %v", m.Bo, m.Why)
	}
}
