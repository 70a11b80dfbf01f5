package export

import (
	"bytes"
	"encoding/csv"
	"errors"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"labmatch/correlations"
	"labmatch/fit"
	"labmatch/lab"
)

const (
	// csvReadBackTol is the requirement for the CSV read back through the report
	// reader's unit parser.
	csvReadBackTol = 1e-9
	// deckDigitsTol: two decks of 7 significant digits each agree to 1e-6 after conversion.
	deckDigitsTol = 1e-6
)

func TestTableShape(t *testing.T) {
	for _, id := range testReports {
		t.Run(id, func(t *testing.T) {
			tu := loadTuned(t, id)
			tab := buildTable(t, tu, TableOptions{Points: 50, Salinity: DefaultSalinity})
			m := tu.m
			// The default highest pressure: the larger of 1.5·Pb and the highest lab pressure.
			if want := math.Max(1.5*m.Pb, MaxLabPressure(tu.r)); tab.PMax != want {
				t.Errorf("PMax %g, want %g", tab.PMax, want)
			}
			if tab.Rows[0].Pressure != tab.StdPressure || tab.Rows[len(tab.Rows)-1].Pressure != tab.PMax {
				t.Errorf("saturated rows from %g to %g, want %g to %g", tab.Rows[0].Pressure, tab.Rows[len(tab.Rows)-1].Pressure, tab.StdPressure, tab.PMax)
			}
			pbRows := 0
			for i, r := range tab.Rows {
				if r.Pressure == m.Pb {
					pbRows++
					// Bo at Pb equals the tuned Bob (the same model evaluation).
					if relDiff(r.Bo, m.Bob) > 1e-12 || r.Rs != m.Rsb {
						t.Errorf("row at Pb: Bo %.12g Rs %g, want the tuned Bob %.12g and Rsb %g", r.Bo, r.Rs, m.Bob, m.Rsb)
					}
					// Above Pb the report's oil keeps Rs = Rsb: its branch is flat in Rs.
					for _, s := range r.Branch {
						if s.Rs != m.Rsb {
							t.Errorf("Pb branch at %g psia: Rs %g, want Rsb %g", s.Pressure, s.Rs, m.Rsb)
						}
					}
				}
				if r.Extrapolated != (r.Pressure > m.Pb) {
					t.Errorf("row %d at %g psia: extrapolated %v", i, r.Pressure, r.Extrapolated)
				}
				if i > 0 {
					prev := tab.Rows[i-1]
					// Rs rises with pressure to Pb (and on, for the oils with more gas).
					if !(r.Pressure > prev.Pressure && r.Rs > prev.Rs) {
						t.Errorf("row %d: p %g Rs %g after p %g Rs %g", i, r.Pressure, r.Rs, prev.Pressure, prev.Rs)
					}
					if !(r.Bo > prev.Bo) {
						t.Errorf("row %d: saturated Bo %g not above %g", i, r.Bo, prev.Bo)
					}
				}
				if len(r.Branch) == 0 && (r.NoBranch == "" || i == len(tab.Rows)-1) {
					t.Errorf("row %d at %g psia has no undersaturated branch (reason %q)", i, r.Pressure, r.NoBranch)
				}
				p, bo := r.Pressure, r.Bo
				for _, s := range r.Branch {
					// In every branch pressure rises and Bo falls; Rs is the row's.
					if !(s.Pressure > p && s.Bo < bo) || s.Rs != r.Rs {
						t.Errorf("row %d branch: p %g Bo %g Rs %g after p %g Bo %g", i, s.Pressure, s.Bo, s.Rs, p, bo)
					}
					p, bo = s.Pressure, s.Bo
				}
			}
			if pbRows != 1 {
				t.Errorf("%d rows at Pb %g, want 1", pbRows, m.Pb)
			}
			// Bg falls with pressure; Z, Bg and μg are those of the model at each pressure.
			for i, g := range tab.Gas {
				if i > 0 && !(g.Pressure > tab.Gas[i-1].Pressure && g.Bg < tab.Gas[i-1].Bg) {
					t.Errorf("gas row %d: p %g Bg %g after p %g Bg %g", i, g.Pressure, g.Bg, tab.Gas[i-1].Pressure, tab.Gas[i-1].Bg)
				}
			}
			// The water table evaluates the catalog correlations at the tuned Pb.
			bw, _ := correlations.McCainWaterFVF(m.Pb, m.Oil.Temperature)
			if tab.Water.Bw != bw || tab.Water.RefPressure != m.Pb {
				t.Errorf("water Bw %g at %g, want %g at Pb %g", tab.Water.Bw, tab.Water.RefPressure, bw, m.Pb)
			}
		})
	}
}

