package export

import (
	"bytes"
	_ "embed"
	"errors"
	"fmt"
	"html/template"
	"image/color"
	"io"
	"math"
	"strings"
	"time"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"labmatch/fit"
	"labmatch/lab"
)

// SurveyReportInput is what the survey's HTML report is made from.
type SurveyReportInput struct {
	Tool      string // "labmatch 0.1.0"
	Survey    *lab.Survey
	Result    *fit.SurveyResult
	Folds     int       // the folds asked for (a property with few samples is left out one by one)
	Generated time.Time // the date printed; zero: now
}

// surveyPlotMax is the most samples a cross-plot draws; a larger database is thinned evenly
// (every k-th sample), which the caption says, so the report stays a few megabytes.
const surveyPlotMax = 1500

//go:embed survey.html.tmpl
var surveyTemplateText string

var surveyTemplate = template.Must(template.New("survey").Parse(surveyTemplateText))

// reportStyle is the style sheet of the report template, shared so that both reports look
// alike.
var reportStyle = func() template.CSS {
	s := reportTemplateText
	i, j := strings.Index(s, "<style>"), strings.Index(s, "</style>")
	if i < 0 || j < i {
		return ""
	}
	return template.CSS(s[i+len("<style>") : j])
}()

// WriteSurveyReport writes the survey's HTML report: one self-contained file in the style of the
// report of a single lab report, with the database summary, the rows left out, and for each
// property the ranking (published, multiplier, cross-validated and refit errors) and a
// cross-plot of lab against predicted values with the 45° line for every family, the best one
// open; the cautions, the file's fingerprint, the tool version and the date.
func WriteSurveyReport(w io.Writer, in SurveyReportInput) error {
	v, err := newSurveyView(in)
	if err != nil {
		return err
	}
	var b bytes.Buffer
	if err := surveyTemplate.Execute(&b, v); err != nil {
		return fmt.Errorf("export: survey report: %w", err)
	}
	_, err = w.Write(b.Bytes())
	return err
}

// SaveSurveyReport writes the survey report to path atomically; an existing file is kept unless
// force is set.
func SaveSurveyReport(path string, in SurveyReportInput, force bool) error {
	var b bytes.Buffer
	if err := WriteSurveyReport(&b, in); err != nil {
		return err
	}
	return lab.WriteFileAtomic(path, b.Bytes(), force)
}

type surveyRow struct {
	Rank                                           int
	Family, N, Pub, Bias, SD, Max, Mult, Tuned, CV string
	Refit, RefitCV, Remarks                        string
	Best, Failed                                   bool
}

type surveyPlot struct {
	Family, Caption string
	SVG             template.HTML
	Open            bool
}

type surveyPropView struct {
	ID, Title, Samples, CV, Best string
	Refit                        bool
	Rows                         []surveyRow
	Plots                        []surveyPlot
	Coefficients                 []kv
	Skipped                      []string
}

type surveyView struct {
	Title, Tool, Date, Fingerprint, Caution string
	Style                                   template.CSS
	Summary                                 []kv
	Excluded                                []kv
	Props                                   []surveyPropView
}

func newSurveyView(in SurveyReportInput) (*surveyView, error) {
	sv, res := in.Survey, in.Result
	if sv == nil || res == nil {
		return nil, errors.New("export: survey report: a survey and its result are needed")
	}
	when := in.Generated
	if when.IsZero() {
		when = time.Now()
	}
	v := &surveyView{Title: "PVT survey: " + sv.File, Tool: in.Tool, Date: when.UTC().Format("2 January 2006"),
		Fingerprint: sv.Fingerprint, Caution: Caution + " A correlation tuned to a regional database predicts a new oil only as well as the database represents it.",
		Style: reportStyle}
	rows := 0
	for _, e := range sv.Excluded {
		where := fmt.Sprintf("line %d (%s)", e.Line, e.Sample)
		what := "row left out: "
		if e.Columns != nil {
			what = strings.Join(e.Columns, " and ") + " left out: "
		} else {
			rows++
		}
		v.Excluded = append(v.Excluded, kv{where, what + e.Reason})
	}
	add := func(k, val string) { v.Summary = append(v.Summary, kv{k, val}) }
	add("file", sv.File)
	add("rows read", fmt.Sprint(sv.Rows))
	add("samples used", fmt.Sprintf("%d (%d rows and %d values left out, listed below)", res.Samples, rows, len(sv.Excluded)-rows))
	add("cross-validation", fmt.Sprintf("%d folds from a shuffle with seed %d; leave-one-out for a property with 30 samples or fewer", in.Folds, res.Seed))
	add("refit ridge", fmt.Sprintf("prior spread τ = %g of each coefficient, λ = σ²/τ² from the multiplier's scatter", res.PriorSpread))
	for _, sp := range res.Properties {
		pv, err := surveyProperty(sv, sp)
		if err != nil {
			return nil, err
		}
		v.Props = append(v.Props, pv)
	}
	return v, nil
}

