package export

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io"

	"labmatch/lab"
)

// csvDigits is the number of significant digits in table CSV files: a read-back agrees with
// the table to 1e-10 relative.
const csvDigits = 12

// Caution is the warning that goes with every exported table and report (DESIGN.md §8).
const Caution = "Correlation results are estimates, valid only near the data they were fitted to. " +
	"Check them against the lab report and local practice. Facility, well-control and reserves " +
	"decisions rest with qualified engineers and local regulations."

// csvColumn is one column of the table CSV: its header name, quantity and value.
type csvColumn struct {
	name string
	q    lab.Quantity
	get  func(sat float64, s rowValues) float64
}

// rowValues is one line of the CSV: an oil state and the water at its pressure.
type rowValues struct {
	p, rs, bo, co, muo, rhoo, z, bg, mug float64
	water                                WaterPoint
}

var csvColumns = []csvColumn{
	{"saturation pressure", lab.Pressure, func(sat float64, _ rowValues) float64 { return sat }},
	{"pressure", lab.Pressure, func(_ float64, r rowValues) float64 { return r.p }},
	{"Rs", lab.GOR, func(_ float64, r rowValues) float64 { return r.rs }},
	{"Bo", lab.FVF, func(_ float64, r rowValues) float64 { return r.bo }},
	{"co", lab.Compressibility, func(_ float64, r rowValues) float64 { return r.co }},
	{"oil viscosity", lab.Viscosity, func(_ float64, r rowValues) float64 { return r.muo }},
	{"oil density", lab.Density, func(_ float64, r rowValues) float64 { return r.rhoo }},
	{"Z", lab.Dimensionless, func(_ float64, r rowValues) float64 { return r.z }},
	{"Bg", lab.GasFVF, func(_ float64, r rowValues) float64 { return r.bg }},
	{"gas viscosity", lab.Viscosity, func(_ float64, r rowValues) float64 { return r.mug }},
	{"Bw", lab.FVF, func(_ float64, r rowValues) float64 { return r.water.Bw }},
	{"cw", lab.Compressibility, func(_ float64, r rowValues) float64 { return r.water.Cw }},
	{"water viscosity", lab.Viscosity, func(_ float64, r rowValues) float64 { return r.water.Viscosity }},
}

// WriteCSV writes the table as one CSV file in units u: a "#" comment header (source,
// families, water, surface densities, cautions), then one line per saturated row followed by
// its undersaturated branch. Header cells are "name [unit]" as in report files, so the file
// reads back through the report reader's unit parser. The row column says "saturated" or
// "undersaturated"; extrapolated is "yes" on rows of oils holding more gas than the report's.
func WriteCSV(w io.Writer, t *Table, u Units) error {
	c := &converter{units: u.set()}
	var b bytes.Buffer
	for _, l := range headerLines(t, c) {
		fmt.Fprintf(&b, "# %s\n", l)
	}
	b.WriteString("# co: on saturated rows the total compressibility of the oil with the gas it releases (McCain, Rollins and Villena 1988); on undersaturated rows the oil's own, as tuned\n")
	cw := csv.NewWriter(&b)
	head := []string{"row"}
	for _, col := range csvColumns {
		head = append(head, fmt.Sprintf("%s [%s]", col.name, c.unit(col.q)))
	}
	head = append(head, "extrapolated")
	if err := cw.Write(head); err != nil {
		return fmt.Errorf("export: %w", err)
	}
	line := func(kind string, sat float64, r rowValues, extra bool) error {
		rec := []string{kind}
		for _, col := range csvColumns {
			rec = append(rec, num(c.to(col.q, col.get(sat, r)), csvDigits))
		}
		x := ""
		if extra {
			x = "yes"
		}
		return cw.Write(append(rec, x))
	}
	for _, row := range t.Rows {
		rv, err := t.values(row.State.Pressure, row.State.Rs, row.Bo, row.Co, row.OilViscosity, row.OilDensity, row.Z, row.Bg, row.GasViscosity)
		if err != nil {
			return err
		}
		if err := line("saturated", row.Pressure, rv, row.Extrapolated); err != nil {
			return fmt.Errorf("export: %w", err)
		}
		for _, s := range row.Branch {
			rv, err := t.values(s.Pressure, s.Rs, s.Bo, s.Co, s.OilViscosity, s.OilDensity, s.Z, s.Bg, s.GasViscosity)
			if err != nil {
				return err
			}
			if err := line("undersaturated", row.Pressure, rv, row.Extrapolated); err != nil {
				return fmt.Errorf("export: %w", err)
			}
		}
	}
	cw.Flush()
	if err := cw.Error(); err != nil {
		return fmt.Errorf("export: %w", err)
	}
	if c.err != nil {
		return fmt.Errorf("export: %w", c.err)
	}
	_, err := w.Write(b.Bytes())
	return err
}

