package export

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// The simulator check: the exported PROPS include runs in OPM Flow inside a small depletion
// model of our own (3×3×1 cells, one producer in the middle), and what Flow reports agrees
// with the tool's own numbers: the initial oil and dissolved gas in place, the producing GOR
// while the reservoir is above Pb, and the pressure at which free gas appears. Skipped only
// when the flow binary is absent (Debian package libopm-simulators-bin); the summary is read
// with the Python reader of python3-opm-common.

const (
	// tolInPlace: Flow interpolates 1/Bo linearly between table nodes; over a branch spacing
	// of a few hundred psi the curvature error is far below 0.1 %.
	tolInPlace = 1e-3
	// tolGOR: the deck holds Rs to 7 significant digits.
	tolGOR = 1e-5
	// tolFreeGas: the pressure where free gas appears, from the first two steps with gas
	// saturation extrapolated to zero, against the tuned Pb (one step moves 1 % of Pb).
	tolFreeGas = 2e-3
	flowSwc    = 0.2 // connate water saturation of the model
)

// depletionDeck is the model; the fields are filled per unit system.
const depletionDeck = `-- labmatch test: depletion of a 3x3x1 box below its bubble point
RUNSPEC
TITLE
labmatch depletion check
DIMENS
 3 3 1 /
OIL
WATER
GAS
DISGAS
%[1]s
TABDIMS
 1 1 20 %[2]d 1 %[3]d /
EQLDIMS
 1 /
WELLDIMS
 1 1 1 1 /
START
 1 JAN 2030 /
UNIFOUT
GRID
DX
 9*%[4]g /
DY
 9*%[4]g /
DZ
 9*%[5]g /
TOPS
 9*%[6]g /
PORO
 9*0.2 /
PERMX
 9*500 /
PERMY
 9*500 /
PERMZ
 9*50 /
PROPS
INCLUDE
 'PVT.INC' /
ROCK
 %[7]g 0 /
SWOF
 0.2 0 1 0
 1.0 1 0 0 /
SGOF
 0   0 1 0
 0.8 1 0 0 /
SOLUTION
EQUIL
 %[8]g %[7]g %[9]g 0 %[10]g 0 1 1* 0 /
RSVD
 %[10]g %[11]s
 %[9]g %[11]s /
SUMMARY
FOIP
FGIPL
FGIPG
FGOR
FPR
BPR
 2 2 1 /
/
BGSAT
 2 2 1 /
/
SCHEDULE
WELSPECS
 'PROD' 'G' 2 2 1* 'OIL' /
/
COMPDAT
 'PROD' 2 2 1 1 'OPEN' 1* 1* %[12]g /
/
WCONPROD
 'PROD' 'SHUT' 'ORAT' %[13]g 4* %[14]g /
/
TSTEP
 1 /
WCONPROD
 'PROD' 'OPEN' 'ORAT' %[13]g 4* %[14]g /
/
TSTEP
 %[15]d*1 /
END
`

// readSummary is run with the Python of python3-opm-common; it prints the vectors as JSON.
const readSummary = `
import json, sys
from opm.io.ecl import ESmry
s = ESmry(sys.argv[1])
print(json.dumps({k: [float(x) for x in s[k]] for k in s.keys()}))
`

type flowCase struct {
	units Units
	// geometry, in the deck's length unit (ft or m)
	dx, dz, top float64
	psiPer      float64 // deck pressure unit in psi (1 or 14.5038)
	lengthCubed float64 // reservoir volume per length³, in the FVF's reservoir unit (rb/ft³ or 1)
	gorScale    float64 // Rs in the deck's GOR unit per scf/STB
	volumeName  string
}

var flowCases = []flowCase{
	{units: Field, dx: 100, dz: 20, top: 8000, psiPer: 1, lengthCubed: 1 / 5.6145833333, gorScale: 1e-3, volumeName: "STB"},
	{units: Metric, dx: 30, dz: 6, top: 2400, psiPer: 1e5 / 6894.757293168, lengthCubed: 1, gorScale: 1 / 5.6145833333, volumeName: "sm3"},
}