func TestPressureGrid(t *testing.T) {
	// Step grid: atmospheric, multiples of the step, Pb inserted, the crowding 3000 dropped.
	g, err := pressureGrid(14.696, 4000, 2980, 500, 0)
	if err != nil {
		t.Fatal(err)
	}
	want := []float64{14.696, 500, 1000, 1500, 2000, 2500, 2980, 3500, 4000}
	if len(g) != len(want) {
		t.Fatalf("grid %v, want %v", g, want)
	}
	for i := range g {
		if g[i] != want[i] {
			t.Fatalf("grid %v, want %v", g, want)
		}
	}
	// Points grid: n evenly spaced values plus Pb.
	g, err = pressureGrid(14.696, 3014.696, 1234, 0, 11)
	if err != nil {
		t.Fatal(err)
	}
	// 11 values 300 psi apart, Pb = 1234 taking the place of 1214.696 (within 0.2 of a spacing).
	if len(g) != 11 || g[0] != 14.696 || g[10] != 3014.696 || g[4] != 1234 || g[3] != 914.696 {
		t.Errorf("points grid %v", g)
	}
	if _, err := pressureGrid(14.696, 1e6, 2000, 10, 0); err == nil {
		t.Error("a step making 100,000 rows: no error")
	}
}

func TestTableOptionErrors(t *testing.T) {
	tu := loadTuned(t, "tr3-black")
	for name, o := range map[string]TableOptions{
		"pmax below Pb":  {PMax: 1000},
		"negative step":  {Step: -5},
		"one point":      {Points: 1},
		"salty":          {Salinity: 40},
		"too many rows":  {Points: MaxPoints + 1},
		"negative pmax":  {PMax: -1},
		"infinite pmax":  {PMax: math.Inf(1)},
		"step too small": {Step: 1},
	} {
		if _, err := BuildTable(tu.m, tu.src, o); err == nil {
			t.Errorf("%s: no error", name)
		}
	}
}

func TestCSVReadsBack(t *testing.T) {
	for _, id := range testReports {
		tu := loadTuned(t, id)
		tab := buildTable(t, tu, TableOptions{Points: 12, Salinity: 2})
		for _, u := range []Units{Field, Metric} {
			t.Run(id+"/"+string(u), func(t *testing.T) {
				var b bytes.Buffer
				if err := WriteCSV(&b, tab, u); err != nil {
					t.Fatal(err)
				}
				rows := readTableCSV(t, b.Bytes())
				var want [][]float64
				for _, r := range tab.Rows {
					want = append(want, expectRow(t, tab, r.Pressure, r.State))
					for _, s := range r.Branch {
						want = append(want, expectRow(t, tab, r.Pressure, s))
					}
				}
				if len(rows) != len(want) {
					t.Fatalf("%d rows read back, want %d", len(rows), len(want))
				}
				for i := range rows {
					for j := range want[i] {
						if relDiff(rows[i].vals[j], want[i][j]) > csvReadBackTol && math.Abs(rows[i].vals[j]-want[i][j]) > 1e-300 {
							t.Fatalf("row %d column %s: read %.15g, table %.15g", i, csvColumns[j].name, rows[i].vals[j], want[i][j])
						}
					}
				}
				// Row kinds and the extrapolated mark.
				k := 0
				for _, r := range tab.Rows {
					if rows[k].kind != "saturated" || rows[k].extrapolated != r.Extrapolated {
						t.Errorf("line %d: %s extrapolated=%v, want saturated %v", k, rows[k].kind, rows[k].extrapolated, r.Extrapolated)
					}
					k += 1 + len(r.Branch)
				}
			})
		}
	}
}

func expectRow(t *testing.T, tab *Table, sat float64, s fit.State) []float64 {
	w, err := WaterAt(s.Pressure, tab.Temperature, tab.Water.Salinity)
	if err != nil {
		t.Fatal(err)
	}
	return []float64{sat, s.Pressure, s.Rs, s.Bo, s.Co, s.OilViscosity, s.OilDensity, s.Z, s.Bg, s.GasViscosity, w.Bw, w.Cw, w.Viscosity}
}

