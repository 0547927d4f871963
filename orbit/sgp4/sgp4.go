package sgp4

import (
	"errors"
	"fmt"
	"math"
)

// Gravity holds the Earth constants SGP4 is run with. TLEs are fitted with
// WGS 72 (Hoots & Roehrich 1980; Vallado et al. 2006 §III.B), so WGS72 is the
// one to use with them.
type Gravity struct {
	Mu      float64 // km³/s²
	RadiusE float64 // km
	J2      float64
	J3      float64
	J4      float64
}

// WGS72 are the constants of the WGS 72 Earth model used to fit and to
// propagate TLEs (Vallado et al. 2006, AIAA 2006-6753, getgravconst "wgs72").
var WGS72 = Gravity{Mu: 398600.8, RadiusE: 6378.135, J2: 0.001082616, J3: -0.00000253881, J4: -0.00000165597}

// Elements are the mean elements of one TLE, in the units SGP4 uses: angles
// in radians, the mean motion in radians per minute (Kozai form, as the TLE
// gives it), B* in inverse Earth radii.
type Elements struct {
	EpochDays1950 float64 // days since 1949 December 31 00:00 UTC (JD 2433281.5)
	MeanMotion    float64 // no_kozai, rad/min
	Eccentricity  float64
	Inclination   float64
	RAAN          float64
	ArgPerigee    float64
	MeanAnomaly   float64
	BStar         float64
}

// Errors returned by Propagate (the error codes of Vallado et al. 2006).
var (
	ErrEccentricity = errors.New("sgp4: mean eccentricity left [0, 1)")
	ErrMeanMotion   = errors.New("sgp4: mean motion became negative")
	ErrPerturbedEcc = errors.New("sgp4: perturbed eccentricity left [0, 1]")
	ErrSemiLatus    = errors.New("sgp4: semi-latus rectum became negative")
	ErrDecayed      = errors.New("sgp4: the satellite has decayed (radius below one Earth radius)")
)

const (
	twoPi = 2 * math.Pi
	x2o3  = 2.0 / 3.0
	temp4 = 1.5e-12
)

// Model is an initialised SGP4/SDP4 element set. Propagate is safe to call
// from one goroutine at a time (the deep-space resonance integrator keeps its
// last step, as the published code does).
type Model struct {
	g                             Gravity
	xke, tumin, j3oj2             float64
	el                            Elements
	noUnkozai                     float64
	isimp                         bool
	deep                          bool
	aycof, con41, cc1, cc4, cc5   float64
	d2, d3, d4, delmo, eta        float64
	argpdot, omgcof, sinmao       float64
	t2cof, t3cof, t4cof, t5cof    float64
	x1mth2, x7thm1, mdot          float64
	nodedot, xlcof, xmcof         float64
	nodecf                        float64
	ecco, inclo, nodeo, argpo, mo float64 // possibly changed by the deep-space init

	// deep space
	irez                                                   int
	d2201, d2211, d3210, d3222, d4410, d4422, d5220, d5232 float64
	d5421, d5433, dedt, del1, del2, del3, didt, dmdt       float64
	dnodt, domdt, e3, ee2, peo, pgho, pho, pinco, plo      float64
	se2, se3, sgh2, sgh3, sgh4, sh2, sh3, si2, si3         float64
	sl2, sl3, sl4, gsto, xfact, xgh2, xgh3, xgh4, xh2, xh3 float64
	xi2, xi3, xl2, xl3, xl4, xlamo, zmol, zmos             float64
	atime, xli, xni                                        float64
}

