package main

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// seriesFile writes series.csv as the run goes (sim.Config.SeriesSink): each
// piece of unit 0's time series is formatted into a hidden temporary file
// beside the output folder, so a long run never holds its series in memory.
// The output set takes the file in when it is complete (place); a run that
// fails or is interrupted removes it (discard).
type seriesFile struct {
	p         *atomicfile.Pending
	out       io.Writer   // p (a test puts a failing writer here)
	w         *csv.Writer // the header (sensor names may need quoting), onto out
	epoch     time.Time
	withPower bool
	head      bool   // the header is written
	buf       []byte // one row
	outDir    string // the --csv folder, for messages
}

// newSeriesFile opens the temporary file beside the output folder outDir
// (its parent, so that the final rename stays on one file system).
func newSeriesFile(outDir string, epoch time.Time, withPower bool) (*seriesFile, error) {
	p, err := atomicfile.Create(filepath.Dir(filepath.Clean(outDir)), ".sunsight-series-*.csv.tmp")
	if err != nil {
		return nil, err
	}
	return &seriesFile{p: p, out: p, w: csv.NewWriter(p), epoch: epoch, withPower: withPower, outDir: outDir}, nil
}

// write appends the rows of one piece of the series; powerW is the array
// power at its samples (nil without panels). Its errors name the output
// folder and the file, not the temporary file.
func (sf *seriesFile) write(p *sim.Series, powerW []float64) error {
	if err := sf.writeRows(p, powerW); err != nil {
		return fmt.Errorf("--csv %s: series.csv: %w (the run stopped; no output written)", sf.outDir, bare(err))
	}
	return nil
}

// bare is err without the temporary file's path, which means nothing to the
// user.
func bare(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err
	}
	return err
}

func (sf *seriesFile) writeRows(p *sim.Series, powerW []float64) error {
	if sf.withPower != (powerW != nil) {
		return errors.New("series.csv: the power column comes and goes between pieces")
	}
	if !sf.head {
		head := []string{"t_s", "utc", "region", "sun_disc_visible_fraction", "sensors_seeing_sun", "valid",
			"error_no_albedo_deg", "error_albedo_deg", "error_onboard_corrected_deg", "beta_deg", "sun_body_az_deg", "sun_body_el_deg"}
		if sf.withPower {
			head = append(head, "array_power_w")
		}
		for _, n := range p.SensorName {
			head = append(head, "signal_"+n)
		}
		if err := sf.w.Write(head); err != nil {
			return err
		}
		sf.head = true
	}
	// The rows are numbers, region names and times, none of which CSV
	// quotes: they are appended as bytes, without a string per field
	// (the same bytes as csv.Writer writes for them).
	if err := sf.w.Error(); err != nil {
		return err
	}
	sf.w.Flush()
	b := sf.buf
	for i, t := range p.T {
		b = b[:0]
		b = appendFF(b, t, 1)
		b = append(b, ',')
		b = appendUTC(b, sf.epoch, t)
		b = append(b, ',')
		b = append(b, regionName(p.Region[i])...)
		b = append(b, ',')
		b = appendFF(b, p.Lit[i], 6)
		b = append(b, ',')
		b = strconv.AppendInt(b, int64(p.Seen[i]), 10)
		b = append(b, ',')
		b = strconv.AppendBool(b, p.Valid[i])
		for _, f := range [...]struct {
			v    float64
			prec int
		}{{p.ErrNoDeg[i], 4}, {p.ErrAlbDeg[i], 4}, {p.ErrCorrDeg[i], 4}, {p.BetaDeg[i], 4}, {p.SunBodyAz[i], 3}, {p.SunBodyEl[i], 3}} {
			b = append(b, ',')
			b = appendFF(b, f.v, f.prec)
		}
		if sf.withPower {
			b = append(b, ',')
			b = appendFF(b, powerW[i], 4)
		}
		for _, v := range p.SignalsAt(i) {
			b = append(b, ',')
			b = appendFF(b, v, 5)
		}
		b = append(b, '\n')
		if _, err := sf.out.Write(b); err != nil {
			sf.buf = b
			return err
		}
	}
	sf.buf = b
	return nil
}

// regionNames are the region column's words (illum.Region's names in lower
// case), by region.
var regionNames = [...]string{
	illum.Sunlit:   strings.ToLower(illum.Sunlit.String()),
	illum.Penumbra: strings.ToLower(illum.Penumbra.String()),
	illum.Umbra:    strings.ToLower(illum.Umbra.String()),
}

func regionName(r illum.Region) string {
	if int(r) >= 0 && int(r) < len(regionNames) {
		return regionNames[r]
	}
	return strings.ToLower(r.String())
}

// appendFF appends ff(v, prec): nothing for NaN.
func appendFF(b []byte, v float64, prec int) []byte {
	if math.IsNaN(v) {
		return b
	}
	return strconv.AppendFloat(b, v, 'f', prec, 64)
}

// appendUTC appends utcOf(epoch, t).
func appendUTC(b []byte, epoch time.Time, t float64) []byte {
	if math.IsNaN(t) {
		return b
	}
	return epoch.Add(time.Duration(t*float64(time.Second))).UTC().AppendFormat(b, "2006-01-02T15:04:05.000Z")
}

// place completes the file and moves it to dir/series.csv (dir: the output
// set being filled).
func (sf *seriesFile) place(dir string) error {
	sf.w.Flush()
	if err := sf.w.Error(); err != nil {
		sf.p.Abort()
		return bare(err)
	}
	return bare(sf.p.Commit(filepath.Join(dir, "series.csv")))
}

// discard removes the temporary file unless it was placed.
func (sf *seriesFile) discard() {
	if sf != nil {
		sf.p.Abort()
	}
}
