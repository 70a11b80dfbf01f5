package correlations

import "testing"

// CheckValues gives the facts that Check states: the input, its value, the range and the
// side, in the catalog's units, so that a writer can state them in units of its own.
func TestCheckValuesMatchesCheck(t *testing.T) {
	e, err := Lookup(DeadViscosity, "egbogah-ng")
	if err != nil {
		t.Fatal(err)
	}
	in := map[string]float64{"API": 4, "temperature": 220, "Rs": 900}
	got := e.CheckValues(in)
	// Two inputs outside the data, in the order of the entry's ranges: API below, temperature
	// above (Rs is not an input of a dead-oil correlation).
	if len(got) != 2 {
		t.Fatalf("CheckValues = %+v, want 2 facts", got)
	}
	api, temp := got[0], got[1]
	if api.Input != "API" || api.Side != Below || api.Value != 4 || api.Unit != "°API" {
		t.Errorf("API fact = %+v", api)
	}
	if temp.Input != "temperature" || temp.Side != Above || temp.Value != 220 || temp.Unit != "°F" ||
		temp.Min >= temp.Max || temp.Max >= 220 || temp.Authors != e.Authors {
		t.Errorf("temperature fact = %+v", temp)
	}
	msgs := e.Check(in)
	if len(msgs) != len(got) {
		t.Fatalf("Check = %q, CheckValues = %+v", msgs, got)
	}
	for i := range msgs {
		if msgs[i] != got[i].String() {
			t.Errorf("Check[%d] = %q, CheckValues[%d].String() = %q", i, msgs[i], i, got[i].String())
		}
	}
	if want := "API 4 is below the 5–58 range of Egbogah and Ng's data"; msgs[0] != want {
		t.Errorf("Check[0] = %q, want %q", msgs[0], want)
	}
	if got := e.CheckValues(map[string]float64{"API": 30, "temperature": 150}); len(got) != 0 {
		t.Errorf("in-range oil: %+v", got)
	}
}