type csvRow struct {
	kind         string
	vals         []float64 // field units, in csvColumns order
	extrapolated bool
}

// readTableCSV reads a table CSV as the report reader would: "#" comments skipped, header
// cells "name [unit]", every value converted to field units by lab.ToField.
func readTableCSV(t *testing.T, data []byte) []csvRow {
	t.Helper()
	var body []string
	for _, l := range strings.Split(string(data), "\n") {
		if !strings.HasPrefix(l, "#") && l != "" {
			body = append(body, l)
		}
	}
	recs, err := csv.NewReader(strings.NewReader(strings.Join(body, "\n"))).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	head := recs[0]
	if len(head) != len(csvColumns)+2 || head[0] != "row" || head[len(head)-1] != "extrapolated" {
		t.Fatalf("header %v", head)
	}
	units := make([]string, len(csvColumns))
	for j, col := range csvColumns {
		cell := head[j+1]
		i := strings.IndexByte(cell, '[')
		if i < 0 || !strings.HasSuffix(cell, "]") || strings.TrimSpace(cell[:i]) != col.name {
			t.Fatalf("header cell %q, want %q [unit]", cell, col.name)
		}
		units[j] = cell[i+1 : len(cell)-1]
		if _, err := lab.CanonicalUnit(col.q, units[j]); err != nil {
			t.Fatalf("header %q: the report reader does not know the unit: %v", cell, err)
		}
	}
	var out []csvRow
	for _, rec := range recs[1:] {
		r := csvRow{kind: rec[0], extrapolated: rec[len(rec)-1] == "yes"}
		for j, col := range csvColumns {
			v, err := strconv.ParseFloat(rec[j+1], 64)
			if err != nil {
				t.Fatal(err)
			}
			f, err := lab.ToField(col.q, units[j], v)
			if err != nil {
				t.Fatal(err)
			}
			r.vals = append(r.vals, f)
		}
		out = append(out, r)
	}
	return out
}

// parsedDeck is a deck read back by the test parser: keyword → records → numbers.
type parsedDeck struct {
	order   []string
	records map[string][][]float64
}

// parseDeck reads the keyword layout: "--" comments, a keyword on its own line, records
// ending in "/", PVTO ending with an empty record.
func parseDeck(t *testing.T, text string) parsedDeck {
	t.Helper()
	d := parsedDeck{records: map[string][][]float64{}}
	kw := ""
	var cur []float64
	for n, line := range strings.Split(text, "\n") {
		if i := strings.Index(line, "--"); i >= 0 {
			line = line[:i]
		}
		f := strings.Fields(line)
		if len(f) == 0 {
			continue
		}
		if len(f) == 1 && f[0] != "/" && strings.ToUpper(f[0]) == f[0] && (f[0][0] < '0' || f[0][0] > '9') {
			if kw != "" {
				t.Fatalf("line %d: keyword %s before %s ended", n+1, f[0], kw)
			}
			kw = f[0]
			d.order = append(d.order, kw)
			continue
		}
		for _, tok := range f {
			if tok == "/" {
				if kw == "PVTO" && len(cur) == 0 {
					kw = ""
					continue
				}
				d.records[kw] = append(d.records[kw], cur)
				cur = nil
				if kw != "PVTO" {
					kw = ""
				}
				continue
			}
			v, err := strconv.ParseFloat(tok, 64)
			if err != nil {
				t.Fatalf("line %d: %q is not a number", n+1, tok)
			}
			cur = append(cur, v)
		}
	}
	if kw != "" || cur != nil {
		t.Fatalf("keyword %s not ended", kw)
	}
	return d
}

