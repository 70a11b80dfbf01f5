package fit

import (
	"testing"

	"labmatch/samples"
)

var sinkResult Result

// BenchmarkTuneBo10 tunes saturated Bo on a 10-point DL (issue target: under 100 µs).
func BenchmarkTuneBo10(b *testing.B) {
	ds := synthDatasetB(b)
	b.ReportAllocs()
	for b.Loop() {
		r, err := Tune(ds, Bo, "standing", Options{})
		if err != nil {
			b.Fatal(err)
		}
		sinkResult = r
	}
}

func synthDatasetB(b *testing.B) *Dataset {
	t := &testing.T{}
	ds := synthDataset(t, Bo, "standing", 1.08, 1)
	if len(ds.Points[Bo]) != 10 {
		b.Fatal("want 10 points")
	}
	return ds
}

var sinkRanking Ranking

// BenchmarkRankDemo ranks every family of every property on the default demo report
// (issue target: under 5 ms on one core; run with -cpu 1).
func BenchmarkRankDemo(b *testing.B) {
	r, err := samples.Load(samples.Default)
	if err != nil {
		b.Fatal(err)
	}
	ds, err := NewDataset(r)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		sinkRanking = Rank(ds, Options{})
	}
}

// BenchmarkLadderDemo tunes the best-ranked family of every property of the default demo report
// on the whole ladder, with leave-one-out errors for every rung (issue target: under 20 ms on
// one core; the workbench refits this on a keystroke).
func BenchmarkLadderDemo(b *testing.B) {
	r, err := samples.Load(samples.Default)
	if err != nil {
		b.Fatal(err)
	}
	ds, err := NewDataset(r)
	if err != nil {
		b.Fatal(err)
	}
	choice := Choice{}
	for p, es := range Rank(ds, Options{}) {
		choice[p] = es[0].Family
	}
	b.ReportAllocs()
	for b.Loop() {
		res, err := TuneAll(ds, choice, Options{})
		if err != nil {
			b.Fatal(err)
		}
		sinkResult = res[Pb]
	}
}

// BenchmarkTuneBoMultiplier tunes saturated Bo on a 10-point DL at the multiplier depth with its
// leave-one-out error (issue target: under 100 µs).
func BenchmarkTuneBoMultiplier(b *testing.B) {
	ds := synthDatasetB(b)
	b.ReportAllocs()
	for b.Loop() {
		r, err := Tune(ds, Bo, "standing", Options{Depth: DepthMultiplier})
		if err != nil {
			b.Fatal(err)
		}
		sinkResult = r
	}
}
