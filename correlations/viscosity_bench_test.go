package correlations

import "testing"

var sinkVisc float64

func BenchmarkDeadViscosity(b *testing.B) {
	o := Oil{API: 32, Temperature: 180}
	for _, f := range DeadViscosityFamilies() {
		b.Run(f.ID, func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				v, _ := f.Viscosity(o)
				sinkVisc += v
			}
		})
	}
}

func BenchmarkSatViscosity(b *testing.B) {
	o := Oil{API: 32, Temperature: 180}
	for _, f := range SatViscosityFamilies() {
		b.Run(f.ID, func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				v, _ := f.Viscosity(2.5, 600, o)
				sinkVisc += v
			}
		})
	}
}

func BenchmarkUnderViscosity(b *testing.B) {
	o := Oil{API: 32, Temperature: 180}
	for _, f := range UnderViscosityFamilies() {
		b.Run(f.ID, func(b *testing.B) {
			b.ReportAllocs()
			for i := 0; i < b.N; i++ {
				v, _ := f.Viscosity(5000, 2500, 0.9, o)
				sinkVisc += v
			}
		})
	}
}