func TestDeckReadsBack(t *testing.T) {
	for _, id := range testReports {
		t.Run(id, func(t *testing.T) {
			tu := loadTuned(t, id)
			tab := buildTable(t, tu, TableOptions{Salinity: DefaultSalinity})
			decks := map[Units]parsedDeck{}
			for _, u := range []Units{Field, Metric} {
				var b bytes.Buffer
				if err := WriteDeck(&b, tab, u); err != nil {
					t.Fatal(err)
				}
				text := b.String()
				if !strings.Contains(text, "RUNSPEC section must declare "+strings.ToUpper(string(u))) {
					t.Errorf("%s deck: the header does not name the unit keyword", u)
				}
				d := parseDeck(t, text)
				if strings.Join(d.order, " ") != "PVTO PVDG PVTW DENSITY" {
					t.Fatalf("%s deck keywords %v, want PVTO PVDG PVTW DENSITY and nothing else", u, d.order)
				}
				pvto := d.records["PVTO"]
				if len(pvto) != len(tab.Rows) {
					t.Fatalf("%s: %d PVTO records, want %d", u, len(pvto), len(tab.Rows))
				}
				for i, rec := range pvto {
					// Rs, then (P, Bo, μ) triples: the saturated row and its branch.
					if (len(rec)-1)%3 != 0 || (len(rec)-1)/3 != 1+len(tab.Rows[i].Branch) {
						t.Fatalf("%s: PVTO record %d has %d numbers", u, i+1, len(rec))
					}
					if i > 0 {
						prev := pvto[i-1]
						if !(rec[0] > prev[0] && rec[1] > prev[1] && rec[2] > prev[2]) {
							t.Errorf("%s: PVTO record %d: Rs, Pb, Bo %v not above %v", u, i+1, rec[:3], prev[:3])
						}
					}
					for k := 4; k < len(rec); k += 3 {
						if !(rec[k] > rec[k-3] && rec[k+1] < rec[k-2] && rec[k+2] > rec[k-1]) {
							t.Errorf("%s: PVTO record %d branch row %d: P, Bo, μ %v after %v", u, i+1, (k-1)/3, rec[k:k+3], rec[k-3:k])
						}
					}
				}
				pvdg := d.records["PVDG"][0]
				if len(pvdg) != 3*len(tab.Gas) {
					t.Fatalf("%s: PVDG has %d numbers, want %d", u, len(pvdg), 3*len(tab.Gas))
				}
				for k := 3; k < len(pvdg); k += 3 {
					if !(pvdg[k] > pvdg[k-3] && pvdg[k+1] < pvdg[k-2]) {
						t.Errorf("%s: PVDG row %d: P, Bg %v after %v", u, k/3+1, pvdg[k:k+2], pvdg[k-3:k-1])
					}
				}
				if len(d.records["PVTW"][0]) != 5 || len(d.records["DENSITY"][0]) != 3 {
					t.Errorf("%s: PVTW %v, DENSITY %v", u, d.records["PVTW"], d.records["DENSITY"])
				}
				decks[u] = d
			}
			// The metric and field decks describe the same fluid: metric converted to field
			// (NIST SP 811 factors, via the report reader's units) equals the field deck.
			f, m := decks[Field], decks[Metric]
			conv := func(q lab.Quantity, unit string, v float64) float64 {
				x, err := lab.ToField(q, unit, v)
				if err != nil {
					t.Fatal(err)
				}
				return x
			}
			same := func(what string, field, metricInField float64) {
				if relDiff(metricInField, field) > deckDigitsTol {
					t.Errorf("%s: field %.8g, metric %.8g in field units", what, field, metricInField)
				}
			}
			for i, rec := range f.records["PVTO"] {
				mr := m.records["PVTO"][i]
				same("Rs", rec[0]*1000, conv(lab.GOR, "sm3/sm3", mr[0]))
				for k := 1; k < len(rec); k += 3 {
					same("P", rec[k], conv(lab.Pressure, "bara", mr[k]))
					same("Bo", rec[k+1], mr[k+1])
					same("μo", rec[k+2], mr[k+2])
				}
			}
			for k, v := range f.records["PVDG"][0] {
				mv := m.records["PVDG"][0][k]
				switch k % 3 {
				case 0:
					same("PVDG P", v, conv(lab.Pressure, "bara", mv))
				case 1:
					same("Bg", conv(lab.GasFVF, "rb/Mscf", v), mv)
				case 2:
					same("μg", v, mv)
				}
			}
			fw, mw := f.records["PVTW"][0], m.records["PVTW"][0]
			same("Pref", fw[0], conv(lab.Pressure, "bara", mw[0]))
			same("Bw", fw[1], mw[1])
			same("cw", fw[2], conv(lab.Compressibility, "1/bar", mw[2]))
			same("μw", fw[3], mw[3])
			same("viscosibility", fw[4], conv(lab.Compressibility, "1/bar", mw[4]))
			for k, v := range f.records["DENSITY"][0] {
				same("density", v, conv(lab.Density, "kg/m3", m.records["DENSITY"][0][k]))
			}
			// DENSITY makes the simulator's reservoir oil density equal the tool's:
			// (ρo,sc + Rs·ρg,sc/5.614583)/Bo at Pb.
			d := f.records["DENSITY"][0]
			rho := (d[0] + tu.m.Rsb*d[2]/5.614583) / tu.m.Bob
			st, _ := tu.m.At(tu.m.Pb)
			if relDiff(rho, st.OilDensity) > deckDigitsTol {
				t.Errorf("oil density at Pb from DENSITY %.7g, tool %.7g lbm/ft3", rho, st.OilDensity)
			}
		})
	}
}

