package correlations

import (
	"math"
	"strings"
	"testing"
)

// TestOilCatalog checks that every oil family has a catalog entry with a reference and data
// ranges, that ids are unique per property, and that the range inputs use the names of the
// design.
func TestOilCatalog(t *testing.T) {
	ids := map[Property][]string{}
	for _, f := range SolutionGasFamilies() {
		ids[SolutionGas] = append(ids[SolutionGas], f.ID)
	}
	for _, f := range OilFVFFamilies() {
		ids[OilFVF] = append(ids[OilFVF], f.ID)
	}
	for _, f := range CompressibilityFamilies() {
		p := Compressibility
		if f.ID == "mccain-rollins-villena" {
			p = CoBelowPb
		}
		ids[p] = append(ids[p], f.ID)
	}
	// DESIGN.md §4.
	want := map[Property]int{SolutionGas: 8, OilFVF: 7, Compressibility: 3, CoBelowPb: 1}
	names := map[string]string{"API": "°API", "gas gravity": "", "temperature": "°F", "Rsb": "scf/STB", "Pb": "psia", "p": "psia"}
	for p, n := range want {
		if len(ids[p]) != n {
			t.Errorf("%s: %d families, want %d", p, len(ids[p]), n)
		}
		seen := map[string]bool{}
		for _, id := range ids[p] {
			if seen[id] {
				t.Errorf("%s: duplicate id %q", p, id)
			}
			seen[id] = true
			e, err := Lookup(p, id)
			if err != nil {
				t.Errorf("%s %s: %v", p, id, err)
				continue
			}
			if e.Reference == "" || e.Authors == "" || e.Year < 1940 || len(e.Ranges) < 4 {
				t.Errorf("%s %s: incomplete entry %+v", p, id, e)
			}
			for _, r := range e.Ranges {
				if u, ok := names[r.Input]; !ok || u != r.Unit || !(r.Min <= r.Max) {
					t.Errorf("%s %s: bad range %+v", p, id, r)
				}
			}
		}
		if got := IDs(p); strings.Join(got, ",") != strings.Join(ids[p], ",") {
			t.Errorf("%s: catalog ids %v, family ids %v", p, got, ids[p])
		}
	}
	// The separator-gas convention of Vasquez and Beggs is stated.
	e, _ := Lookup(SolutionGas, "vasquez-beggs")
	if !strings.Contains(e.Convention, "5.912e−5") || !strings.Contains(e.Convention, "114.7") {
		t.Errorf("vasquez-beggs convention %q", e.Convention)
	}
	// Lookup of the below-Pb family through the compressibility list.
	if f, err := CompressibilityByID("mccain-rollins-villena"); err != nil || f.Co == nil {
		t.Errorf("mccain-rollins-villena: %v", err)
	}
}

// TestCatalogCheckFlagsGlaso checks the warning for an oil lighter than Glasø's data (DESIGN.md
// §4: the tool warns when the oil lies outside the original data set).
func TestCatalogCheckFlagsGlaso(t *testing.T) {
	e, err := Lookup(SolutionGas, "glaso")
	if err != nil {
		t.Fatal(err)
	}
	msgs := e.Check(map[string]float64{"API": 62, "gas gravity": 0.8, "temperature": 200, "Rsb": 500})
	if len(msgs) != 1 || !strings.Contains(msgs[0], "API 62 is above") || !strings.Contains(msgs[0], "Glasø's data") {
		t.Errorf("Check = %q", msgs)
	}
	if msgs := e.Check(map[string]float64{"API": 35, "temperature": math.NaN()}); len(msgs) != 0 {
		t.Errorf("in-range oil flagged: %q", msgs)
	}
}