func surveyTitle(p fit.PropertyID) string {
	switch p {
	case fit.Pb:
		return "Bubble point from Rsb (pb)"
	case fit.Bo:
		return "Oil FVF at the bubble point (bo)"
	case fit.MuDead:
		return "Dead-oil viscosity (mu_dead)"
	case fit.MuSat:
		return "Oil viscosity at the bubble point (mu_sat)"
	}
	return string(p)
}

func surveyProperty(sv *lab.Survey, sp fit.SurveyProperty) (surveyPropView, error) {
	pv := surveyPropView{ID: "prop-" + string(sp.Property), Title: surveyTitle(sp.Property),
		Samples: plural(sp.Samples, "sample"), CV: fmt.Sprintf("%d folds", sp.Folds)}
	if sp.LeaveOneOut {
		pv.CV = "leave-one-out"
	}
	f2 := func(v float64) string { return fmt.Sprintf("%.2f", v) }
	for _, l := range sp.Skipped {
		pv.Skipped = append(pv.Skipped, fmt.Sprintf("%s skipped: %s", plural(l.Count, "sample"), l.Reason))
	}
	for i, f := range sp.Families {
		r := surveyRow{Rank: i + 1, Family: f.Family, N: fmt.Sprint(f.Points), Best: i == 0 && f.Points > 0, Failed: f.Points == 0}
		var remarks []string
		for _, l := range f.Lost {
			remarks = append(remarks, fmt.Sprintf("cannot evaluate %s: %s", plural(l.Count, "sample"), l.Reason))
		}
		remarks = append(remarks, f.Flags...)
		if f.Points > 0 {
			r.Pub, r.Bias, r.SD, r.Max = f2(f.Published.AARE), fmt.Sprintf("%+.2f", f.Published.Bias), f2(f.Published.SD), fmt.Sprintf("%.1f", f.Published.MaxARE)
			r.Mult, r.Tuned, r.CV = fmt.Sprintf("%.3f", f.Multiplier), f2(f.Tuned.AARE), "n/a"
			if f.CV.Points > 0 {
				r.CV = f2(f.CV.AARE)
			}
		}
		r.Refit, r.RefitCV = "–", "–"
		if rf := f.Refit; rf != nil {
			pv.Refit = true
			r.Refit, r.RefitCV = f2(rf.Tuned.AARE), f2(rf.CV.AARE)
			switch {
			case rf.Better:
				remarks = append(remarks, "refit predicts unseen samples better")
			case rf.Overfits:
				remarks = append(remarks, "refit overfits: better on the database, worse on unseen samples")
			case rf.Worse:
				remarks = append(remarks, "refit predicts unseen samples worse")
			}
			var cs []string
			for _, c := range rf.Coefficients {
				if c.Held != "" {
					cs = append(cs, fmt.Sprintf("%s %.5g held (%s)", c.ID, c.Published, c.Held))
				} else {
					cs = append(cs, fmt.Sprintf("%s %.5g → %.5g (folds %.5g to %.5g)", c.ID, c.Published, c.Refit, c.FoldMin, c.FoldMax))
				}
			}
			if rf.MultiplierFree {
				cs = append(cs, fmt.Sprintf("multiplier %.4f", rf.Multiplier))
			}
			pv.Coefficients = append(pv.Coefficients, kv{f.Family, strings.Join(cs, "; ")})
		} else if f.RefitNote != "" {
			pv.Refit = true // the refit was asked for; this family has none
			pv.Coefficients = append(pv.Coefficients, kv{f.Family, "no refit: " + f.RefitNote})
		}
		r.Remarks = strings.Join(remarks, "; ")
		pv.Rows = append(pv.Rows, r)
		if f.Points == 0 {
			continue
		}
		svg, caption, err := surveyCrossPlot(sp, f)
		if err != nil {
			return pv, err
		}
		pv.Plots = append(pv.Plots, surveyPlot{Family: f.Family, SVG: template.HTML(svg), Caption: caption, Open: i == 0})
	}
	if len(sp.Families) > 0 && sp.Families[0].Points > 0 {
		b := sp.Families[0]
		pv.Best = fmt.Sprintf("%s × %.3f", b.Family, b.Multiplier)
		if b.CV.Points > 0 {
			pv.Best += fmt.Sprintf(", cross-validated AARE %.2f %%", b.CV.AARE)
		}
	}
	return pv, nil
}

