package export

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"slices"
	"sort"
	"strings"
	"unicode/utf8"

	"labmatch/fit"
	"labmatch/lab"
)

// FormatVersion is the version of the tuning-file layout written by this package. Version 2
// records the depth of every property, its ladder and the pb bend and refitted coefficients;
// version 1 files (one multiplier, or multiplier and shift, per property) still load.
const FormatVersion = 2

// ErrFingerprint means a tuning file was made for other report files than the ones given.
var ErrFingerprint = errors.New("export: the tuning file was made from a different report (fingerprint mismatch)")

// TuningFile is the JSON record of a tuned fluid description.
type TuningFile struct {
	FormatVersion int                       `json:"format_version"`
	Tool          string                    `json:"tool"`
	Report        string                    `json:"report"`
	Fingerprint   string                    `json:"report_sha256"`
	Options       TuningOptions             `json:"options"`
	Properties    map[string]PropertyTuning `json:"properties"`
	Notes         []string                  `json:"notes,omitempty"`
	// Fluid is the report's fluid description, so that tables can be made from the file
	// alone; absent in files written before it was added.
	Fluid *FluidRecord `json:"fluid,omitempty"`
}

// TuningOptions are the options the tuning ran with.
type TuningOptions struct {
	// Depth is the depth forced for every property; "" = chosen per property by leave-one-out.
	Depth string `json:"depth"`
	// Mode is the version 1 form of the depth: "multiplier" or "multiplier+shift".
	Mode           string  `json:"mode,omitempty"`
	Loss           string  `json:"loss"`
	HuberDelta     float64 `json:"huber_delta"`
	PseudoCritical string  `json:"pseudo_critical"`
}

// PropertyTuning is the tuned state of one property.
type PropertyTuning struct {
	Family string `json:"family"`
	// Depth is the rung of the parameters (absent in version 1 files: see TuningOptions.Mode).
	Depth          fit.Depth  `json:"depth,omitempty"`
	Parameters     fit.Params `json:"parameters"`
	CoefficientIDs []string   `json:"coefficient_ids,omitempty"` // names of parameters.coefficients
	AARELOO        *float64   `json:"aare_pct_loo,omitempty"`
	Ladder         []fit.Rung `json:"ladder,omitempty"`
	NoFit          string     `json:"no_fit,omitempty"`

	ShiftUnit  string                `json:"shift_unit"`
	CI95       map[string][2]float64 `json:"ci95,omitempty"`
	CIAssumed  bool                  `json:"ci95_assumed_uncertainty,omitempty"`
	Published  fit.Stats             `json:"published"`
	Tuned      fit.Stats             `json:"tuned"`
	Excluded   []int                 `json:"excluded_points"`
	Flags      []string              `json:"flags,omitempty"`
	OutOfRange []string              `json:"out_of_range,omitempty"`
}

// NewTuningFile records tuning results for a report.
func NewTuningFile(tool string, r *lab.Report, results map[fit.PropertyID]fit.Result, opts fit.Options, notes []string) TuningFile {
	opts = opts.Resolved()
	tf := TuningFile{FormatVersion: FormatVersion, Tool: tool, Report: r.Fluid.Sample, Fingerprint: r.Fingerprint,
		Options:    TuningOptions{Depth: string(opts.Depth), Loss: string(opts.Loss), HuberDelta: opts.HuberDelta, PseudoCritical: opts.PseudoCritical},
		Properties: map[string]PropertyTuning{}, Notes: notes}
	for p, res := range results {
		ex := res.Excluded
		if ex == nil {
			ex = []int{}
		}
		tf.Properties[string(p)] = PropertyTuning{Family: res.Family, Depth: res.Depth, Parameters: res.Params, CoefficientIDs: res.CoefficientIDs,
			AARELOO: res.LOO, Ladder: res.Ladder, NoFit: res.NoFit, ShiftUnit: res.ShiftUnit, CI95: res.CI95,
			CIAssumed: res.CIAssumed, Published: res.Published, Tuned: res.Tuned, Excluded: ex, Flags: res.Flags, OutOfRange: res.OutOfRange}
	}
	if ds, err := fit.NewDataset(r); err == nil {
		f := NewFluidRecord(ds, r)
		tf.Fluid = &f
	}
	return tf
}

// FitOptions returns the options recorded in the file, with the excluded points.
func (tf TuningFile) FitOptions() fit.Options {
	o := fit.Options{Depth: fit.Depth(tf.Options.Depth), Loss: fit.Loss(tf.Options.Loss), HuberDelta: tf.Options.HuberDelta,
		PseudoCritical: tf.Options.PseudoCritical, Excluded: map[fit.PropertyID][]int{}}
	for p, pt := range tf.Properties {
		if len(pt.Excluded) > 0 {
			o.Excluded[fit.PropertyID(p)] = append([]int(nil), pt.Excluded...)
		}
	}
	return o
}

