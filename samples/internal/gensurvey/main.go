// Command gensurvey makes the demo survey of package samples: a regional PVT database of
// invented samples from the invented Tamsin Ridge field (operator: the invented Harrow Basin
// Petroleum). No real well, operator or laboratory is meant.
//
// The samples are meant to look like a real database, not like one correlation with one
// multiplier: each sample's bubble point and Bob come from a blend of two published families
// with weights drawn per sample, a factor per reservoir, and lognormal scatter; viscosities
// scatter more than volumes; some values are missing; a few rows carry the slips of real
// databases (a °C temperature in the °F column, a duplicated row, swapped viscosities, a
// transposed digit, a Bob typed below 1) so that the reader has something to leave out.
//
// Usage: go run ./internal/gensurvey -out survey/tamsin-ridge.csv   (from the samples folder)
package main

import (
	"bytes"
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"os"

	"labmatch/correlations"
	"labmatch/lab"
)

func main() {
	out := flag.String("out", "survey/tamsin-ridge.csv", "file to write")
	flag.Parse()
	data, err := build()
	if err != nil {
		fmt.Fprintln(os.Stderr, "gensurvey:", err)
		os.Exit(1)
	}
	if err := lab.WriteFileAtomic(*out, data, true); err != nil {
		fmt.Fprintln(os.Stderr, "gensurvey:", err)
		os.Exit(1)
	}
}

// reservoir is one producing interval of the field with its own fluid character.
type reservoir struct {
	name             string
	apiLo, apiHi     float64
	tLo, tHi         float64 // °F
	rsbLo, rsbHi     float64 // scf/STB at the lighter end of the API range
	pbFactor         float64 // regional departure of the bubble point from the blended families
	boFactor         float64 // on Bo − 1
	muFactor         float64
	wells            []string
	sepPsig, sepTemp float64
}

var reservoirs = []reservoir{
	{name: "Upper Tamsin sand", apiLo: 33, apiHi: 41, tLo: 178, tHi: 205, rsbLo: 480, rsbHi: 1150, pbFactor: 1.04, boFactor: 0.97, muFactor: 1.10,
		wells: []string{"TR-1", "TR-3", "TR-4", "TR-7", "TR-8", "TR-11"}, sepPsig: 100, sepTemp: 75},
	{name: "Lower Tamsin sand", apiLo: 28, apiHi: 36, tLo: 205, tHi: 232, rsbLo: 380, rsbHi: 820, pbFactor: 0.98, boFactor: 1.02, muFactor: 0.95,
		wells: []string{"TR-2", "TR-5", "TR-9", "TR-14", "TR-15"}, sepPsig: 120, sepTemp: 80},
	{name: "Kell limestone", apiLo: 22, apiHi: 30, tLo: 150, tHi: 176, rsbLo: 160, rsbHi: 480, pbFactor: 1.08, boFactor: 0.95, muFactor: 1.25,
		wells: []string{"TR-6", "TR-10", "TR-12", "TR-16"}, sepPsig: 65, sepTemp: 70},
	{name: "Harrow deep", apiLo: 38, apiHi: 45, tLo: 236, tHi: 258, rsbLo: 900, rsbHi: 1500, pbFactor: 0.95, boFactor: 1.01, muFactor: 0.9,
		wells: []string{"TR-18", "TR-21", "HB-2"}, sepPsig: 200, sepTemp: 85},
}

// The families each property's regional truth blends, and the lognormal scatter of each
// measured value (common practice for lab repeatability between labs and campaigns: a few per
// cent on Pb, about one on Bo, ten or more on viscosity).
var (
	pbBlend   = [2]string{"glaso", "standing"}
	boBlend   = [2]string{"al-marhoun", "standing"}
	deadBlend = [2]string{"beggs-robinson", "glaso"}
	satBlend  = [2]string{"beggs-robinson", "chew-connally"}
)

const (
	scatterPb   = 0.04
	scatterRsb  = 0.02
	scatterBo   = 0.012 // on Bo − 1
	scatterMu   = 0.10
	samplesPerR = 18
)

