package albedo

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// Grid is a latitude × longitude map of reflectivity, one map for the whole
// year or one per calendar month, looked up at the nearest cell in
// Earth-fixed coordinates (longitude = right ascension of the point − GMST).
//
// File format (CSV, '#' starts a comment line):
//
//	lat_deg,-165,-135,...,165          header: cell-centre longitudes, deg
//	75,0.61,0.60,...                   one row per cell-centre latitude, deg
//
// With a month per map the header starts with "month,lat_deg" and each row
// with its month 1…12; all twelve months must be present, each with the same
// latitudes. Longitudes and latitudes are equally spaced cell centres that
// tile the globe (n·Δlon = 360°, n·Δlat = 180°). Values lie in [0, 1].
type Grid struct {
	nLat, nLon int
	months     int     // 1 or 12
	lon0       float64 // western edge of the first column, rad
	dLat, dLon float64 // rad
	values     []float64
	// latBin[b] is the latitude row of every sin φ in bin b of [−1, 1]
	// (latBins equal bins), or −1 where a row edge falls in the bin.
	latBin []int32
	// perLon = 1/dLon; lonSlackCols = lonSlack/dLon (columnOf).
	perLon, lonSlackCols float64
}

// latBins is the number of bins in sin φ of Grid.latBin.
const latBins = 8192

// GridError is a parse error with its place in the file.
type GridError struct {
	Line, Column int // 1-based; Column 0 when the whole line is at fault
	Err          error
}

func (e *GridError) Error() string {
	if e.Column > 0 {
		return fmt.Sprintf("albedo: grid line %d, column %d: %v", e.Line, e.Column, e.Err)
	}
	return fmt.Sprintf("albedo: grid line %d: %v", e.Line, e.Err)
}

func (e *GridError) Unwrap() error { return e.Err }

// Months returns 1 for a year-round map, 12 for monthly maps.
func (g *Grid) Months() int { return g.months }

// Size returns the number of latitude rows and longitude columns.
func (g *Grid) Size() (lat, lon int) { return g.nLat, g.nLon }

// Reflectance implements Reflectance.
func (g *Grid) Reflectance(lat, lon, jdTT float64) float64 {
	return g.at(lat, lon, monthOf(jdTT))
}

// at looks up the nearest cell; month is 1…12.
func (g *Grid) at(lat, lon float64, month int) float64 {
	return g.value(g.row(lat), g.column(lon), month)
}

// row returns the latitude row of lat (rad).
func (g *Grid) row(lat float64) int {
	return max(0, min(g.nLat-1, int((lat+math.Pi/2)/g.dLat)))
}

// column returns the longitude column of lon (rad, any turn).
func (g *Grid) column(lon float64) int {
	x := math.Mod(lon-g.lon0, 2*math.Pi)
	if x < 0 {
		x += 2 * math.Pi
	}
	return max(0, min(g.nLon-1, int(x/g.dLon)))
}

// value returns the reflectivity of row i, column j in month 1…12.
func (g *Grid) value(i, j, month int) float64 {
	k := 0
	if g.months == 12 {
		k = month - 1
	}
	return g.values[(k*g.nLat+i)*g.nLon+j]
}

// binSlack widens each sin φ bin of latBin when its row is decided, so
// that rounding in the bin index never matters.
const binSlack = 1e-12

// buildLatBins fills latBin: bin b holds sin φ ∈ [−1 + 2b/B, −1 + 2(b+1)/B];
// its row is row(asin(·)) at both ends widened by binSlack when they agree
// (row and asin are monotone, so every sin φ inside has that row), else −1.
func (g *Grid) buildLatBins() {
	g.latBin = make([]int32, latBins)
	for b := range g.latBin {
		lo := max(-1, -1+2*float64(b)/latBins-binSlack)
		hi := min(1, -1+2*float64(b+1)/latBins+binSlack)
		i, k := g.row(math.Asin(lo)), g.row(math.Asin(hi))
		g.latBin[b] = -1
		if i == k {
			g.latBin[b] = int32(i)
		}
	}
}

// rowOfSin returns row(asin(q)) for q = sin φ ∈ [−1, 1]: from latBin where
// the bin decides it, else through asin.
func (g *Grid) rowOfSin(q float64) int {
	if b := int((q + 1) * (latBins / 2)); b >= 0 && b < latBins && g.latBin != nil {
		if i := g.latBin[b]; i >= 0 {
			return int(i)
		}
	}
	return g.row(math.Asin(q))
}