// Results returns the recorded families and parameters in the form fit.NewModel takes.
func (tf TuningFile) Results() map[fit.PropertyID]fit.Result {
	out := map[fit.PropertyID]fit.Result{}
	for p, pt := range tf.Properties {
		out[fit.PropertyID(p)] = fit.Result{Property: fit.PropertyID(p), Family: pt.Family, Depth: pt.Depth, Params: pt.Parameters, ShiftUnit: pt.ShiftUnit,
			CoefficientIDs: pt.CoefficientIDs, LOO: pt.AARELOO, Ladder: pt.Ladder, NoFit: pt.NoFit,
			CI95: pt.CI95, Published: pt.Published, Tuned: pt.Tuned, Excluded: pt.Excluded, Flags: pt.Flags, OutOfRange: pt.OutOfRange}
	}
	return out
}

// Matches checks the file against a report: the fingerprints must agree unless force is set.
func (tf TuningFile) Matches(r *lab.Report, force bool) error {
	if force || tf.Fingerprint == r.Fingerprint {
		return nil
	}
	return fmt.Errorf("%w: file %.12s…, report %.12s… (use --force to apply it anyway)", ErrFingerprint, tf.Fingerprint, r.Fingerprint)
}

// SaveTuning writes the tuning file atomically; an existing file is kept unless force is set.
func SaveTuning(path string, tf TuningFile, force bool) error {
	data, err := json.MarshalIndent(tf, "", "  ")
	if err != nil {
		return fmt.Errorf("export: %w", err)
	}
	return lab.WriteFileAtomic(path, append(data, '\n'), force)
}

// LoadTuning reads a tuning file and checks its version and families.
func LoadTuning(path string) (TuningFile, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return TuningFile{}, fmt.Errorf("export: %w", err)
	}
	var tf TuningFile
	if err := json.Unmarshal(data, &tf); err != nil {
		return TuningFile{}, fmt.Errorf("export: %s%s: not a tuning file: %w", path, jsonPosition(data, err), err)
	}
	if tf.FormatVersion != 1 && tf.FormatVersion != FormatVersion {
		return TuningFile{}, fmt.Errorf("export: %s: format version %d, this labmatch reads 1 and %d", path, tf.FormatVersion, FormatVersion)
	}
	if err := tf.validate(); err != nil {
		return TuningFile{}, fmt.Errorf("export: %s: %w", path, err)
	}
	if tf.FormatVersion == 1 {
		tf.upgrade()
	}
	return tf, nil
}

// jsonPosition gives ":line:column" of a JSON syntax or type error in data (the byte where
// the decoder stopped), or "" when the error carries no offset.
func jsonPosition(data []byte, err error) string {
	var off int64
	var se *json.SyntaxError
	var te *json.UnmarshalTypeError
	switch {
	case errors.As(err, &se):
		off = se.Offset
		if strings.HasPrefix(se.Error(), "invalid character") {
			off-- // the offset is past the character; point at it
		}
	case errors.As(err, &te):
		off = te.Offset
	default:
		return ""
	}
	off = min(max(off, 0), int64(len(data)))
	before := data[:off]
	line := 1 + bytes.Count(before, []byte{'\n'})
	col := 1 + utf8.RuneCount(before[bytes.LastIndexByte(before, '\n')+1:])
	return fmt.Sprintf(":%d:%d", line, col)
}

// upgrade turns a validated version 1 file into the version 2 form: its mode becomes the
// depth of every property (multiplier+shift is the shape depth).
func (tf *TuningFile) upgrade() {
	d := fit.DepthMultiplier
	if tf.Options.Mode == "multiplier+shift" {
		d = fit.DepthShape
	}
	for p, pt := range tf.Properties {
		pt.Depth = d
		if fit.PropertyID(p) == fit.Z {
			if !strings.Contains(pt.Family, "+") {
				pt.Family = v1PseudoCritical(tf.Options.PseudoCritical) + "+" + pt.Family
			}
			// Version 1 tuned Z as m·Z + s; version 2 as 1 + m·(Z − 1) + s', the same Z with
			// s' = s + m − 1 (a shift, so the shape depth).
			pt.Parameters.Shift += pt.Parameters.Multiplier - 1
			if pt.Parameters.Shift != 0 {
				pt.Depth = fit.DepthShape
			}
		}
		tf.Properties[p] = pt
	}
	tf.Options.Mode, tf.Options.Depth = "", ""
	tf.FormatVersion = FormatVersion
}