func build() ([]byte, error) {
	r := rand.New(rand.NewPCG(20260412, 7))
	var b bytes.Buffer
	b.WriteString(`# Tamsin Ridge field, regional PVT database (invented demo data; operator Harrow Basin Petroleum).
# One sample per row; bottomhole and recombined samples from 18 wells in four reservoirs, 1998-2024.
# Pb and separator pressure are gauge readings; Rsb and Bob are on the basis of the field separator.
# Empty cells were not measured. Made by samples/internal/gensurvey (go generate ./samples).
`)
	b.WriteString("sample,well,reservoir,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psig],Bob [rb/STB],dead oil viscosity [cP],oil viscosity at Pb [cP],separator pressure [psig],separator temperature [degF],note\n")
	type row struct {
		id, well, res, note                string
		t, api, gg, rsb, pb, bob, mud, mus float64
		psep, tsep                         float64
	}
	var rows []row
	n := 0
	for _, rv := range reservoirs {
		for k := 0; k < samplesPerR; k++ {
			n++
			well := rv.wells[r.IntN(len(rv.wells))]
			api := rv.apiLo + (rv.apiHi-rv.apiLo)*r.Float64()
			// Lighter oils hold more gas: Rsb rises with API inside the reservoir's range.
			x := (api - rv.apiLo) / (rv.apiHi - rv.apiLo)
			rsb := rv.rsbLo * math.Pow(rv.rsbHi/rv.rsbLo, 0.6*x+0.4*r.Float64())
			t := rv.tLo + (rv.tHi-rv.tLo)*r.Float64()
			gg := 0.70 + 0.0045*(rsb/100) + 0.05*r.NormFloat64()
			gg = math.Max(0.62, math.Min(1.15, gg))
			psep := rv.sepPsig * (0.8 + 0.4*r.Float64())
			tsep := rv.sepTemp + 8*r.NormFloat64()
			o := correlations.Oil{API: api, GasGravity: gg, Temperature: t, SepPressure: psep + 14.696, SepTemperature: tsep}
			w := r.Float64()
			pb, err := blendPb(rsb, o, w)
			if err != nil {
				return nil, err
			}
			pb *= rv.pbFactor * math.Exp(scatterPb*r.NormFloat64())
			bo, err := blendBo(pb, rsb, o, r.Float64())
			if err != nil {
				return nil, err
			}
			bo = 1 + (bo-1)*rv.boFactor*math.Exp(scatterBo*r.NormFloat64())
			mud, mus, err := blendMu(rsb, o, r.Float64())
			if err != nil {
				return nil, err
			}
			mud *= rv.muFactor * math.Exp(scatterMu*r.NormFloat64())
			mus *= rv.muFactor * math.Exp(scatterMu*r.NormFloat64())
			mus = math.Min(mus, 0.9*mud) // a lab would recheck a live oil thicker than its dead oil
			rw := row{id: fmt.Sprintf("TR-%03d", n), well: well, res: rv.name, t: math.Round(t), api: round(api, 1),
				gg: round(gg, 3), rsb: math.Round(rsb * math.Exp(scatterRsb*r.NormFloat64())), pb: round5(pb - 14.696),
				bob: round(bo, 3), mud: sig3(mud), mus: sig3(mus), psep: math.Round(psep), tsep: math.Round(tsep)}
			// Missing measurements, as in real databases: older samples lack viscosities,
			// some lack the separator conditions, a few lack Bob.
			u := r.Float64()
			if u < 0.35 {
				rw.mud, rw.mus = 0, 0
			} else if u < 0.45 {
				rw.mus = 0
			}
			if r.Float64() < 0.12 {
				rw.bob = 0
			}
			if r.Float64() < 0.25 {
				rw.psep, rw.tsep = 0, 0
			}
			rows = append(rows, rw)
		}
	}
	// The slips of a real database, each a row or two.
	rows[5].pb = round5(rows[5].pb * 1.32)
	rows[5].note = "recombination ratio queried by the lab"
	rows[17].t = math.Round((rows[17].t - 32) / 1.8) // entered in °C
	rows[23].bob = 0.982                             // typed for 1.298?
	rows[23].note = "Bob as received"
	rows[31].mud, rows[31].mus = rows[31].mus, rows[31].mud // columns swapped
	if rows[31].mud == 0 {
		rows[31].mud, rows[31].mus = 2.1, 3.4
	}
	rows[40].rsb = float64(int(rows[40].rsb)/100*100 + int(rows[40].rsb)%10*10 + int(rows[40].rsb)/10%10) // two digits transposed
	rows[40].note = "transcribed from a scanned report"
	rows[47].gg = 0.45 // first-stage gas gravity lighter than methane
	rows[55].pb = 0    // no bubble point reported
	rows[55].note = "sample leaked; bubble point not measured"
	rows = append(rows[:63], append([]row{rows[62]}, rows[63:]...)...) // a row entered twice
	for _, rw := range rows {
		fmt.Fprintf(&b, "%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s\n", rw.id, rw.well, rw.res, num(rw.t), num(rw.api), num(rw.gg),
			num(rw.rsb), num(rw.pb), num(rw.bob), num(rw.mud), num(rw.mus), num(rw.psep), num(rw.tsep), quote(rw.note))
	}
	return b.Bytes(), nil
}

