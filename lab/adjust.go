package lab

import (
	"errors"
	"fmt"

	"labmatch/correlations"
)

// ErrNoSeparator means a separator-basis series was asked of a report with no usable
// separator test.
var ErrNoSeparator = errors.New("lab: no usable separator test (separator.csv needs stage GORs and Bofb)")

// BasisPoint is one separator-basis oil state.
type BasisPoint struct {
	Source     string  // "dl.csv" or "cce.csv"
	Line       int     // line in Source (0 when built in code)
	Pressure   float64 // psia
	Rs         float64 // scf/STB (separator basis)
	Bo         float64 // rb/STB (separator basis)
	Bt         float64 // total FVF, rb/STB (separator basis): Bo + Bg·(Rsfb − Rs)/5.614583; 0 without Bg
	Bg         float64 // rcf/scf of the DL gas: as reported, or from the reported Z; 0 without either
	GasDensity float64 // lbm/ft³ of the DL gas at the stage, from Z and the stage's gas gravity; 0 without them
	Clamped    bool    // the adjusted Rs came out below zero and was set to zero
}

// SeparatorBasis is the report's oil data converted to the conditions of one separator test,
// the data the correlations are fitted to.
type SeparatorBasis struct {
	Test  string       // separator test id
	Pb    float64      // bubble point, psia (fluid.csv)
	Bofb  float64      // rb/STB, from the separator test
	Rsfb  float64      // scf/STB, sum of the test's stage GORs
	Bodb  float64      // DL relative oil volume at the bubble point
	Rsdb  float64      // DL solution GOR at the bubble point, scf/bbl residual oil
	Below []BasisPoint // DL stages at and below Pb (the 60 °F residual row excluded)
	Above []BasisPoint // CCE points above Pb: Bo = (V/Vsat)·Bofb, Rs = Rsfb
}

// AdjustBo converts a DL relative oil volume to separator basis: Bo = Bod·Bofb/Bodb
// (McCain, The Properties of Petroleum Fluids, 2nd ed., ch. 10; Moses, JPT 1986).
// Evaluated as (Bod/Bodb)·Bofb so that Bod = Bodb gives Bofb exactly: (Bod·Bofb)/Bodb is
// off by one unit in the last place for about one pair in nine.
func (s SeparatorBasis) AdjustBo(bod float64) float64 { return bod / s.Bodb * s.Bofb }

// AdjustRs converts a DL solution GOR to separator basis: Rs = Rsfb − (Rsdb − Rsd)·Bofb/Bodb
// (same sources). The value may be negative; callers clamp it.
func (s SeparatorBasis) AdjustRs(rsd float64) float64 {
	return s.Rsfb - (s.Rsdb-rsd)*s.Bofb/s.Bodb
}

// UnadjustBo is the inverse of AdjustBo: Bod = Bo·Bodb/Bofb, evaluated as (Bo/Bofb)·Bodb
// so that Bo = Bofb gives Bodb exactly.
func (s SeparatorBasis) UnadjustBo(bo float64) float64 { return bo / s.Bofb * s.Bodb }

// UnadjustRs is the inverse of AdjustRs: Rsd = Rsdb − (Rsfb − Rs)·Bodb/Bofb.
func (s SeparatorBasis) UnadjustRs(rs float64) float64 {
	return s.Rsdb - (s.Rsfb-rs)*s.Bodb/s.Bofb
}

// BubblePointStage returns the index of the DL stage taken as the bubble point: the first
// stage at or below the report's saturation pressure (within 0.5 %), which dl.csv starts with
// by convention; a stage above Pb (QC warns of it: dl-above-pb) is skipped. It returns -1
// when the DL is empty.
func (r *Report) BubblePointStage() int {
	first := -1
	for i, st := range r.DL {
		if st.Residual60 {
			continue
		}
		if first < 0 {
			first = i
		}
		if r.Fluid.Pb <= 0 || st.Pressure <= r.Fluid.Pb*1.005 {
			return i
		}
	}
	return first
}

