package fit_test

import (
	"fmt"

	"labmatch/fit"
	"labmatch/samples"
)

// Tune the solution-gas pair of the demo black oil with Standing's correlation: the ladder
// chooses its depth by leave-one-out error, and the tuned Pb is the report's.
func ExampleTune() {
	r, _ := samples.Load("tr3-black")
	ds, _ := fit.NewDataset(r)
	res, _ := fit.Tune(ds, fit.Pb, "standing", fit.Options{})
	fmt.Printf("depth %s, AARE %.2g %% → %.2g %% (leave-one-out %.2g %%), Pb %.4g psia\n",
		res.Depth, res.Published.AARE, res.Tuned.AARE, *res.LOO, res.Residuals[0].Tuned)
	// Output: depth shape, AARE 6.5 % → 0.3 % (leave-one-out 0.35 %), Pb 3054 psia
}