func TestDeckRefusesBrokenRules(t *testing.T) {
	tu := loadTuned(t, "tr3-black")
	base := buildTable(t, tu, TableOptions{Points: 10, Salinity: DefaultSalinity})
	clone := func() *Table {
		c := *base
		c.Rows = make([]SatRow, len(base.Rows))
		for i, r := range base.Rows {
			c.Rows[i] = r
			c.Rows[i].Branch = append([]fit.State(nil), r.Branch...)
		}
		c.Gas = append([]GasRow(nil), base.Gas...)
		return &c
	}
	cases := []struct {
		name    string
		break_  func(*Table)
		keyword string
		record  int
		reason  string
	}{
		{"Bo falling with Rs", func(c *Table) { c.Rows[4].Bo = c.Rows[3].Bo * 0.999 }, "PVTO", 5, "Bo must rise with Rs"},
		{"Rs repeated", func(c *Table) { c.Rows[2].Rs = c.Rows[1].Rs }, "PVTO", 3, "Rs must rise"},
		{"Bo rising in a branch", func(c *Table) { c.Rows[6].Branch[1].Bo = c.Rows[6].Branch[0].Bo * 1.001 }, "PVTO", 7, "Bo must fall"},
		{"viscosity falling in a branch", func(c *Table) {
			c.Rows[2].Branch[2].OilViscosity = c.Rows[2].Branch[1].OilViscosity * 0.99
		}, "PVTO", 3, "viscosity must rise"},
		{"Bg rising", func(c *Table) { c.Gas[5].Bg = c.Gas[4].Bg * 1.01 }, "PVDG", 0, "Bg must fall"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			tab := clone()
			c.break_(tab)
			var b bytes.Buffer
			err := WriteDeck(&b, tab, Field)
			var re *RuleError
			if !errors.As(err, &re) || !errors.Is(err, ErrRule) {
				t.Fatalf("error %v, want a *RuleError", err)
			}
			if re.Keyword != c.keyword || re.Record != c.record || !strings.Contains(re.Reason, c.reason) || re.Line == 0 || re.Row == 0 {
				t.Errorf("error %v: want %s record %d, reason with %q", err, c.keyword, c.record, c.reason)
			}
			if b.Len() != 0 {
				t.Errorf("%d bytes written for a refused deck", b.Len())
			}
			// The row and line named are where the row would have been written.
			var good bytes.Buffer
			if err := WriteDeck(&good, base, Field); err != nil {
				t.Fatal(err)
			}
			lines := strings.Split(good.String(), "\n")
			if re.Line > len(lines) || !strings.Contains(re.Where, "P "+fieldAt(lines[re.Line-1], re.Keyword)) {
				t.Errorf("line %d of the good deck %q does not hold the row %q", re.Line, lines[re.Line-1], re.Where)
			}
		})
	}
	// The same check runs on the numbers as written: Bo equal to 7 digits is refused.
	tab := clone()
	tab.Rows[4].Bo = tab.Rows[3].Bo * (1 + 1e-9)
	if err := WriteDeck(&bytes.Buffer{}, tab, Field); !errors.Is(err, ErrRule) {
		t.Errorf("Bo rising by 1e-9 (equal as written): %v, want a rule error", err)
	}
}

