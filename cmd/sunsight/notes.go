package main

import (
	"fmt"
	"io"
	"math"
	"strconv"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// attitudeDraws are the tumble draws of one attitude of the run.
type attitudeDraws struct {
	attitude string // "primary" or the mode's name
	law      scenario.Law
	draws    []study.TumbleDraw
}

// tumbleDraws lists the draws of the primary attitude and of each mode that
// tumbles.
func (o *runOutput) tumbleDraws() []attitudeDraws {
	units := len(o.res.Units)
	var out []attitudeDraws
	if d := study.TumbleDraws(o.s, o.s.Attitude, units); d != nil {
		out = append(out, attitudeDraws{"primary", o.s.Attitude.Law, d})
	}
	for _, m := range o.s.Modes {
		if d := study.TumbleDraws(o.s, m.Attitude, units); d != nil {
			out = append(out, attitudeDraws{m.Name, m.Attitude.Law, d})
		}
	}
	return out
}

// motion names how a drawn tumble then moves.
func motion(l scenario.Law) string {
	if l.HasInertia {
		return "torque-free (Euler's equations, given inertia)"
	}
	return "fixed-axis spin (no inertia given)"
}

// maxDrawLines bounds the units listed in the summary (JSON and CSV list all).
const maxDrawLines = 5

// writeNotes prints the warnings and the tumble draws under the summary's
// header.
func (o *runOutput) writeNotes(w io.Writer) {
	for _, m := range o.warnings {
		fmt.Fprintf(w, "  warning: %s\n", m)
	}
	for _, a := range o.tumbleDraws() {
		fmt.Fprintf(w, "  tumble (%s): rate drawn uniformly in [%.3g, %.3g]°/s, axis isotropic, per unit; then %s\n",
			a.attitude, a.law.MinRateRadS*180/math.Pi, a.law.MaxRateRadS*180/math.Pi, motion(a.law))
		for i, d := range a.draws {
			if i == maxDrawLines {
				fmt.Fprintf(w, "    … %d more unit(s) in the JSON record and tumble_draws.csv\n", len(a.draws)-maxDrawLines)
				break
			}
			fmt.Fprintf(w, "    unit %d: %.2f°/s about body (%+.3f, %+.3f, %+.3f)\n", d.Unit, d.RateDegS, d.AxisBody.X, d.AxisBody.Y, d.AxisBody.Z)
		}
	}
}

// tumbleDrawsRecord is one tumbling attitude's draws in the JSON record.
type tumbleDrawsRecord struct {
	Attitude    string             `json:"attitude"`
	MinRateDegS num                `json:"min_rate_deg_s"`
	MaxRateDegS num                `json:"max_rate_deg_s"`
	TorqueFree  bool               `json:"torque_free"`
	Motion      string             `json:"motion"`
	Units       []tumbleUnitRecord `json:"units"`
}

type tumbleUnitRecord struct {
	Unit     int    `json:"unit"`
	RateDegS num    `json:"rate_deg_s"`
	AxisBody [3]num `json:"axis_body"`
}

// notesJSON fills the record's warnings and tumble draws.
func (o *runOutput) notesJSON(rec *runRecord) {
	rec.Warnings = append([]string{}, o.warnings...)
	for _, a := range o.tumbleDraws() {
		r := tumbleDrawsRecord{Attitude: a.attitude, MinRateDegS: num(a.law.MinRateRadS * 180 / math.Pi),
			MaxRateDegS: num(a.law.MaxRateRadS * 180 / math.Pi), TorqueFree: a.law.HasInertia, Motion: motion(a.law)}
		for _, d := range a.draws {
			r.Units = append(r.Units, tumbleUnitRecord{Unit: d.Unit, RateDegS: num(d.RateDegS),
				AxisBody: [3]num{num(d.AxisBody.X), num(d.AxisBody.Y), num(d.AxisBody.Z)}})
		}
		rec.TumbleDraws = append(rec.TumbleDraws, r)
	}
}

// drawsCSV is tumble_draws.csv (nil when nothing tumbles).
func (o *runOutput) drawsCSV() [][]string {
	ds := o.tumbleDraws()
	if len(ds) == 0 {
		return nil
	}
	rows := [][]string{{"attitude", "unit", "rate_deg_s", "axis_body_x", "axis_body_y", "axis_body_z", "torque_free"}}
	for _, a := range ds {
		for _, d := range a.draws {
			rows = append(rows, []string{a.attitude, strconv.Itoa(d.Unit), ff(d.RateDegS, 6), ff(d.AxisBody.X, 6), ff(d.AxisBody.Y, 6), ff(d.AxisBody.Z, 6),
				strconv.FormatBool(a.law.HasInertia)})
		}
	}
	return rows
}

// printWarnings writes each warning to stderr.
func printWarnings(stderr io.Writer, ws []string) {
	for _, m := range ws {
		fmt.Fprintf(stderr, "sunsight: warning: %s\n", m)
	}
}
