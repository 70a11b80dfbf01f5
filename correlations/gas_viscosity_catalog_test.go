package correlations

import (
	"errors"
	"slices"
	"strings"
	"testing"
)

// allowedInputs are the Range input names and units that the rest of labmatch looks up.
var allowedInputs = map[string]string{
	"API": "°API", "gas gravity": "", "temperature": "°F", "Rs": "scf/STB", "p": "psia",
	"Tpr": "", "Ppr": "", "mu_dead": "cP",
}

func TestGasAndViscosityCatalog(t *testing.T) {
	// The ids of DESIGN.md §4, in order.
	want := map[Property][]string{
		PseudoCritical: {"sutton", "standing"},
		SourCorrection: {"wichert-aziz"},
		GasZ:           {"dak", "hall-yarborough"},
		GasViscosity:   {"lee-gonzalez-eakin"},
		DeadViscosity:  {"beal", "beggs-robinson", "glaso", "egbogah-ng", "kartoatmodjo-schmidt", "petrosky-farshad"},
		SatViscosity:   {"chew-connally", "beggs-robinson", "kartoatmodjo-schmidt", "petrosky-farshad"},
		UnderViscosity: {"vasquez-beggs", "beal", "kartoatmodjo-schmidt", "petrosky-farshad"},
	}
	for p, ids := range want {
		if got := IDs(p); !slices.Equal(got, ids) {
			t.Errorf("IDs(%s) = %v, want %v", p, got, ids)
		}
		for _, id := range ids {
			e, err := Lookup(p, id)
			if err != nil {
				t.Fatal(err)
			}
			if e.Authors == "" || e.Year < 1940 || e.Reference == "" || len(e.Ranges) == 0 || e.Convention == "" {
				t.Errorf("%s/%s: incomplete entry %+v", p, id, e)
			}
			if !strings.Contains(e.Reference, "19") {
				t.Errorf("%s/%s: reference without a year: %q", p, id, e.Reference)
			}
			for _, r := range e.Ranges {
				unit, ok := allowedInputs[r.Input]
				if !ok || unit != r.Unit || !(r.Min < r.Max) {
					t.Errorf("%s/%s: bad range %+v", p, id, r)
				}
			}
		}
	}
	// Family slices match the catalog ids.
	famIDs := func(n int, id func(int) string) []string {
		var s []string
		for i := 0; i < n; i++ {
			s = append(s, id(i))
		}
		return s
	}
	pc, zs := PseudoCriticalFamilies(), ZFamilies()
	d, s, u := DeadViscosityFamilies(), SatViscosityFamilies(), UnderViscosityFamilies()
	for p, got := range map[Property][]string{
		PseudoCritical: famIDs(len(pc), func(i int) string { return pc[i].ID }),
		GasZ:           famIDs(len(zs), func(i int) string { return zs[i].ID }),
		DeadViscosity:  famIDs(len(d), func(i int) string { return d[i].ID }),
		SatViscosity:   famIDs(len(s), func(i int) string { return s[i].ID }),
		UnderViscosity: famIDs(len(u), func(i int) string { return u[i].ID }),
	} {
		if !slices.Equal(got, want[p]) {
			t.Errorf("%s families %v, want %v", p, got, want[p])
		}
	}
	if _, err := DeadViscosityByID("nope"); !errors.Is(err, ErrUnknownID) {
		t.Errorf("unknown id: %v", err)
	}
}

func TestCatalogCheckMessage(t *testing.T) {
	e, err := Lookup(DeadViscosity, "glaso")
	if err != nil {
		t.Fatal(err)
	}
	msgs := e.Check(map[string]float64{"API": 62, "temperature": 150})
	if len(msgs) != 1 || !strings.HasSuffix(msgs[0], "range of Glasø's data") || !strings.HasPrefix(msgs[0], "API 62 is above") {
		t.Errorf("Check = %q", msgs)
	}
	e, _ = Lookup(GasZ, "dak")
	if msgs := e.Check(map[string]float64{"Tpr": 0.9, "Ppr": 5}); len(msgs) != 1 || !strings.Contains(msgs[0], "Dranchuk and Abou-Kassem's data") {
		t.Errorf("Check = %q", msgs)
	}
}
