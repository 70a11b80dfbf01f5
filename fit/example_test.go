package fit_test

import (
	"fmt"

	"labmatch/fit"
	"labmatch/samples"
)

// Tune the saturated Bo of the demo black oil with Standing's correlation.
func ExampleTune() {
	r, _ := samples.Load("tr3-black")
	ds, _ := fit.NewDataset(r)
	res, _ := fit.Tune(ds, fit.Bo, "standing", fit.Options{})
	fmt.Printf("multiplier %.3g, AARE %.2g %% → %.2g %%\n", res.Params.Multiplier, res.Published.AARE, res.Tuned.AARE)
	// Output: multiplier 0.959, AARE 0.62 % → 0.046 %
}