func TestFlowDepletion(t *testing.T) {
	flow, err := exec.LookPath("flow")
	if err != nil {
		t.Skip("flow (OPM Flow, Debian package libopm-simulators-bin) is not installed: the simulator check is skipped")
	}
	py := pythonWithOPM(t)
	for _, id := range testReports {
		tu := loadTuned(t, id)
		tab := buildTable(t, tu, TableOptions{Salinity: DefaultSalinity})
		for _, fc := range flowCases {
			t.Run(id+"/"+string(fc.units), func(t *testing.T) {
				runDepletion(t, flow, py, tu, tab, fc)
			})
		}
	}
}

// pythonWithOPM finds a Python that imports opm.io.ecl (Debian's python3 first).
func pythonWithOPM(t *testing.T) string {
	for _, py := range []string{"/usr/bin/python3", "python3"} {
		if exec.Command(py, "-c", "import opm.io.ecl").Run() == nil {
			return py
		}
	}
	t.Fatal("flow is installed but no python3 imports opm.io.ecl: install python3-opm-common to read flow's summary")
	return ""
}

func runDepletion(t *testing.T, flow, py string, tu tuned, tab *Table, fc flowCase) {
	dir := t.TempDir()
	inc, err := RenderTable(tab, Deck, fc.units)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "PVT.INC"), inc, 0o644); err != nil {
		t.Fatal(err)
	}
	m := tu.m
	// The tool's numbers, field units.
	piPsia := 1.25 * m.Pb
	pi := math.Round(piPsia/fc.psiPer*100) / 100 // as written in the deck
	piPsia = pi * fc.psiPer
	si, err := m.At(piPsia)
	if err != nil {
		t.Fatal(err)
	}
	sb, err := m.At(m.Pb)
	if err != nil {
		t.Fatal(err)
	}
	pv := 9 * fc.dx * fc.dx * fc.dz * 0.2 * fc.lengthCubed // reservoir volume (rb or m³)
	ooip := pv * (1 - flowSwc) / si.Bo                     // STB or sm³
	rsb := m.Rsb * fc.gorScale                             // deck GOR unit
	dissolved := ooip * rsb                                // Mscf or sm³
	// Produce to Pb in about 25 days, then 20 days below it.
	toPb := ooip * (sb.Bo - si.Bo) / sb.Bo
	rate := math.Round(toPb/25*1000) / 1000
	nrpvt, nppvt := len(tab.Rows), len(tab.Gas)
	for _, r := range tab.Rows {
		nppvt = max(nppvt, len(r.Branch)+1)
	}
	datum := fc.top + fc.dz/2
	deck := fmt.Sprintf(depletionDeck, strings.ToUpper(string(fc.units)), nppvt, nrpvt, fc.dx, fc.dz, fc.top, pi,
		datum, fc.top+20*fc.dz, fc.top-20*fc.dz, num(rsb, 7), 0.1*fc.dz/20*fc.dx/10, rate, math.Round(100/fc.psiPer), 45)
	if err := os.WriteFile(filepath.Join(dir, "CASE.DATA"), []byte(deck), 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 3*time.Minute)
	defer cancel()
	// The shut-in first step changes nothing, which trips the PID step control of flow 2022.10
	// (an assertion); step by Newton iteration counts instead.
	cmd := exec.CommandContext(ctx, flow, "CASE.DATA", "--output-dir=out", "--time-step-control=iterationcount")
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "OMP_NUM_THREADS=1")
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("flow failed: %v\n%s", err, tail(string(out), 40))
	}
	// The message summary at the end of the PRT counts errors and problems; all must be 0,
	// and a warning is shown with its text.
	prt, err := os.ReadFile(filepath.Join(dir, "out", "CASE.PRT"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(prt), "\n")
	for i, l := range lines {
		f := strings.Fields(l)
		if len(f) == 2 && (f[0] == "Errors" || f[0] == "Bugs" || f[0] == "Problems") && f[1] != "0" {
			t.Errorf("flow's PRT reports %s %s", f[0], f[1])
		}
		if strings.HasPrefix(l, "Warning:") || strings.HasPrefix(l, "Error:") || strings.HasPrefix(l, "Problem:") {
			t.Logf("flow's PRT: %s %s", l, strings.TrimSpace(strings.Join(lines[i+1:min(i+3, len(lines))], " ")))
		}
	}
	js, err := exec.Command(py, "-c", readSummary, filepath.Join(dir, "out", "CASE.SMSPEC")).Output()
	if err != nil {
		t.Fatalf("reading the summary: %v", err)
	}
	var v map[string][]float64
	if err := json.Unmarshal(js, &v); err != nil {
		t.Fatal(err)
	}
	bpr, sg, gor := v["BPR:2,2,1"], v["BGSAT:2,2,1"], v["FGOR"]
	if len(bpr) < 10 || len(sg) != len(bpr) || len(gor) != len(bpr) || len(v["FOIP"]) != len(bpr) {
		t.Fatalf("summary vectors missing or short: %d pressures", len(bpr))
	}
	pbDeck := m.Pb / fc.psiPer

	// 1. Initial oil and dissolved gas in place (the first step is shut in).
	gotOOIP, gotGas := v["FOIP"][0], v["FGIPL"][0]
	t.Logf("initial oil in place: flow %.6g %s, tool %.6g (%+.4f %%); dissolved gas: flow %.6g, tool %.6g (%+.4f %%)",
		gotOOIP, fc.volumeName, ooip, 100*(gotOOIP/ooip-1), gotGas, dissolved, 100*(gotGas/dissolved-1))
	if relDiff(gotOOIP, ooip) > tolInPlace {
		t.Errorf("initial oil in place: flow %.6g, tool %.6g", gotOOIP, ooip)
	}
	if relDiff(gotGas, dissolved) > tolInPlace {
		t.Errorf("initial dissolved gas: flow %.6g, tool %.6g", gotGas, dissolved)
	}
	// 2. Producing GOR above Pb equals Rsb.
	first := -1
	for i := range sg {
		if sg[i] > 0 {
			first = i
			break
		}
	}
	if first < 3 || first > len(sg)-3 {
		t.Fatalf("free gas appears at step %d of %d: the depletion does not cross Pb in the run", first, len(sg))
	}
	n := 0
	for i := 1; i < first-1; i++ {
		if relDiff(gor[i], rsb) > tolGOR {
			t.Errorf("step %d at %.5g: producing GOR %.7g, want Rsb %.7g", i, bpr[i], gor[i], rsb)
		}
		n++
	}
	t.Logf("producing GOR above Pb: %.7g over %d steps; Rsb %.7g", gor[1], n, rsb)
	// 3. The pressure at which free gas appears.
	k := first
	p0 := bpr[k] + sg[k]*(bpr[k]-bpr[k+1])/(sg[k+1]-sg[k])
	t.Logf("free gas appears between %.6g and %.6g; extrapolated to Sg = 0 at %.6g; tool Pb %.6g (%+.4f %%)",
		bpr[k-1], bpr[k], p0, pbDeck, 100*(p0/pbDeck-1))
	if !(bpr[k] <= pbDeck*(1+1e-4) && bpr[k-1] >= pbDeck*(1-1e-4)) {
		t.Errorf("free gas appears between %.6g and %.6g, not around the tuned Pb %.6g", bpr[k-1], bpr[k], pbDeck)
	}
	if relDiff(p0, pbDeck) > tolFreeGas {
		t.Errorf("free gas extrapolates to %.6g, tuned Pb %.6g", p0, pbDeck)
	}
}

func tail(s string, n int) string {
	lines := strings.Split(s, "\n")
	if len(lines) > n {
		lines = lines[len(lines)-n:]
	}
	return strings.Join(lines, "\n")
}
