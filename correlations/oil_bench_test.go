package correlations

import "testing"

// Benchmarks of every oil family function at oil 1 of the six-oil table (a light oil with
// separator conditions), with ReportAllocs and a package-level sink.

var benchSink float64

var benchOil = Oil{API: 47.1, GasGravity: 0.851, Temperature: 250, SepPressure: 164.7, SepTemperature: 60}

func benchPb(b *testing.B, f func(float64, Oil) (float64, error)) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := f(751, benchOil)
		benchSink += v
	}
}

func benchRs(b *testing.B, f func(float64, Oil) (float64, error)) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := f(2000, benchOil)
		benchSink += v
	}
}

func benchBo(b *testing.B, f func(float64, float64, Oil) (float64, error)) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := f(2377, 751, benchOil)
		benchSink += v
	}
}

func benchCo(b *testing.B, f func(float64, float64, float64, Oil) (float64, error), p float64) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := f(p, 2377, 751, benchOil)
		benchSink += v
	}
}

func BenchmarkStandingBubblePoint(b *testing.B)     { benchPb(b, StandingBubblePoint) }
func BenchmarkStandingSolutionGOR(b *testing.B)     { benchRs(b, StandingSolutionGOR) }
func BenchmarkVasquezBeggsBubblePoint(b *testing.B) { benchPb(b, VasquezBeggsBubblePoint) }
func BenchmarkVasquezBeggsSolutionGOR(b *testing.B) { benchRs(b, VasquezBeggsSolutionGOR) }
func BenchmarkGlasoBubblePoint(b *testing.B)        { benchPb(b, GlasoBubblePoint) }
func BenchmarkGlasoSolutionGOR(b *testing.B)        { benchRs(b, GlasoSolutionGOR) }
func BenchmarkAlMarhounBubblePoint(b *testing.B)    { benchPb(b, AlMarhounBubblePoint) }
func BenchmarkAlMarhounSolutionGOR(b *testing.B)    { benchRs(b, AlMarhounSolutionGOR) }
func BenchmarkPetroskyFarshadBubblePoint(b *testing.B) {
	benchPb(b, PetroskyFarshadBubblePoint)
}
func BenchmarkPetroskyFarshadSolutionGOR(b *testing.B) {
	benchRs(b, PetroskyFarshadSolutionGOR)
}
func BenchmarkKartoatmodjoSchmidtBubblePoint(b *testing.B) {
	benchPb(b, KartoatmodjoSchmidtBubblePoint)
}
func BenchmarkKartoatmodjoSchmidtSolutionGOR(b *testing.B) {
	benchRs(b, KartoatmodjoSchmidtSolutionGOR)
}
func BenchmarkLasaterBubblePoint(b *testing.B)     { benchPb(b, LasaterBubblePoint) }
func BenchmarkLasaterSolutionGOR(b *testing.B)     { benchRs(b, LasaterSolutionGOR) }
func BenchmarkValkoMcCainBubblePoint(b *testing.B) { benchPb(b, ValkoMcCainBubblePoint) }
func BenchmarkValkoMcCainSolutionGOR(b *testing.B) { benchRs(b, ValkoMcCainSolutionGOR) }

func BenchmarkVelardeSolutionGOR(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := VelardeSolutionGOR(1500, 2377, 751, benchOil)
		benchSink += v
	}
}

func BenchmarkStandingOilFVF(b *testing.B)            { benchBo(b, StandingOilFVF) }
func BenchmarkVasquezBeggsOilFVF(b *testing.B)        { benchBo(b, VasquezBeggsOilFVF) }
func BenchmarkGlasoOilFVF(b *testing.B)               { benchBo(b, GlasoOilFVF) }
func BenchmarkAlMarhounOilFVF(b *testing.B)           { benchBo(b, AlMarhounOilFVF) }
func BenchmarkPetroskyFarshadOilFVF(b *testing.B)     { benchBo(b, PetroskyFarshadOilFVF) }
func BenchmarkKartoatmodjoSchmidtOilFVF(b *testing.B) { benchBo(b, KartoatmodjoSchmidtOilFVF) }
func BenchmarkMcCainOilFVF(b *testing.B)              { benchBo(b, McCainOilFVF) }

func BenchmarkVasquezBeggsCo(b *testing.B) { benchCo(b, VasquezBeggsCo, 4000) }
func BenchmarkVasquezBeggsRelativeVolume(b *testing.B) {
	benchCo(b, VasquezBeggsRelativeVolume, 4000)
}
func BenchmarkPetroskyFarshadCo(b *testing.B) { benchCo(b, PetroskyFarshadCo, 4000) }
func BenchmarkPetroskyFarshadRelativeVolume(b *testing.B) {
	benchCo(b, PetroskyFarshadRelativeVolume, 4000)
}
func BenchmarkSpiveyCo(b *testing.B)             { benchCo(b, SpiveyCo, 4000) }
func BenchmarkSpiveyRelativeVolume(b *testing.B) { benchCo(b, SpiveyRelativeVolume, 4000) }
func BenchmarkMcCainRollinsVillenaCo(b *testing.B) {
	benchCo(b, McCainRollinsVillenaCo, 1500)
}

func BenchmarkOilDensity(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		v, _ := OilDensity(751, 1.528, benchOil)
		benchSink += v
	}
}
