package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
)

func init() {
	register(command{name: "orbit", summary: "period, sun-synchronous inclination, RAAN and J2 drift of a circular or elliptic orbit",
		args: "--altitude-km KM (--ltan HH:MM --epoch RFC3339 | --inclination-deg DEG) [flags]", about: orbitAbout,
		examples: []string{"sunsight orbit --altitude-km 550 --ltan 10:30 --epoch 2027-03-20T12:00:00Z",
			"sunsight orbit --altitude-km 420 --inclination-deg 51.6"},
		run: runOrbit})
}

const orbitAbout = `Prints the orbit's period, sun-synchronous inclination, RAAN (from the local
mean solar time of the ascending node), nodal drift and the other secular J2
rates. Without --inclination-deg the orbit is sun-synchronous. The altitude is
the mean semi-major axis minus the WGS 84 equatorial radius.
`

func runOrbit(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("orbit")
	alt := fs.Float64("altitude-km", math.NaN(), "mean altitude above the equatorial radius, `KM` (required, > 0)")
	ltan := fs.String("ltan", "", "local solar time of the ascending node, `HH:MM` (00:00 to 23:59), mean unless --ltan-solar-time apparent")
	solarTime := fs.String("ltan-solar-time", orbit.MeanSolarTime, "the solar time --ltan is read in: `mean` (the mean sun) or apparent (the true sun, differs by the equation of time)")
	epochS := fs.String("epoch", "", "epoch, UTC, `RFC3339` such as 2027-03-20T12:00:00Z (required with --ltan)")
	incl := fs.Float64("inclination-deg", math.NaN(), "inclination, `DEG` in [0, 180] (when absent: sun-synchronous)")
	ecc := fs.Float64("ecc", 0, "eccentricity, `E` in [0, 1)")
	noDefault(fs, "altitude-km", "inclination-deg")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) > 0 {
		return usagef("unexpected argument %q; orbit takes flags only", pos[0])
	}
	if math.IsNaN(*alt) {
		return usagef("--altitude-km is required (a number of km above the equator, e.g. 550)")
	}
	if !(*alt > 0) || math.IsInf(*alt, 0) {
		return usagef("--altitude-km %g: must be a positive number of km", *alt)
	}
	if !(*ecc >= 0 && *ecc < 1) {
		return usagef("--ecc %g: eccentricity must be in [0, 1)", *ecc)
	}
	// The same orbit sizes as scenario files and TLEs.
	if msg := scenario.OrbitSizeError(orbit.RadiusEarthKm+*alt, *ecc); msg != "" {
		return usagef("--altitude-km %g --ecc %g: %s", *alt, *ecc, msg)
	}
	// The local time of the node (and the epoch it needs) is required for a
	// sun-synchronous orbit; with --inclination-deg it is optional and only
	// adds the RAAN.
	if *ltan == "" && math.IsNaN(*incl) {
		return usagef("--ltan is required for a sun-synchronous orbit (local time of the ascending node, HH:MM, e.g. 10:30); or give --inclination-deg")
	}
	// The epoch and the solar time only place the node of --ltan.
	if *ltan == "" {
		for _, n := range []string{"epoch", "ltan-solar-time"} {
			if fs.Changed(n) {
				return usagef("--%s places the ascending node of --ltan only; without --ltan it changes nothing: give --ltan HH:MM for the RAAN, or leave --%s out", n, n)
			}
		}
	}
	var ltanH float64
	var epoch time.Time
	if *ltan != "" {
		var err error
		if ltanH, err = parseClock(*ltan); err != nil {
			return usagef("--ltan %q: %v", *ltan, err)
		}
		if *epochS == "" {
			return usagef("--epoch is required with --ltan (UTC, RFC 3339, e.g. 2027-03-20T12:00:00Z)")
		}
		if epoch, err = time.Parse(time.RFC3339, *epochS); err != nil {
			return usagef("--epoch %q: not an RFC 3339 time; write e.g. 2027-03-20T12:00:00Z", *epochS)
		}
	}
	a := orbit.RadiusEarthKm + *alt
	if rp := a * (1 - *ecc); rp < orbit.RadiusEarthKm {
		return usagef("--ecc %g: perigee altitude %.1f km is below the surface; lower --ecc or raise --altitude-km", *ecc, rp-orbit.RadiusEarthKm)
	}
	sso, ssoErr := orbit.SunSyncInclination(a, *ecc)
	inc := sso
	if !math.IsNaN(*incl) {
		if !(*incl >= 0 && *incl <= 180) {
			return usagef("--inclination-deg %g: must be in [0, 180]", *incl)
		}
		inc = *incl * math.Pi / 180
	} else if ssoErr != nil {
		return usagef("--altitude-km %g: %v; give --inclination-deg", *alt, ssoErr)
	}
	el := orbit.Elements{SemiMajorAxisKm: a, Eccentricity: *ecc, Inclination: inc}
	if *ltan != "" {
		raan, err := orbit.RAANFromLTANSolar(ltanH, epoch, *solarTime)
		if err != nil {
			return usagef("--ltan-solar-time %q: allowed mean or apparent", *solarTime)
		}
		el.RAAN = raan
	}
	dΩ, dω, dM := orbit.J2RatesSecondOrder(el)
	const degPerDay = 180 / math.Pi * 86400
	fmt.Fprintf(stdout, "semi-major axis        %.3f km (mean)\n", a)
	fmt.Fprintf(stdout, "period                 %.3f min\n", orbit.Period(a)/60)
	if ssoErr != nil {
		fmt.Fprintf(stdout, "sun-synchronous incl.  none at this altitude\n")
	} else {
		fmt.Fprintf(stdout, "sun-synchronous incl.  %.3f deg\n", sso*180/math.Pi)
	}
	fmt.Fprintf(stdout, "inclination            %.3f deg\n", inc*180/math.Pi)
	if *ltan != "" {
		fmt.Fprintf(stdout, "RAAN (EME2000)         %.3f deg at %s for LTAN %s %s solar time\n", el.RAAN*180/math.Pi, epoch.UTC().Format(time.RFC3339), formatClock(ltanH), *solarTime)
	}
	fmt.Fprintf(stdout, "nodal drift            %+.5f deg/day\n", dΩ*degPerDay)
	fmt.Fprintf(stdout, "perigee drift          %+.5f deg/day\n", dω*degPerDay)
	fmt.Fprintf(stdout, "mean-anomaly rate      %.5f deg/day (J2 part %+.5f)\n", dM*degPerDay, (dM-2*math.Pi/orbit.Period(a))*degPerDay)
	drift := (dΩ - orbit.SunMeanMotion) * 86400 / (2 * math.Pi) * 24 * 60 // min of LTAN per day
	if math.IsNaN(*incl) {
		fmt.Fprintf(stdout, "LTAN drift             none (sun-synchronous)\n")
	} else {
		fmt.Fprintf(stdout, "LTAN drift             %+.3f min/day (%+.2f h per 30 days)\n", drift, drift*30/60)
	}
	fmt.Fprintln(stdout, "note: secular J2 to second order only (no drag, no other harmonics); an analysis aid, not for flight decisions")
	return nil
}

// parseClock reads HH:MM (or H:MM) as hours in [0, 24).
func parseClock(s string) (float64, error) {
	hh, mm, ok := strings.Cut(s, ":")
	h, err1 := strconv.Atoi(hh)
	m, err2 := strconv.Atoi(mm)
	if !ok || err1 != nil || err2 != nil || len(mm) != 2 {
		return 0, errors.New("write the local time as HH:MM, e.g. 10:30")
	}
	if h < 0 || h > 23 || m < 0 || m > 59 {
		return 0, errors.New("hours must be 00 to 23 and minutes 00 to 59")
	}
	return float64(h) + float64(m)/60, nil
}

func formatClock(h float64) string {
	m := int(math.Round(h * 60))
	return fmt.Sprintf("%02d:%02d", m/60%24, m%60)
}