// surveyCrossPlot draws a family's predictions against the lab values: published (copper) and
// tuned with the multiplier of the folds that did not hold the sample (teal), with the 45° line
// and ±10 % lines. Viscosities, which span decades, are drawn on logarithmic axes.
func surveyCrossPlot(sp fit.SurveyProperty, f fit.SurveyFamily) (string, string, error) {
	pr := f.Pred
	n := len(pr.Lab)
	step := 1
	if n > surveyPlotMax {
		step = (n + surveyPlotMax - 1) / surveyPlotMax
	}
	tuned := pr.CV
	tunedName := "tuned, cross-validated"
	if tuned == nil {
		tuned, tunedName = pr.Tuned, "tuned"
	}
	var pub, tun plotter.XYs
	lo, hi := math.Inf(1), math.Inf(-1)
	for a := 0; a < n; a += step {
		pub = append(pub, plotter.XY{X: pr.Lab[a], Y: pr.Published[a]})
		tun = append(tun, plotter.XY{X: pr.Lab[a], Y: tuned[a]})
		for _, x := range []float64{pr.Lab[a], pr.Published[a], tuned[a]} {
			lo, hi = math.Min(lo, x), math.Max(hi, x)
		}
	}
	logAxes := sp.Property == fit.MuDead || sp.Property == fit.MuSat
	if logAxes {
		lo, hi = lo/1.15, hi*1.15
	} else {
		pad := 0.05 * (hi - lo)
		if pad == 0 {
			pad = 0.05 * hi
		}
		lo, hi = math.Max(0, lo-pad), hi+pad
	}
	p := plot.New()
	sans := func(size vg.Length) font.Font { return font.Font{Typeface: "Liberation", Variant: "Sans", Size: size} }
	unit := sp.Unit
	p.X.Label.Text = "lab [" + unit + "]"
	p.Y.Label.Text = "predicted [" + unit + "]"
	p.X.Label.TextStyle.Font, p.Y.Label.TextStyle.Font = sans(10), sans(10)
	p.X.Tick.Label.Font, p.Y.Tick.Label.Font = sans(9), sans(9)
	p.X.Label.TextStyle.Color, p.Y.Label.TextStyle.Color = colInk, colInk
	p.Legend.TextStyle.Font = sans(9)
	p.Legend.TextStyle.Color = colInk
	p.Legend.Padding = vg.Points(2)
	p.Legend.Top, p.Legend.Left = true, true
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = lo, hi, lo, hi
	if logAxes {
		p.X.Scale, p.Y.Scale = plot.LogScale{}, plot.LogScale{}
		p.X.Tick.Marker, p.Y.Tick.Marker = plot.LogTicks{Prec: -1}, plot.LogTicks{Prec: -1}
	} else {
		p.X.Tick.Marker, p.Y.Tick.Marker = tickFormat{}, tickFormat{}
	}
	p.BackgroundColor = color.White
	grid := plotter.NewGrid()
	grid.Vertical.Color, grid.Horizontal.Color = colGrid, colGrid
	p.Add(grid)
	line := func(k float64, c color.Color, dashes []vg.Length, name string) error {
		l, err := plotter.NewLine(plotter.XYs{{X: lo, Y: k * lo}, {X: hi, Y: k * hi}})
		if err != nil {
			return err
		}
		l.Color, l.Width, l.Dashes = c, vg.Points(1), dashes
		p.Add(l)
		if name != "" {
			p.Legend.Add(name, l)
		}
		return nil
	}
	if err := line(1, colInk, nil, "45° line"); err != nil {
		return "", "", err
	}
	for _, k := range []float64{0.9, 1.1} {
		name := ""
		if k > 1 {
			name = "±10 %"
		}
		if err := line(k, colGrid, []vg.Length{vg.Points(3), vg.Points(2)}, name); err != nil {
			return "", "", err
		}
	}
	for _, s := range []struct {
		pts  plotter.XYs
		c    color.Color
		r    vg.Length
		name string
	}{{pub, colPublished, vg.Points(2), "published"}, {tun, colTuned, vg.Points(2.4), tunedName}} {
		sc, err := plotter.NewScatter(s.pts)
		if err != nil {
			return "", "", err
		}
		sc.GlyphStyle = draw.GlyphStyle{Color: s.c, Radius: s.r, Shape: draw.CircleGlyph{}}
		p.Add(sc)
		p.Legend.Add(s.name, sc)
	}
	svg, err := renderSVG(p)
	if err != nil {
		return "", "", err
	}
	caption := fmt.Sprintf("%s: %s against the lab values of %s; tuned = multiplier %.3f", f.Family, "predictions", plural(n, "sample"), f.Multiplier)
	if pr.CV != nil {
		caption += ", each sample predicted by the multiplier fitted without its fold"
	}
	if step > 1 {
		caption += fmt.Sprintf("; one sample in %d drawn (%d of %d)", step, len(pub), n)
	}
	return svg, caption + ".", nil
}