// New initialises SGP4 (near-Earth, period < 225 min) or SDP4 (deep space,
// with lunar-solar terms and the 12 h / 24 h resonances) for the element set,
// following sgp4init of Vallado et al. 2006 with its "improved" operation
// mode (GMST from the IAU 1982 formula).
func New(el Elements, g Gravity) (*Model, error) {
	if !(el.MeanMotion > 0) || math.IsInf(el.MeanMotion, 0) {
		return nil, fmt.Errorf("sgp4: mean motion %v rad/min; allowed > 0", el.MeanMotion)
	}
	if el.Eccentricity < 0 || el.Eccentricity >= 1 || math.IsNaN(el.Eccentricity) {
		return nil, fmt.Errorf("sgp4: eccentricity %v; allowed [0, 1)", el.Eccentricity)
	}
	m := &Model{g: g, el: el}
	m.xke = 60 / math.Sqrt(g.RadiusE*g.RadiusE*g.RadiusE/g.Mu)
	m.tumin = 1 / m.xke
	m.j3oj2 = g.J3 / g.J2
	m.ecco, m.inclo, m.nodeo, m.argpo, m.mo = el.Eccentricity, el.Inclination, el.RAAN, el.ArgPerigee, el.MeanAnomaly
	bstar := el.BStar

	ss := 78.0/g.RadiusE + 1.0
	qzms2ttemp := (120.0 - 78.0) / g.RadiusE
	qzms2t := qzms2ttemp * qzms2ttemp * qzms2ttemp * qzms2ttemp

	// initl: recover the Brouwer mean motion from the Kozai one.
	eccsq := m.ecco * m.ecco
	omeosq := 1.0 - eccsq
	rteosq := math.Sqrt(omeosq)
	cosio := math.Cos(m.inclo)
	cosio2 := cosio * cosio
	ak := math.Pow(m.xke/el.MeanMotion, x2o3)
	d1 := 0.75 * g.J2 * (3.0*cosio2 - 1.0) / (rteosq * omeosq)
	del := d1 / (ak * ak)
	adel := ak * (1.0 - del*del - del*(1.0/3.0+134.0*del*del/81.0))
	del = d1 / (adel * adel)
	m.noUnkozai = el.MeanMotion / (1.0 + del)
	ao := math.Pow(m.xke/m.noUnkozai, x2o3)
	sinio := math.Sin(m.inclo)
	po := ao * omeosq
	con42 := 1.0 - 5.0*cosio2
	m.con41 = -con42 - cosio2 - cosio2
	posq := po * po
	rp := ao * (1.0 - m.ecco)
	m.gsto = gmst1982(el.EpochDays1950 + 2433281.5)

	m.isimp = rp < 220.0/g.RadiusE+1.0
	sfour := ss
	qzms24 := qzms2t
	perige := (rp - 1.0) * g.RadiusE
	if perige < 156.0 {
		sfour = perige - 78.0
		if perige < 98.0 {
			sfour = 20.0
		}
		q := (120.0 - sfour) / g.RadiusE
		qzms24 = q * q * q * q
		sfour = sfour/g.RadiusE + 1.0
	}
	pinvsq := 1.0 / posq
	tsi := 1.0 / (ao - sfour)
	m.eta = ao * m.ecco * tsi
	etasq := m.eta * m.eta
	eeta := m.ecco * m.eta
	psisq := math.Abs(1.0 - etasq)
	coef := qzms24 * math.Pow(tsi, 4.0)
	coef1 := coef / math.Pow(psisq, 3.5)
	cc2 := coef1 * m.noUnkozai * (ao*(1.0+1.5*etasq+eeta*(4.0+etasq)) +
		0.375*g.J2*tsi/psisq*m.con41*(8.0+3.0*etasq*(8.0+etasq)))
	m.cc1 = bstar * cc2
	cc3 := 0.0
	if m.ecco > 1.0e-4 {
		cc3 = -2.0 * coef * tsi * m.j3oj2 * m.noUnkozai * sinio / m.ecco
	}
	m.x1mth2 = 1.0 - cosio2
	m.cc4 = 2.0 * m.noUnkozai * coef1 * ao * omeosq *
		(m.eta*(2.0+0.5*etasq) + m.ecco*(0.5+2.0*etasq) -
			g.J2*tsi/(ao*psisq)*(-3.0*m.con41*(1.0-2.0*eeta+etasq*(1.5-0.5*eeta))+
				0.75*m.x1mth2*(2.0*etasq-eeta*(1.0+etasq))*math.Cos(2.0*m.argpo)))
	m.cc5 = 2.0 * coef1 * ao * omeosq * (1.0 + 2.75*(etasq+eeta) + eeta*etasq)
	cosio4 := cosio2 * cosio2
	temp1 := 1.5 * g.J2 * pinvsq * m.noUnkozai
	temp2 := 0.5 * temp1 * g.J2 * pinvsq
	temp3 := -0.46875 * g.J4 * pinvsq * pinvsq * m.noUnkozai
	m.mdot = m.noUnkozai + 0.5*temp1*rteosq*m.con41 + 0.0625*temp2*rteosq*(13.0-78.0*cosio2+137.0*cosio4)
	m.argpdot = -0.5*temp1*con42 + 0.0625*temp2*(7.0-114.0*cosio2+395.0*cosio4) +
		temp3*(3.0-36.0*cosio2+49.0*cosio4)
	xhdot1 := -temp1 * cosio
	m.nodedot = xhdot1 + (0.5*temp2*(4.0-19.0*cosio2)+2.0*temp3*(3.0-7.0*cosio2))*cosio
	xpidot := m.argpdot + m.nodedot
	m.omgcof = bstar * cc3 * math.Cos(m.argpo)
	if m.ecco > 1.0e-4 {
		m.xmcof = -x2o3 * coef * bstar / eeta
	}
	m.nodecf = 3.5 * omeosq * xhdot1 * m.cc1
	m.t2cof = 1.5 * m.cc1
	if math.Abs(cosio+1.0) > 1.5e-12 {
		m.xlcof = -0.25 * m.j3oj2 * sinio * (3.0 + 5.0*cosio) / (1.0 + cosio)
	} else {
		m.xlcof = -0.25 * m.j3oj2 * sinio * (3.0 + 5.0*cosio) / temp4
	}
	m.aycof = -0.5 * m.j3oj2 * sinio
	dm := 1.0 + m.eta*math.Cos(m.mo)
	m.delmo = dm * dm * dm
	m.sinmao = math.Sin(m.mo)
	m.x7thm1 = 7.0*cosio2 - 1.0

	if twoPi/m.noUnkozai >= 225.0 {
		m.deep = true
		m.isimp = true
		m.initDeepSpace(el.EpochDays1950, eccsq, xpidot)
	}
	if !m.isimp {
		cc1sq := m.cc1 * m.cc1
		m.d2 = 4.0 * ao * tsi * cc1sq
		temp := m.d2 * tsi * m.cc1 / 3.0
		m.d3 = (17.0*ao + sfour) * temp
		m.d4 = 0.5 * temp * ao * tsi * (221.0*ao + 31.0*sfour) * m.cc1
		m.t3cof = m.d2 + 2.0*cc1sq
		m.t4cof = 0.25 * (3.0*m.d3 + m.cc1*(12.0*m.d2+10.0*cc1sq))
		m.t5cof = 0.2 * (3.0*m.d4 + 12.0*m.cc1*m.d3 + 6.0*m.d2*m.d2 + 15.0*cc1sq*(2.0*m.d2+cc1sq))
	}
	if _, _, err := m.Propagate(0); err != nil {
		return nil, err
	}
	return m, nil
}