// lonSlack is how far (rad) an approximate longitude must lie from every
// column edge to decide the column: far above the error of fastAtan2
// (atanMaxErr) and the rounding of the exact path.
const lonSlack = 1e-6

// columnOf returns column(atan2(y, x) − gmst): from fastAtan2 when that
// lies more than lonSlack from a column edge, else through math.Atan2.
func (g *Grid) columnOf(y, x, gmst float64) int {
	if a, ok := fastAtan2(y, x); ok {
		t := a - gmst - g.lon0
		t -= 2 * math.Pi * math.Floor(t*(0.5/math.Pi))
		u := t * g.perLon
		j := int(u)
		if f := u - float64(j); f > g.lonSlackCols && f < 1-g.lonSlackCols && j < g.nLon {
			return j
		}
	}
	return g.column(math.Atan2(y, x) - gmst)
}

// atanNodes tabulates atan on [0, 1] at atanSteps + 1 equal steps.
const atanSteps = 1024

// atanMaxErr bounds the error of linear interpolation in atanNodes:
// h²/8 · max|atan”| = h²/8 · 3√3/8 with h = 1/atanSteps (closed form),
// plus rounding (TestFastAtan2 checks it).
const atanMaxErr = 1.0 / (atanSteps * atanSteps) / 8 * 0.65 * 1.1

var atanNodes = func() []float64 {
	t := make([]float64, atanSteps+2)
	for k := range t {
		t[k] = math.Atan(float64(k) / atanSteps)
	}
	return t
}()

// fastAtan2 returns atan2(y, x) within atanMaxErr, by octant reduction and
// linear interpolation in atanNodes; ok is false at the origin or for a
// non-finite input.
func fastAtan2(y, x float64) (a float64, ok bool) {
	ax, ay := math.Abs(x), math.Abs(y)
	swap := ay > ax
	if swap {
		ax, ay = ay, ax
	}
	if !(ax > 0) || math.IsInf(ax, 0) {
		return 0, false
	}
	u := ay / ax * atanSteps // in [0, atanSteps]
	k := int(u)
	a = atanNodes[k] + (atanNodes[k+1]-atanNodes[k])*(u-float64(k))
	if swap {
		a = math.Pi/2 - a
	}
	if x < 0 {
		a = math.Pi - a
	}
	if y < 0 {
		a = -a
	}
	return a, true
}

const spacingTol = 1e-6 // deg, tolerance on equal spacing and tiling