// validate checks what a hand-edited or damaged tuning file could get wrong.
func (tf TuningFile) validate() error {
	if tf.FormatVersion == 1 {
		switch tf.Options.Mode {
		case "", "multiplier", "multiplier+shift":
		default:
			return fmt.Errorf("options: mode %q, want multiplier or multiplier+shift", tf.Options.Mode)
		}
	} else if tf.Options.Depth != "" && !validDepth(fit.Depth(tf.Options.Depth)) {
		return fmt.Errorf("options: depth %q, want one of %v or empty", tf.Options.Depth, fit.Depths)
	}
	switch fit.Loss(tf.Options.Loss) {
	case "", fit.Relative, fit.Absolute, fit.Huber:
	default:
		return fmt.Errorf("options: loss %q, want relative, absolute or huber", tf.Options.Loss)
	}
	if tf.Options.HuberDelta < 0 || tf.Options.HuberDelta >= 1 {
		return fmt.Errorf("options: huber_delta %g, want 0 (default) to 1", tf.Options.HuberDelta)
	}
	switch tf.Options.PseudoCritical {
	case "", "sutton", "standing":
	default:
		return fmt.Errorf("options: pseudo_critical %q, want sutton or standing", tf.Options.PseudoCritical)
	}
	if tf.Fluid != nil {
		if err := tf.Fluid.validate(); err != nil {
			return err
		}
	}
	keys := make([]string, 0, len(tf.Properties))
	for p := range tf.Properties {
		keys = append(keys, p)
	}
	sort.Strings(keys)
	for _, p := range keys {
		pt := tf.Properties[p]
		fams := fit.Families(fit.PropertyID(p))
		if len(fams) == 0 {
			return fmt.Errorf("unknown property %q", p)
		}
		fam := pt.Family
		if fit.PropertyID(p) == fit.Z && !strings.Contains(fam, "+") {
			fam = v1PseudoCritical(tf.Options.PseudoCritical) + "+" + fam // a version 1 Z method id
		}
		if !slices.Contains(fams, fam) {
			return fmt.Errorf("property %q: unknown family %q (known: %v)", p, pt.Family, fams)
		}
		if tf.FormatVersion > 1 && !validDepth(pt.Depth) {
			return fmt.Errorf("property %q: depth %q, want one of %v", p, pt.Depth, fit.Depths)
		}
		q := pt.Parameters
		m := q.Multiplier
		if fit.PropertyID(p) == fit.Pb {
			// The pb scale is fixed by the report's Pb and has no bound of its own.
			if !(m > 0) || math.IsInf(m, 0) {
				return fmt.Errorf("property %q: pressure scale %g, want a finite value > 0", p, m)
			}
		} else if !(m >= fit.MinMultiplier && m <= fit.MaxMultiplier) {
			return fmt.Errorf("property %q: multiplier %g outside [%g, %g]", p, m, fit.MinMultiplier, fit.MaxMultiplier)
		}
		if math.IsNaN(q.Shift) || math.IsInf(q.Shift, 0) {
			return fmt.Errorf("property %q: shift %g is not a number", p, q.Shift)
		}
		if tf.FormatVersion == 1 && tf.Options.Mode != "multiplier+shift" && q.Shift != 0 {
			return fmt.Errorf("property %q: shift %g in mode %q, which has no shift", p, q.Shift, tf.Options.Mode)
		}
		if e := q.Bend; e != 0 && !(e >= fit.MinMultiplier && e <= fit.MaxMultiplier) {
			return fmt.Errorf("property %q: exponent %g outside [%g, %g]", p, e, fit.MinMultiplier, fit.MaxMultiplier)
		}
		if q.Coefficients != nil {
			cs := fit.DeclaredCoefficients(fit.PropertyID(p), pt.Family)
			if len(cs) != len(q.Coefficients) {
				return fmt.Errorf("property %q: %d coefficients, family %s declares %d", p, len(q.Coefficients), pt.Family, len(cs))
			}
			for j, c := range cs {
				r := q.Coefficients[j] / c.Value
				if !(r >= fit.MinCoefficientRatio*0.999999 && r <= fit.MaxCoefficientRatio*1.000001) {
					return fmt.Errorf("property %q: coefficient %s = %g is outside %g–%g times its published %g", p, c.ID, q.Coefficients[j], fit.MinCoefficientRatio, fit.MaxCoefficientRatio, c.Value)
				}
			}
		}
	}
	return nil
}

// ErrNoFluid means a tuning file lacks the fluid record that tables need without the report.
var ErrNoFluid = errors.New("export: the tuning file has no fluid record (written by an older labmatch); give the report folder with --tuning")

// Model builds the tuned model from the tuning file alone, from its fluid record.
func (tf TuningFile) Model() (*fit.Model, *fit.Dataset, error) {
	if tf.Fluid == nil {
		return nil, nil, ErrNoFluid
	}
	ds := tf.Fluid.Dataset(tf.Report)
	m, err := fit.NewModel(ds, tf.Results(), tf.FitOptions())
	if err != nil {
		return nil, nil, fmt.Errorf("export: tuning file: %w", err)
	}
	return m, ds, nil
}

func validDepth(d fit.Depth) bool { return slices.Contains(fit.Depths, d) }

// v1PseudoCritical is the pseudo-critical method a version 1 file's Z method ran with.
func v1PseudoCritical(recorded string) string {
	if recorded == "" {
		return "sutton"
	}
	return recorded
}