func blendPb(rsb float64, o correlations.Oil, w float64) (float64, error) {
	a, err := correlations.SolutionGasByID(pbBlend[0])
	if err != nil {
		return 0, err
	}
	c, err := correlations.SolutionGasByID(pbBlend[1])
	if err != nil {
		return 0, err
	}
	pa, err1 := a.BubblePoint(rsb, o)
	pc, err2 := c.BubblePoint(rsb, o)
	if err1 != nil || err2 != nil {
		return 0, fmt.Errorf("pb at Rsb %g: %v %v", rsb, err1, err2)
	}
	return math.Exp(w*math.Log(pa) + (1-w)*math.Log(pc)), nil
}

func blendBo(pb, rsb float64, o correlations.Oil, w float64) (float64, error) {
	a, err := correlations.OilFVFByID(boBlend[0])
	if err != nil {
		return 0, err
	}
	c, err := correlations.OilFVFByID(boBlend[1])
	if err != nil {
		return 0, err
	}
	ba, err1 := a.FVF(pb, rsb, o)
	bc, err2 := c.FVF(pb, rsb, o)
	if err1 != nil || err2 != nil {
		return 0, fmt.Errorf("bo: %v %v", err1, err2)
	}
	return w*ba + (1-w)*bc, nil
}

func blendMu(rsb float64, o correlations.Oil, w float64) (dead, sat float64, err error) {
	var ds, ss [2]float64
	for k := 0; k < 2; k++ {
		d, err := correlations.DeadViscosityByID(deadBlend[k])
		if err != nil {
			return 0, 0, err
		}
		if ds[k], err = d.Viscosity(o); err != nil {
			return 0, 0, err
		}
	}
	dead = math.Exp(w*math.Log(ds[0]) + (1-w)*math.Log(ds[1]))
	for k := 0; k < 2; k++ {
		s, err := correlations.SatViscosityByID(satBlend[k])
		if err != nil {
			return 0, 0, err
		}
		if ss[k], err = s.Viscosity(dead, rsb, o); err != nil {
			return 0, 0, err
		}
	}
	return dead, math.Exp(w*math.Log(ss[0]) + (1-w)*math.Log(ss[1])), nil
}

func round(v float64, digits int) float64 {
	p := math.Pow(10, float64(digits))
	return math.Round(v*p) / p
}

func round5(v float64) float64 { return 5 * math.Round(v/5) }

// sig3 rounds to three significant figures, as viscosities are reported.
func sig3(v float64) float64 {
	if v == 0 {
		return 0
	}
	d := 2 - int(math.Floor(math.Log10(math.Abs(v))))
	return round(v, d)
}

// num writes a value, or an empty cell for 0 (not measured).
func num(v float64) string {
	if v == 0 {
		return ""
	}
	return fmt.Sprintf("%g", v)
}

func quote(s string) string {
	if s == "" {
		return ""
	}
	return `"` + s + `"`
}
