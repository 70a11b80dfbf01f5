package lab

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"testing"
	"testing/fstest"
)

// fuzzFiles are the files FuzzReadCSV may replace, in the order of its selector byte.
var fuzzFiles = []string{DLFile, FluidFile, SeparatorFile, CCEFile, ViscosityFile}

// FuzzReadCSV feeds arbitrary bytes to one table of an otherwise good report. The reader
// must not panic, and must return either an error that is a *ParseError, or a report whose
// every value is finite.
func FuzzReadCSV(f *testing.F) {
	seeds := [][]byte{
		[]byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,600,1.35\n14.696,0,1.05\n"),
		[]byte("\xef\xbb\xbfP [bara],Rs [sm3/sm3],Bo [m3/sm3]\r\n# c\r\n180,107,1.35\r\n\r\n1.01325,0,1.05\r\n"),
		[]byte("pressure [psig],Rsd [scf/STB],Bod [rb/STB],temperature [degF]\n2485,600,1.35,200\n0,0,1.05,200\n0,0,1,60\n"),
		[]byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,NaN,1.35\n"),
		[]byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n1e309,600,1.35\n"),
		[]byte("pressure [psi],Rsd,Bod\n"),
		[]byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,\"600,5\",1.35\n2500,600\n"),
		[]byte("a;b;c\n1;2;3\n"),
		[]byte("\"unterminated,\n"),
		[]byte("reservoir temperature,200,degF\nsaturation pressure,2500,psia\nAPI,35\nH2S,1,%\n"),
		[]byte("key,value,unit\nreservoir temperature,93,degC\nPb,172,barg\nresidual oil gravity,0.85\n"),
		[]byte("test,stage,pressure [psig],temperature [degF],GOR [scf/STB],Bofb [rb/STB],API\nA,1,100,75,480,,\nA,ST,0,60,120,1.318,36\n"),
		[]byte("pressure [MPa],V/Vsat,density [g/cm3],Y\n30,0.97,0.7,\n17.2,1,0.69,\n10,1.3,,2.5\n"),
		[]byte("pressure [kPa],oil viscosity [mPa.s],gas viscosity [mPa.s]\n101.325,2,0.01\n"),
		[]byte("\xff\xfe\x00"),
		[]byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,600,1.35\n#\n\n,,,\n"),
	}
	for i, s := range seeds {
		f.Add(uint8(i), s)
	}
	// The fixtures are seeds too.
	for _, dir := range []string{"../testdata/good/basic", "../testdata/bad/crlf-bom-ok", "../testdata/bad/psig-slip"} {
		for k, name := range fuzzFiles {
			if b, err := os.ReadFile(filepath.Join(dir, name)); err == nil {
				f.Add(uint8(k), b)
			}
		}
	}
	good := fstest.MapFS{
		FluidFile: {Data: []byte("reservoir temperature,200,degF\nsaturation pressure,2500,psia\nAPI,35\n")},
		DLFile:    {Data: []byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,600,1.35\n14.696,0,1.05\n")},
	}
	f.Fuzz(func(t *testing.T, which uint8, data []byte) {
		fsys := fstest.MapFS{}
		for k, v := range good {
			fsys[k] = v
		}
		fsys[fuzzFiles[int(which)%len(fuzzFiles)]] = &fstest.MapFile{Data: data}
		r, err := ReadFS(fsys, ".")
		if err != nil {
			var pe *ParseError
			if !errors.As(err, &pe) || r != nil {
				t.Fatalf("error %v (%T) with report %v", err, err, r != nil)
			}
			_ = err.Error()
			return
		}
		checkFinite(t, r)
	})
}

// FuzzParseValue: no panic, and a value without error is finite.
func FuzzParseValue(f *testing.F) {
	for _, s := range []string{"2000psia", "150bar", "93degC", "107sm3/sm3", "2000 psia", "1e400", "-0x1p3psig", "NaN", "", "psi"} {
		f.Add(uint8(Pressure), s)
	}
	f.Fuzz(func(t *testing.T, q uint8, s string) {
		v, err := ParseValue(Quantity(int(q)%int(numQuantities)), s)
		if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
			t.Fatalf("ParseValue(%q) = %v", s, v)
		}
	})
}

func checkFinite(t *testing.T, r *Report) {
	t.Helper()
	bad := func(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }
	fl := r.Fluid
	for _, v := range []float64{fl.Temperature, fl.Pb, fl.API, fl.SepGasGravity, fl.H2S, fl.CO2, fl.N2, fl.StdPressure, fl.StdTemperature} {
		if bad(v) {
			t.Fatalf("fluid value not finite: %+v", fl)
		}
	}
	for _, s := range r.DL {
		for _, v := range []float64{s.Pressure, s.Rsd, s.Bod, s.Bt, s.OilDensity, s.Z, s.Bg, s.GasGravity} {
			if bad(v) || v < 0 {
				t.Fatalf("DL value not finite or negative: %+v", s)
			}
		}
	}
	for _, st := range r.Separator {
		if bad(st.Bofb) || bad(st.API) || bad(st.Rsfb()) {
			t.Fatalf("separator value not finite: %+v", st)
		}
		for _, s := range st.Stages {
			for _, v := range []float64{s.Pressure, s.Temperature, s.GOR, s.GasGravity} {
				if bad(v) {
					t.Fatalf("separator stage not finite: %+v", s)
				}
			}
		}
	}
	for _, c := range r.CCE {
		for _, v := range []float64{c.Pressure, c.RelVolume, c.Density, c.Y} {
			if bad(v) {
				t.Fatalf("CCE value not finite: %+v", c)
			}
		}
	}
	for _, p := range r.Viscosity {
		for _, v := range []float64{p.Pressure, p.Oil, p.Gas} {
			if bad(v) {
				t.Fatalf("viscosity value not finite: %+v", p)
			}
		}
	}
}
