package lab_test

import (
	"fmt"

	"labmatch/lab"
)

// Flag and cell values carry their unit; the result is in field units.
func ExampleParseValue() {
	p, _ := lab.ParseValue(lab.Pressure, "150barg")
	t, _ := lab.ParseValue(lab.Temperature, "93degC")
	rs, _ := lab.ParseValue(lab.GOR, "107sm3/sm3")
	fmt.Printf("%.4g psia, %.4g degF, %.4g scf/STB\n", p, t, rs)
	// Output: 2190 psia, 199.4 degF, 600.8 scf/STB
}