func TestSaveTableAtomic(t *testing.T) {
	tu := loadTuned(t, "tr3-black")
	tab := buildTable(t, tu, TableOptions{Points: 10, Salinity: DefaultSalinity})
	dir := t.TempDir()
	path := filepath.Join(dir, "pvt.inc")
	if err := os.WriteFile(path, []byte("old\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	// An existing file needs force.
	if err := SaveTable(path, tab, Deck, Field, false); !errors.Is(err, fs.ErrExist) {
		t.Errorf("save over an existing file without force: %v, want fs.ErrExist", err)
	}
	// A write that fails (the deck is refused) leaves the old file as it was, and no
	// temporary file behind.
	bad := *tab
	bad.Gas = append([]GasRow(nil), tab.Gas...)
	bad.Gas[3].Bg = bad.Gas[2].Bg
	if err := SaveTable(path, &bad, Deck, Field, true); !errors.Is(err, ErrRule) {
		t.Errorf("refused deck: %v", err)
	}
	if b, _ := os.ReadFile(path); string(b) != "old\n" {
		t.Errorf("the old file was changed: %q", b)
	}
	// So does a write into a folder that does not exist.
	if err := SaveTable(filepath.Join(dir, "missing", "pvt.inc"), tab, Deck, Field, true); err == nil {
		t.Error("write into a missing folder: no error")
	}
	if err := SaveTable(path, tab, Deck, Field, true); err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(path)
	if !bytes.HasPrefix(b, []byte("-- black-oil tables")) {
		t.Errorf("forced save did not write the deck: %.40q", b)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("folder holds %d entries, want the deck alone", len(entries))
	}
}

func TestTablesFromTuningFileAlone(t *testing.T) {
	for _, id := range testReports {
		t.Run(id, func(t *testing.T) {
			tu := loadTuned(t, id)
			path := filepath.Join(t.TempDir(), "tuning.json")
			if err := SaveTuning(path, NewTuningFile("labmatch test", tu.r, tu.results, fit.Options{}, nil), false); err != nil {
				t.Fatal(err)
			}
			tf, err := LoadTuning(path)
			if err != nil {
				t.Fatal(err)
			}
			m, _, err := tf.Model()
			if err != nil {
				t.Fatal(err)
			}
			a := buildTable(t, tu, TableOptions{Points: 15, Salinity: 1})
			b, err := BuildTable(m, tu.src, TableOptions{Points: 15, Salinity: 1, MaxLabPressure: tf.Fluid.MaxLabPressure})
			if err != nil {
				t.Fatal(err)
			}
			for i := range a.Rows {
				x, y := a.Rows[i], b.Rows[i]
				if relDiff(y.Bo, x.Bo) > 1e-12 || relDiff(y.Rs, x.Rs) > 1e-12 || relDiff(y.Bg, x.Bg) > 1e-12 || relDiff(y.OilViscosity, x.OilViscosity) > 1e-12 {
					t.Fatalf("row %d from the tuning file %+v, from the report %+v", i, y.State, x.State)
				}
			}
		})
	}
	// A tuning file without the fluid record says what to do.
	if _, _, err := (TuningFile{}).Model(); !errors.Is(err, ErrNoFluid) {
		t.Errorf("no fluid record: %v", err)
	}
}

// fieldAt returns the pressure cell of a deck data line: the first of PVDG, the second of a
// saturated PVTO line, the first of a branch line (whose Rs cell is blank).
func fieldAt(line, keyword string) string {
	f := strings.Fields(strings.TrimSuffix(strings.TrimSpace(line), "/"))
	if keyword == "PVTO" && len(f) == 4 {
		return f[1]
	}
	return f[0]
}

func TestDeckRefusesNegativeCompressibility(t *testing.T) {
	// A hand-edited tuning whose co shift makes the tuned compressibility negative: Bo rises
	// along the undersaturated branches and the deck is refused at the first such row,
	// naming the co family.
	tu := loadTuned(t, "tr3-black")
	res := map[fit.PropertyID]fit.Result{}
	for p, r := range tu.results {
		res[p] = r
	}
	co := res[fit.Co]
	co.Depth, co.Shifted, co.Params.Shift = fit.DepthShape, true, -5e-5
	res[fit.Co] = co
	m, err := fit.NewModel(tu.ds, res, fit.Options{})
	if err != nil {
		t.Fatal(err)
	}
	tab, err := BuildTable(m, NewSource("labmatch test", tu.ds.Name, "", "", m, res), TableOptions{MaxLabPressure: MaxLabPressure(tu.r)})
	if err != nil {
		t.Fatal(err)
	}
	var re *RuleError
	if err := WriteDeck(&bytes.Buffer{}, tab, Field); !errors.As(err, &re) || !strings.Contains(re.Reason, "Bo must fall") || !strings.Contains(re.Reason, "co family") {
		t.Errorf("negative co: %v, want a refusal naming the co family", err)
	}
}
