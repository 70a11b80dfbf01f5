package main

import (
	"fmt"
	"io"
	"text/tabwriter"

	"labmatch/fit"
	"labmatch/lab"
	"labmatch/samples"
)

// runDemo is plain "labmatch": the main job on the built-in demo report (check, convert,
// rank, tune) printed as a summary until the workbench lands.
func runDemo(stdout, stderr io.Writer) int {
	r, err := samples.Load(samples.Default)
	if err != nil {
		fmt.Fprintln(stderr, "labmatch:", err)
		return exitData
	}
	fmt.Fprintf(stdout, "labmatch %s — built-in demo report %q (invented data)\n\n", version, samples.Default)
	fmt.Fprintf(stdout, "sample: %s\nreservoir temperature %.0f degF, saturation pressure %.0f psia, stock-tank %.1f API\n",
		r.Fluid.Sample, r.Fluid.Temperature, r.Fluid.Pb, r.Fluid.API)
	fmt.Fprintf(stdout, "tables: %d DL stages, %d separator tests, %d CCE points, %d viscosities\n\n",
		len(r.DL), len(r.Separator), len(r.CCE), len(r.Viscosity))
	fmt.Fprintln(stdout, "Report checks")
	lab.FormatFindings(stdout, lab.Check(r))
	ds, err := fit.NewDataset(r)
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	fmt.Fprintf(stdout, "\nSeparator basis: Rsb %.0f scf/STB, Bob %.4f rb/STB (selected separator test)\n", ds.Rsb, ds.Bob)
	results, err := fit.TuneAll(ds, nil, fit.Options{})
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	fmt.Fprintln(stdout, "\nBest family per property, tuned on the ladder of depths (chosen by leave-one-out error)")
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  property\tfamily\tdepth\tpoints\tAARE published %\tAARE tuned %\tleave-one-out %")
	for _, p := range fit.Properties {
		res, ok := results[p]
		if !ok {
			continue
		}
		fmt.Fprintf(tw, "  %s\t%s\t%s\t%d\t%.2f\t%.2f\t%s\n", p, res.Family, res.Depth, res.Tuned.Points,
			res.Published.AARE, res.Tuned.AARE, pct(res.LOO))
	}
	tw.Flush()
	if pb, ok := results[fit.Pb]; ok {
		fmt.Fprintf(stdout, "\nThe solution-gas pair (%s): Pb is the report's %.0f psia at every tuned depth; the rungs:\n", pb.Family, ds.Pb)
		tw = tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "  depth\tparameters\tAARE %\tleave-one-out %\t")
		for _, r := range pb.Ladder {
			switch {
			case r.Skipped != "":
				fmt.Fprintf(tw, "  %s\t-\t-\t-\tskipped: %s\n", r.Depth, r.Skipped)
			default:
				mark := ""
				if r.Chosen {
					mark = "◀ chosen"
				}
				fmt.Fprintf(tw, "  %s\t%d\t%.2f\t%s\t%s\n", r.Depth, r.Free, r.Tuned.AARE, pct(r.LOO), mark)
			}
		}
		tw.Flush()
		fmt.Fprintln(stdout, ladderStory(pb))
	}
	for _, p := range fit.Properties {
		if res, ok := results[p]; ok && res.NoFit != "" {
			fmt.Fprintf(stdout, "  %s: %s\n", p, res.NoFit)
		}
	}
	fmt.Fprintln(stdout, `
Next: "labmatch rank demo:tr3-black" scores every family; "labmatch tune demo:tr3-black"
shows every property's ladder and residuals; "labmatch samples --out DIR" writes the demo
reports as folders.

Correlation results are estimates, valid only near the data they were fitted to. Check them
against the lab report and local practice; facility, well-control and reserves decisions rest
with qualified engineers and local regulations.`)
	return exitOK
}

// ladderStory says in words why the ladder chose its rung, from the rungs' errors.
func ladderStory(res fit.Result) string {
	byDepth := map[fit.Depth]fit.Rung{}
	for _, r := range res.Ladder {
		byDepth[r.Depth] = r
	}
	loo := func(d fit.Depth) string {
		r := byDepth[d]
		if r.Skipped != "" || r.LOO == nil {
			return "n/a"
		}
		return fmt.Sprintf("%.2f %%", *r.LOO)
	}
	switch res.Depth {
	case fit.DepthMultiplier:
		return fmt.Sprintf("  The anchor on the report's Pb alone predicts left-out points within %s; the bend (%s) and\n  the refit (%s) do not do clearly better, so they are not used.", loo(fit.DepthMultiplier), loo(fit.DepthShape), loo(fit.DepthRefit))
	case fit.DepthShape:
		return fmt.Sprintf("  The anchor alone cannot bend the published curve to this oil's (%s on left-out points);\n  one bend parameter follows it (%s), and the refit of the family's coefficients (%s) does\n  not do clearly better, so it is not used.", loo(fit.DepthMultiplier), loo(fit.DepthShape), loo(fit.DepthRefit))
	case fit.DepthRefit:
		return fmt.Sprintf("  Neither the anchor (%s on left-out points) nor one bend (%s) follows this oil's curve;\n  the refit of the family's coefficients predicts left-out points within %s.", loo(fit.DepthMultiplier), loo(fit.DepthShape), loo(fit.DepthRefit))
	}
	return ""
}