func (t *Table) values(p, rs, bo, co, muo, rhoo, z, bg, mug float64) (rowValues, error) {
	wp, err := WaterAt(p, t.Temperature, t.Water.Salinity)
	if err != nil {
		return rowValues{}, err
	}
	return rowValues{p: p, rs: rs, bo: bo, co: co, muo: muo, rhoo: rhoo, z: z, bg: bg, mug: mug, water: wp}, nil
}

// headerLines are the comment lines that every table file starts with.
func headerLines(t *Table, c *converter) []string {
	pu := c.unit(lab.Pressure)
	lines := append([]string{"black-oil tables at reservoir temperature"}, t.Source.lines(c, false)...)
	lines = append(lines,
		fmt.Sprintf("reservoir temperature %.6g %s; standard conditions %.6g %s, %.6g %s", c.to(lab.Temperature, t.Temperature), c.unit(lab.Temperature),
			c.to(lab.Pressure, t.StdPressure), pu, c.to(lab.Temperature, t.StdTemp), c.unit(lab.Temperature)),
		fmt.Sprintf("tuned bubble point %.6g %s at Rs %.6g %s, Bo %.6g %s", c.to(lab.Pressure, t.Pb), pu,
			c.to(lab.GOR, t.Rsb), c.unit(lab.GOR), c.to(lab.FVF, t.Bob), c.unit(lab.FVF)),
		fmt.Sprintf("saturated rows from %.6g to %.6g %s; rows above the tuned Pb are extrapolated: oils with more gas than the report's, from the tuned solution-gas pair continued",
			c.to(lab.Pressure, t.Rows[0].Pressure), c.to(lab.Pressure, t.PMax), pu),
		fmt.Sprintf("water: %s; salinity %.4g wt %% (%.0f ppm, %.4g g/L)", t.Water.Families, t.Water.Salinity, t.Water.Salinity*1e4, t.Water.Concentration),
		fmt.Sprintf("surface densities: oil %.6g, water %.6g, gas %.6g %s", c.to(lab.Density, t.Surface.Oil), c.to(lab.Density, t.Surface.Water),
			c.to(lab.Density, t.Surface.Gas), c.unit(lab.Density)),
	)
	for _, w := range warningTexts(t.Warnings, c) {
		lines = append(lines, "outside the data: "+w)
	}
	for _, r := range t.Rows {
		if r.NoBranch != "" {
			why := r.NoBranch
			if pu != lab.Pressure.FieldUnit() && r.noBranchCause != "" {
				why = r.noBranchCause
			}
			lines = append(lines, fmt.Sprintf("note: the saturated row at %.6g %s (Rs %.6g %s) has no undersaturated branch (%s); simulators take the branch shape of the next row",
				c.to(lab.Pressure, r.Pressure), pu, c.to(lab.GOR, r.Rs), c.unit(lab.GOR), why))
		}
	}
	return append(lines, "caution: "+Caution)
}