// ParseGrid reads a reflectivity grid (format in Grid). Errors are *GridError
// with the line and column at fault.
func ParseGrid(rd io.Reader) (*Grid, error) {
	cr := csv.NewReader(rd)
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	cr.TrimLeadingSpace = true
	cr.ReuseRecord = false

	header, err := cr.Read()
	if err == io.EOF {
		return nil, &GridError{Line: 1, Err: errors.New("empty file: expected a header \"lat_deg,<longitudes>\" or \"month,lat_deg,<longitudes>\"")}
	}
	if err != nil {
		return nil, csvError(err)
	}
	hline, _ := cr.FieldPos(0)
	monthly := false
	first := 1
	switch strings.TrimSpace(strings.ToLower(header[0])) {
	case "lat_deg":
	case "month":
		monthly = true
		first = 2
		if len(header) < 2 || strings.TrimSpace(strings.ToLower(header[1])) != "lat_deg" {
			return nil, &GridError{Line: hline, Column: 2, Err: errors.New("after \"month\" the header needs \"lat_deg\"")}
		}
	default:
		return nil, &GridError{Line: hline, Column: 1, Err: fmt.Errorf("header starts with %q: expected \"lat_deg\" or \"month\"", header[0])}
	}
	if len(header)-first < 1 {
		return nil, &GridError{Line: hline, Err: errors.New("header lists no longitudes")}
	}
	lons := make([]float64, 0, len(header)-first)
	for c := first; c < len(header); c++ {
		v, err := strconv.ParseFloat(strings.TrimSpace(header[c]), 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v < -360 || v > 360 {
			return nil, &GridError{Line: hline, Column: c + 1, Err: fmt.Errorf("longitude %q: want a number of degrees in [-360, 360]", header[c])}
		}
		lons = append(lons, v)
	}
	dLon := 360.0 / float64(len(lons))
	for k := 1; k < len(lons); k++ {
		if math.Abs(lons[k]-lons[k-1]-dLon) > spacingTol {
			return nil, &GridError{Line: hline, Column: first + k + 1, Err: fmt.Errorf("longitude %g: columns must increase by 360/%d = %g deg to tile the globe", lons[k], len(lons), dLon)}
		}
	}

	type row struct {
		month int
		lat   float64
		vals  []float64
		line  int
	}
	var rows []row
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvError(err)
		}
		line, _ := cr.FieldPos(0)
		if len(rec) != len(header) {
			return nil, &GridError{Line: line, Err: fmt.Errorf("%d fields, the header has %d", len(rec), len(header))}
		}
		rw := row{month: 1, line: line}
		if monthly {
			mo, err := strconv.Atoi(strings.TrimSpace(rec[0]))
			if err != nil || mo < 1 || mo > 12 {
				return nil, &GridError{Line: line, Column: 1, Err: fmt.Errorf("month %q: want an integer 1…12", rec[0])}
			}
			rw.month = mo
		}
		lat, err := strconv.ParseFloat(strings.TrimSpace(rec[first-1]), 64)
		if err != nil || !(lat > -90 && lat < 90) {
			return nil, &GridError{Line: line, Column: first, Err: fmt.Errorf("latitude %q: want a cell-centre latitude in (-90, 90) deg", rec[first-1])}
		}
		rw.lat = lat
		rw.vals = make([]float64, len(lons))
		for c := first; c < len(rec); c++ {
			v, err := strconv.ParseFloat(strings.TrimSpace(rec[c]), 64)
			if err != nil || !(v >= 0 && v <= 1) {
				return nil, &GridError{Line: line, Column: c + 1, Err: fmt.Errorf("reflectivity %q: want a number in [0, 1]", rec[c])}
			}
			rw.vals[c-first] = v
		}
		rows = append(rows, rw)
	}
	if len(rows) == 0 {
		return nil, &GridError{Line: hline + 1, Err: errors.New("no data rows after the header")}
	}

	// Group by month, check each month has the same equally spaced latitudes.
	nMonths := 1
	if monthly {
		nMonths = 12
	}
	byMonth := make([][]row, nMonths)
	for _, rw := range rows {
		byMonth[rw.month-1] = append(byMonth[rw.month-1], rw)
	}
	nLat := len(byMonth[0])
	for k := range byMonth {
		if len(byMonth[k]) == 0 {
			return nil, &GridError{Line: rows[len(rows)-1].line, Column: 1, Err: fmt.Errorf("month %d has no rows: a monthly grid needs all twelve months", k+1)}
		}
		if len(byMonth[k]) != nLat {
			return nil, &GridError{Line: byMonth[k][0].line, Column: 1, Err: fmt.Errorf("month %d has %d latitude rows, month 1 has %d", k+1, len(byMonth[k]), nLat)}
		}
	}
	dLat := 180.0 / float64(nLat)
	g := &Grid{nLat: nLat, nLon: len(lons), months: nMonths,
		dLat: dLat * math.Pi / 180, dLon: dLon * math.Pi / 180,
		lon0:   (lons[0] - dLon/2) * math.Pi / 180,
		values: make([]float64, nMonths*nLat*len(lons))}
	for k, mrows := range byMonth {
		seen := make([]bool, nLat)
		for _, rw := range mrows {
			f := (rw.lat + 90) / dLat // cell centre: f = i + 1/2
			i := int(math.Floor(f))
			if math.Abs(f-float64(i)-0.5)*dLat > spacingTol || i < 0 || i >= nLat {
				return nil, &GridError{Line: rw.line, Column: first, Err: fmt.Errorf("latitude %g is not a cell centre of a %d-row grid (−90 + (i + ½)·%g deg)", rw.lat, nLat, dLat)}
			}
			if seen[i] {
				return nil, &GridError{Line: rw.line, Column: first, Err: fmt.Errorf("latitude %g repeated in month %d", rw.lat, k+1)}
			}
			seen[i] = true
			copy(g.values[(k*nLat+i)*len(lons):], rw.vals)
		}
	}
	g.buildLatBins()
	g.perLon, g.lonSlackCols = 1/g.dLon, lonSlack/g.dLon
	return g, nil
}

func csvError(err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &GridError{Line: pe.Line, Column: pe.Column, Err: pe.Err}
	}
	return &GridError{Line: 0, Err: err}
}
