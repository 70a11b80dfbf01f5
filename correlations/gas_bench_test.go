package correlations

import "testing"

var sinkGas float64

func BenchmarkDranchukAbouKassem(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		z, _ := DranchukAbouKassem(1.618967, 2.891013+float64(i&7)*0.1)
		sinkGas += z
	}
}

func BenchmarkHallYarborough(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		z, _ := HallYarborough(1.618967, 2.891013+float64(i&7)*0.1)
		sinkGas += z
	}
}

func BenchmarkDranchukAbouKassemHighPpr(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		z, _ := DranchukAbouKassem(1.1, 12+float64(i&7)*0.1)
		sinkGas += z
	}
}

func BenchmarkHallYarboroughHighPpr(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		z, _ := HallYarborough(1.1, 12+float64(i&7)*0.1)
		sinkGas += z
	}
}

func BenchmarkSuttonWichertAziz(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		ppc, tpc, _ := SuttonCritical(0.7)
		ppc, tpc, _ = WichertAziz(ppc, tpc, 0.05, 0.03)
		sinkGas += ppc + tpc
	}
}

func BenchmarkLeeGonzalezEakin(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		mu, _ := LeeGonzalezEakin(200, 3000, 0.88, 0.7)
		sinkGas += mu
	}
}

func BenchmarkGasZFromGravity(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		z, _, _, _ := GasZFromGravity(3000, 200, 0.7, 0.02, 0.03, "sutton", "dak")
		sinkGas += z
	}
}