// SeparatorBasis converts the DL (and the CCE above Pb) to the conditions of the selected
// separator test (DESIGN.md §5). Rs values that come out below zero at low pressure are set
// to zero and marked Clamped.
func (r *Report) SeparatorBasis() (SeparatorBasis, error) {
	t, ok := r.SelectedSeparator()
	if !ok || t.Bofb <= 0 || t.Rsfb() <= 0 {
		return SeparatorBasis{}, ErrNoSeparator
	}
	return r.SeparatorBasisWith(t)
}

// SeparatorBasisWith is SeparatorBasis with an explicit separator test.
func (r *Report) SeparatorBasisWith(t SeparatorTest) (SeparatorBasis, error) {
	ib := r.BubblePointStage()
	if ib < 0 {
		return SeparatorBasis{}, fmt.Errorf("lab: dl.csv has no stages")
	}
	b := r.DL[ib]
	if b.Bod <= 0 {
		return SeparatorBasis{}, fmt.Errorf("lab: dl.csv:%d: Bod at the bubble point is %g, want > 0", b.Line, b.Bod)
	}
	s := SeparatorBasis{
		Test: t.ID, Pb: r.Fluid.Pb, Bofb: t.Bofb, Rsfb: t.Rsfb(), Bodb: b.Bod, Rsdb: b.Rsd,
	}
	for _, st := range r.DL[ib:] {
		if st.Residual60 {
			continue
		}
		p := BasisPoint{Source: "dl.csv", Line: st.Line, Pressure: st.Pressure,
			Rs: s.AdjustRs(st.Rsd), Bo: s.AdjustBo(st.Bod)}
		if p.Rs < 0 {
			p.Rs, p.Clamped = 0, true
		}
		r.gasAt(st, &p)
		if p.Bg > 0 {
			p.Bt = p.Bo + p.Bg/bblToFt3*(s.Rsfb-p.Rs)
		}
		s.Below = append(s.Below, p)
	}
	for _, c := range r.CCE {
		if c.Pressure > r.Fluid.Pb && c.RelVolume > 0 {
			s.Above = append(s.Above, BasisPoint{Source: "cce.csv", Line: c.Line,
				Pressure: c.Pressure, Rs: s.Rsfb, Bo: c.RelVolume * s.Bofb})
		}
	}
	return s, nil
}

// RsAt returns the separator-basis Rs at pressure p, interpolated linearly between the DL
// stages (Rsfb at and above Pb, the last stage's value below the last stage).
func (s SeparatorBasis) RsAt(p float64) float64 {
	if p >= s.Pb || len(s.Below) == 0 {
		return s.Rsfb
	}
	prev := BasisPoint{Pressure: s.Pb, Rs: s.Rsfb}
	for _, b := range s.Below {
		if b.Pressure <= p {
			if prev.Pressure == b.Pressure {
				return b.Rs
			}
			f := (p - b.Pressure) / (prev.Pressure - b.Pressure)
			return b.Rs + f*(prev.Rs-b.Rs)
		}
		prev = b
	}
	return prev.Rs
}

// bblToFt3 is the barrel in cubic feet: 42 US gal = 5.614583 ft³ (exact by definition).
const bblToFt3 = 5.614583

// gasAt fills the Bg and gas density of a DL stage's gas: Bg as reported or, where the report
// lacks it, Bg = psc·Z·T/(Tsc·p) at the report's standard conditions (real-gas law, common
// practice); the density ρg = p·28.96·γg/(Z·10.73·T) (Penn State PNG 520 molar mass of air,
// gas constant from Lyons, Standard Handbook of Petroleum & Natural Gas Engineering).
func (r *Report) gasAt(st DLStage, p *BasisPoint) {
	tR := r.Fluid.Temperature + correlations.RankineOffset
	p.Bg = st.Bg
	if p.Bg == 0 && st.Z > 0 && st.Pressure > 0 {
		psc, tsc := r.Fluid.StdPressure, r.Fluid.StdTemperature
		if psc <= 0 {
			psc = DefaultStdPressure
		}
		if tsc == 0 {
			tsc = DefaultStdTemperature
		}
		p.Bg = psc * st.Z * tR / ((tsc + correlations.RankineOffset) * st.Pressure)
	}
	if st.Z > 0 && st.GasGravity > 0 {
		if rho, err := correlations.GasDensity(st.Pressure, r.Fluid.Temperature, st.Z, st.GasGravity); err == nil {
			p.GasDensity = rho
		}
	}
}