// Deep reports whether the element set runs with the deep-space (SDP4)
// terms: period ≥ 225 min.
func (m *Model) Deep() bool { return m.deep }

// Propagate returns the position (km) and velocity (km/s) in the TEME frame
// of the date (true equator, mean equinox) tsince minutes after the element
// set's epoch (sgp4 of Vallado et al. 2006).
func (m *Model) Propagate(tsince float64) (r, v [3]float64, err error) {
	g := m.g
	vkmpersec := g.RadiusE * m.xke / 60.0
	t := tsince

	xmdf := m.mo + m.mdot*t
	argpdf := m.argpo + m.argpdot*t
	nodedf := m.nodeo + m.nodedot*t
	argpm := argpdf
	mm := xmdf
	t2 := t * t
	nodem := nodedf + m.nodecf*t2
	tempa := 1.0 - m.cc1*t
	tempe := m.el.BStar * m.cc4 * t
	templ := m.t2cof * t2
	if !m.isimp {
		delomg := m.omgcof * t
		dmt := 1.0 + m.eta*math.Cos(xmdf)
		delm := m.xmcof * (dmt*dmt*dmt - m.delmo)
		temp := delomg + delm
		mm = xmdf + temp
		argpm = argpdf - temp
		t3 := t2 * t
		t4 := t3 * t
		tempa = tempa - m.d2*t2 - m.d3*t3 - m.d4*t4
		tempe = tempe + m.el.BStar*m.cc5*(math.Sin(mm)-m.sinmao)
		templ = templ + m.t3cof*t3 + t4*(m.t4cof+t*m.t5cof)
	}
	nm := m.noUnkozai
	em := m.ecco
	inclm := m.inclo
	if m.deep {
		em, argpm, inclm, mm, nodem, nm = m.deepSecular(t, em, argpm, inclm, mm, nodem, nm)
	}
	if nm <= 0.0 {
		return r, v, ErrMeanMotion
	}
	am := math.Pow(m.xke/nm, x2o3) * tempa * tempa
	nm = m.xke / math.Pow(am, 1.5)
	em -= tempe
	if em >= 1.0 || em < -0.001 {
		return r, v, ErrEccentricity
	}
	if em < 1.0e-6 {
		em = 1.0e-6
	}
	mm += m.noUnkozai * templ
	xlm := mm + argpm + nodem
	nodem = math.Mod(nodem, twoPi)
	argpm = math.Mod(argpm, twoPi)
	xlm = math.Mod(xlm, twoPi)
	mm = math.Mod(xlm-argpm-nodem, twoPi)

	sinim, cosim := math.Sincos(inclm)
	ep, xincp, argpp, nodep, mp := em, inclm, argpm, nodem, mm
	sinip, cosip := sinim, cosim
	aycof, xlcof := m.aycof, m.xlcof
	con41, x1mth2, x7thm1 := m.con41, m.x1mth2, m.x7thm1
	if m.deep {
		ep, xincp, nodep, argpp, mp = m.periodics(false, t, m.inclo, ep, xincp, nodep, argpp, mp)
		if xincp < 0.0 {
			xincp = -xincp
			nodep += math.Pi
			argpp -= math.Pi
		}
		if ep < 0.0 || ep > 1.0 {
			return r, v, ErrPerturbedEcc
		}
		sinip, cosip = math.Sincos(xincp)
		aycof = -0.5 * m.j3oj2 * sinip
		if math.Abs(cosip+1.0) > 1.5e-12 {
			xlcof = -0.25 * m.j3oj2 * sinip * (3.0 + 5.0*cosip) / (1.0 + cosip)
		} else {
			xlcof = -0.25 * m.j3oj2 * sinip * (3.0 + 5.0*cosip) / temp4
		}
	}

	// Long-period periodics and Kepler's equation in the Lyddane variables.
	axnl := ep * math.Cos(argpp)
	temp := 1.0 / (am * (1.0 - ep*ep))
	aynl := ep*math.Sin(argpp) + temp*aycof
	xl := mp + argpp + nodep + temp*xlcof*axnl
	u := math.Mod(xl-nodep, twoPi)
	eo1 := u
	tem5 := 9999.9
	var sineo1, coseo1 float64
	for ktr := 1; math.Abs(tem5) >= 1.0e-12 && ktr <= 10; ktr++ {
		sineo1, coseo1 = math.Sincos(eo1)
		tem5 = 1.0 - coseo1*axnl - sineo1*aynl
		tem5 = (u - aynl*coseo1 + axnl*sineo1 - eo1) / tem5
		if math.Abs(tem5) >= 0.95 {
			tem5 = math.Copysign(0.95, tem5)
		}
		eo1 += tem5
	}
	// Short-period periodics.
	ecose := axnl*coseo1 + aynl*sineo1
	esine := axnl*sineo1 - aynl*coseo1
	el2 := axnl*axnl + aynl*aynl
	pl := am * (1.0 - el2)
	if pl < 0.0 {
		return r, v, ErrSemiLatus
	}
	rl := am * (1.0 - ecose)
	rdotl := math.Sqrt(am) * esine / rl
	rvdotl := math.Sqrt(pl) / rl
	betal := math.Sqrt(1.0 - el2)
	temp = esine / (1.0 + betal)
	sinu := am / rl * (sineo1 - aynl - axnl*temp)
	cosu := am / rl * (coseo1 - axnl + aynl*temp)
	su := math.Atan2(sinu, cosu)
	sin2u := (cosu + cosu) * sinu
	cos2u := 1.0 - 2.0*sinu*sinu
	temp = 1.0 / pl
	temp1 := 0.5 * g.J2 * temp
	temp2 := temp1 * temp
	if m.deep {
		cosisq := cosip * cosip
		con41 = 3.0*cosisq - 1.0
		x1mth2 = 1.0 - cosisq
		x7thm1 = 7.0*cosisq - 1.0
	}
	mrt := rl*(1.0-1.5*temp2*betal*con41) + 0.5*temp1*x1mth2*cos2u
	su -= 0.25 * temp2 * x7thm1 * sin2u
	xnode := nodep + 1.5*temp2*cosip*sin2u
	xinc := xincp + 1.5*temp2*cosip*sinip*cos2u
	mvt := rdotl - nm*temp1*x1mth2*sin2u/m.xke
	rvdot := rvdotl + nm*temp1*(x1mth2*cos2u+1.5*con41)/m.xke

	sinsu, cossu := math.Sincos(su)
	snod, cnod := math.Sincos(xnode)
	sini, cosi := math.Sincos(xinc)
	xmx := -snod * cosi
	xmy := cnod * cosi
	ux := xmx*sinsu + cnod*cossu
	uy := xmy*sinsu + snod*cossu
	uz := sini * sinsu
	vx := xmx*cossu - cnod*sinsu
	vy := xmy*cossu - snod*sinsu
	vz := sini * cossu
	mr := mrt * g.RadiusE
	r = [3]float64{mr * ux, mr * uy, mr * uz}
	v = [3]float64{(mvt*ux + rvdot*vx) * vkmpersec, (mvt*uy + rvdot*vy) * vkmpersec, (mvt*uz + rvdot*vz) * vkmpersec}
	if mrt < 1.0 {
		return r, v, ErrDecayed
	}
	return r, v, nil
}

// gmst1982 is the Greenwich mean sidereal time (rad, [0, 2π)) of the UT1
// Julian date, IAU 1982 (Vallado et al. 2006, gstime).
func gmst1982(jdut1 float64) float64 {
	tut1 := (jdut1 - 2451545.0) / 36525.0
	temp := -6.2e-6*tut1*tut1*tut1 + 0.093104*tut1*tut1 + (876600.0*3600+8640184.812866)*tut1 + 67310.54841
	temp = math.Mod(temp*(math.Pi/180)/240.0, twoPi)
	if temp < 0 {
		temp += twoPi
	}
	return temp
}
