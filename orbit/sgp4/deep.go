package sgp4

import "math"

// The deep-space (SDP4) part: lunar-solar secular and periodic terms and the
// geopotential resonances of 12 h and 24 h orbits (dscom, dsinit, dspace,
// dpper of Vallado et al. 2006, AIAA 2006-6753; Hoots & Roehrich 1980,
// Spacetrack Report No. 3, §§ 10–12).

const (
	zns  = 1.19459e-5
	zes  = 0.01675
	znl  = 1.5835218e-4
	zel  = 0.05490
	rptm = 4.37526908801129966e-3 // Earth rotation, rad/min
)

// common holds the dscom outputs that dsinit needs.
type common struct {
	sinim, cosim, emsq                           float64
	s1, s2, s3, s4, s5, ss1, ss2, ss3, ss4, ss5  float64
	sz1, sz3, sz11, sz13, sz21, sz23, sz31, sz33 float64
	z1, z3, z11, z13, z21, z23, z31, z33         float64
	em, nm                                       float64
}

// initDeepSpace runs dscom, the initial dpper and dsinit.
func (m *Model) initDeepSpace(epoch, eccsq, xpidot float64) {
	c := m.dscom(epoch, m.ecco, m.argpo, 0, m.inclo, m.nodeo, m.noUnkozai)
	m.ecco, m.inclo, m.nodeo, m.argpo, m.mo = m.periodics(true, 0, m.inclo, m.ecco, m.inclo, m.nodeo, m.argpo, m.mo)
	m.dsinit(c, xpidot, eccsq)
}

func (m *Model) dscom(epoch, ep, argpp, tc, inclp, nodep, np float64) common {
	const (
		c1ss   = 2.9864797e-6
		c1l    = 4.7968065e-7
		zsinis = 0.39785416
		zcosis = 0.91744867
		zcosgs = 0.1945905
		zsings = -0.98088458
	)
	var c common
	c.nm = np
	c.em = ep
	snodm, cnodm := math.Sincos(nodep)
	sinomm, cosomm := math.Sincos(argpp)
	c.sinim, c.cosim = math.Sincos(inclp)
	c.emsq = c.em * c.em
	betasq := 1.0 - c.emsq
	rtemsq := math.Sqrt(betasq)
	m.peo, m.pinco, m.plo, m.pgho, m.pho = 0, 0, 0, 0, 0
	day := epoch + 18261.5 + tc/1440.0
	xnodce := math.Mod(4.5236020-9.2422029e-4*day, twoPi)
	stem, ctem := math.Sincos(xnodce)
	zcosil := 0.91375164 - 0.03568096*ctem
	zsinil := math.Sqrt(1.0 - zcosil*zcosil)
	zsinhl := 0.089683511 * stem / zsinil
	zcoshl := math.Sqrt(1.0 - zsinhl*zsinhl)
	gam := 5.8351514 + 0.0019443680*day
	zx := 0.39785416 * stem / zsinil
	zy := zcoshl*ctem + 0.91744867*zsinhl*stem
	zx = math.Atan2(zx, zy)
	zx = gam + zx - xnodce
	zsingl, zcosgl := math.Sincos(zx)

	zcosg, zsing, zcosi, zsini := zcosgs, zsings, zcosis, zsinis
	zcosh, zsinh := cnodm, snodm
	cc := c1ss
	xnoi := 1.0 / c.nm
	var ss6, ss7, sz2, sz12, sz22, sz32 float64
	var s6, s7, z2, z12, z22, z32 float64
	for lsflg := 1; lsflg <= 2; lsflg++ {
		a1 := zcosg*zcosh + zsing*zcosi*zsinh
		a3 := -zsing*zcosh + zcosg*zcosi*zsinh
		a7 := -zcosg*zsinh + zsing*zcosi*zcosh
		a8 := zsing * zsini
		a9 := zsing*zsinh + zcosg*zcosi*zcosh
		a10 := zcosg * zsini
		a2 := c.cosim*a7 + c.sinim*a8
		a4 := c.cosim*a9 + c.sinim*a10
		a5 := -c.sinim*a7 + c.cosim*a8
		a6 := -c.sinim*a9 + c.cosim*a10
		x1 := a1*cosomm + a2*sinomm
		x2 := a3*cosomm + a4*sinomm
		x3 := -a1*sinomm + a2*cosomm
		x4 := -a3*sinomm + a4*cosomm
		x5 := a5 * sinomm
		x6 := a6 * sinomm
		x7 := a5 * cosomm
		x8 := a6 * cosomm
		z31 := 12.0*x1*x1 - 3.0*x3*x3
		z32 = 24.0*x1*x2 - 6.0*x3*x4
		z33 := 12.0*x2*x2 - 3.0*x4*x4
		z1 := 3.0*(a1*a1+a2*a2) + z31*c.emsq
		z2 = 6.0*(a1*a3+a2*a4) + z32*c.emsq
		z3 := 3.0*(a3*a3+a4*a4) + z33*c.emsq
		z11 := -6.0*a1*a5 + c.emsq*(-24.0*x1*x7-6.0*x3*x5)
		z12 = -6.0*(a1*a6+a3*a5) + c.emsq*(-24.0*(x2*x7+x1*x8)-6.0*(x3*x6+x4*x5))
		z13 := -6.0*a3*a6 + c.emsq*(-24.0*x2*x8-6.0*x4*x6)
		z21 := 6.0*a2*a5 + c.emsq*(24.0*x1*x5-6.0*x3*x7)
		z22 = 6.0*(a4*a5+a2*a6) + c.emsq*(24.0*(x2*x5+x1*x6)-6.0*(x4*x7+x3*x8))
		z23 := 6.0*a4*a6 + c.emsq*(24.0*x2*x6-6.0*x4*x8)
		z1 = z1 + z1 + betasq*z31
		z2 = z2 + z2 + betasq*z32
		z3 = z3 + z3 + betasq*z33
		s3 := cc * xnoi
		s2 := -0.5 * s3 / rtemsq
		s4 := s3 * rtemsq
		s1 := -15.0 * c.em * s4
		s5 := x1*x3 + x2*x4
		s6 = x2*x3 + x1*x4
		s7 = x2*x4 - x1*x3
		c.s1, c.s2, c.s3, c.s4, c.s5 = s1, s2, s3, s4, s5
		c.z1, c.z3, c.z11, c.z13, c.z21, c.z23, c.z31, c.z33 = z1, z3, z11, z13, z21, z23, z31, z33
		if lsflg == 1 {
			c.ss1, c.ss2, c.ss3, c.ss4, c.ss5 = s1, s2, s3, s4, s5
			ss6, ss7 = s6, s7
			c.sz1, sz2, c.sz3 = z1, z2, z3
			c.sz11, sz12, c.sz13 = z11, z12, z13
			c.sz21, sz22, c.sz23 = z21, z22, z23
			c.sz31, sz32, c.sz33 = z31, z32, z33
			zcosg, zsing, zcosi, zsini = zcosgl, zsingl, zcosil, zsinil
			zcosh = zcoshl*cnodm + zsinhl*snodm
			zsinh = snodm*zcoshl - cnodm*zsinhl
			cc = c1l
		}
	}
	m.zmol = math.Mod(4.7199672+0.22997150*day-gam, twoPi)
	m.zmos = math.Mod(6.2565837+0.017201977*day, twoPi)

	m.se2 = 2.0 * c.ss1 * ss6
	m.se3 = 2.0 * c.ss1 * ss7
	m.si2 = 2.0 * c.ss2 * sz12
	m.si3 = 2.0 * c.ss2 * (c.sz13 - c.sz11)
	m.sl2 = -2.0 * c.ss3 * sz2
	m.sl3 = -2.0 * c.ss3 * (c.sz3 - c.sz1)
	m.sl4 = -2.0 * c.ss3 * (-21.0 - 9.0*c.emsq) * zes
	m.sgh2 = 2.0 * c.ss4 * sz32
	m.sgh3 = 2.0 * c.ss4 * (c.sz33 - c.sz31)
	m.sgh4 = -18.0 * c.ss4 * zes
	m.sh2 = -2.0 * c.ss2 * sz22
	m.sh3 = -2.0 * c.ss2 * (c.sz23 - c.sz21)
	m.ee2 = 2.0 * c.s1 * s6
	m.e3 = 2.0 * c.s1 * s7
	m.xi2 = 2.0 * c.s2 * z12
	m.xi3 = 2.0 * c.s2 * (c.z13 - c.z11)
	m.xl2 = -2.0 * c.s3 * z2
	m.xl3 = -2.0 * c.s3 * (c.z3 - c.z1)
	m.xl4 = -2.0 * c.s3 * (-21.0 - 9.0*c.emsq) * zel
	m.xgh2 = 2.0 * c.s4 * z32
	m.xgh3 = 2.0 * c.s4 * (c.z33 - c.z31)
	m.xgh4 = -18.0 * c.s4 * zel
	m.xh2 = -2.0 * c.s2 * z22
	m.xh3 = -2.0 * c.s2 * (c.z23 - c.z21)
	return c
}

// periodics applies the lunar-solar periodic terms (dpper); at init it
// only records their epoch values.
func (m *Model) periodics(init bool, t, inclo, ep, inclp, nodep, argpp, mp float64) (float64, float64, float64, float64, float64) {
	zm := m.zmos + zns*t
	if init {
		zm = m.zmos
	}
	zf := zm + 2.0*zes*math.Sin(zm)
	sinzf, coszf := math.Sincos(zf)
	f2 := 0.5*sinzf*sinzf - 0.25
	f3 := -0.5 * sinzf * coszf
	ses := m.se2*f2 + m.se3*f3
	sis := m.si2*f2 + m.si3*f3
	sls := m.sl2*f2 + m.sl3*f3 + m.sl4*sinzf
	sghs := m.sgh2*f2 + m.sgh3*f3 + m.sgh4*sinzf
	shs := m.sh2*f2 + m.sh3*f3
	zm = m.zmol + znl*t
	if init {
		zm = m.zmol
	}
	zf = zm + 2.0*zel*math.Sin(zm)
	sinzf, coszf = math.Sincos(zf)
	f2 = 0.5*sinzf*sinzf - 0.25
	f3 = -0.5 * sinzf * coszf
	sel := m.ee2*f2 + m.e3*f3
	sil := m.xi2*f2 + m.xi3*f3
	sll := m.xl2*f2 + m.xl3*f3 + m.xl4*sinzf
	sghl := m.xgh2*f2 + m.xgh3*f3 + m.xgh4*sinzf
	shll := m.xh2*f2 + m.xh3*f3
	pe := ses + sel
	pinc := sis + sil
	pl := sls + sll
	pgh := sghs + sghl
	ph := shs + shll
	if init {
		// The published code leaves the elements unchanged at init (the
		// periodics are zero by construction there once peo.. are removed).
		m.peo, m.pinco, m.plo, m.pgho, m.pho = 0, 0, 0, 0, 0
		return ep, inclp, nodep, argpp, mp
	}
	pe -= m.peo
	pinc -= m.pinco
	pl -= m.plo
	pgh -= m.pgho
	ph -= m.pho
	inclp += pinc
	ep += pe
	sinip, cosip := math.Sincos(inclp)
	// Lyddane choice on the perturbed inclination, 0.2 rad (the GSFC form
	// the revisited code keeps).
	if inclp >= 0.2 {
		ph /= sinip
		pgh -= cosip * ph
		argpp += pgh
		nodep += ph
		mp += pl
		return ep, inclp, nodep, argpp, mp
	}
	sinop, cosop := math.Sincos(nodep)
	alfdp := sinip * sinop
	betdp := sinip * cosop
	dalf := ph*cosop + pinc*cosip*sinop
	dbet := -ph*sinop + pinc*cosip*cosop
	alfdp += dalf
	betdp += dbet
	nodep = math.Mod(nodep, twoPi)
	xls := mp + argpp + pl + pgh + (cosip-pinc*sinip)*nodep
	xnoh := nodep
	nodep = math.Atan2(alfdp, betdp)
	if math.Abs(xnoh-nodep) > math.Pi {
		if nodep < xnoh {
			nodep += twoPi
		} else {
			nodep -= twoPi
		}
	}
	mp += pl
	argpp = xls - mp - cosip*nodep
	return ep, inclp, nodep, argpp, mp
}

// dsinit sets up the deep-space secular rates and the resonance terms.
func (m *Model) dsinit(c common, xpidot, eccsq float64) {
	const (
		q22    = 1.7891679e-6
		q31    = 2.1460748e-6
		q33    = 2.2123015e-7
		root22 = 1.7891679e-6
		root44 = 7.3636953e-9
		root54 = 2.1765803e-9
		root32 = 3.7393792e-7
		root52 = 1.1428639e-7
	)
	nm, em, emsq := c.nm, c.em, c.emsq
	cosim, sinim := c.cosim, c.sinim
	inclm := m.inclo
	m.irez = 0
	if 0.0034906585 < nm && nm < 0.0052359877 {
		m.irez = 1
	}
	if 8.26e-3 <= nm && nm <= 9.24e-3 && em >= 0.5 {
		m.irez = 2
	}
	ses := c.ss1 * zns * c.ss5
	sis := c.ss2 * zns * (c.sz11 + c.sz13)
	sls := -zns * c.ss3 * (c.sz1 + c.sz3 - 14.0 - 6.0*emsq)
	sghs := c.ss4 * zns * (c.sz31 + c.sz33 - 6.0)
	shs := -zns * c.ss2 * (c.sz21 + c.sz23)
	if inclm < 5.2359877e-2 || inclm > math.Pi-5.2359877e-2 {
		shs = 0.0
	}
	if sinim != 0.0 {
		shs /= sinim
	}
	sgs := sghs - cosim*shs
	m.dedt = ses + c.s1*znl*c.s5
	m.didt = sis + c.s2*znl*(c.z11+c.z13)
	m.dmdt = sls - znl*c.s3*(c.z1+c.z3-14.0-6.0*emsq)
	sghl := c.s4 * znl * (c.z31 + c.z33 - 6.0)
	shll := -znl * c.s2 * (c.z21 + c.z23)
	if inclm < 5.2359877e-2 || inclm > math.Pi-5.2359877e-2 {
		shll = 0.0
	}
	m.domdt = sgs + sghl
	m.dnodt = shs
	if sinim != 0.0 {
		m.domdt -= cosim / sinim * shll
		m.dnodt += shll / sinim
	}
	theta := math.Mod(m.gsto, twoPi) // tc = 0 at init
	if m.irez == 0 {
		return
	}
	aonv := math.Pow(nm/m.xke, x2o3)
	if m.irez == 2 {
		cosisq := cosim * cosim
		em = m.ecco
		emsq = eccsq
		eoc := em * emsq
		g201 := -0.306 - (em-0.64)*0.440
		var g211, g310, g322, g410, g422, g520, g521, g532, g533 float64
		if em <= 0.65 {
			g211 = 3.616 - 13.2470*em + 16.2900*emsq
			g310 = -19.302 + 117.3900*em - 228.4190*emsq + 156.5910*eoc
			g322 = -18.9068 + 109.7927*em - 214.6334*emsq + 146.5816*eoc
			g410 = -41.122 + 242.6940*em - 471.0940*emsq + 313.9530*eoc
			g422 = -146.407 + 841.8800*em - 1629.014*emsq + 1083.4350*eoc
			g520 = -532.114 + 3017.977*em - 5740.032*emsq + 3708.2760*eoc
		} else {
			g211 = -72.099 + 331.819*em - 508.738*emsq + 266.724*eoc
			g310 = -346.844 + 1582.851*em - 2415.925*emsq + 1246.113*eoc
			g322 = -342.585 + 1554.908*em - 2366.899*emsq + 1215.972*eoc
			g410 = -1052.797 + 4758.686*em - 7193.992*emsq + 3651.957*eoc
			g422 = -3581.690 + 16178.110*em - 24462.770*emsq + 12422.520*eoc
			if em > 0.715 {
				g520 = -5149.66 + 29936.92*em - 54087.36*emsq + 31324.56*eoc
			} else {
				g520 = 1464.74 - 4664.75*em + 3763.64*emsq
			}
		}
		if em < 0.7 {
			g533 = -919.22770 + 4988.6100*em - 9064.7700*emsq + 5542.21*eoc
			g521 = -822.71072 + 4568.6173*em - 8491.4146*emsq + 5337.524*eoc
			g532 = -853.66600 + 4690.2500*em - 8624.7700*emsq + 5341.4*eoc
		} else {
			g533 = -37995.780 + 161616.52*em - 229838.20*emsq + 109377.94*eoc
			g521 = -51752.104 + 218913.95*em - 309468.16*emsq + 146349.42*eoc
			g532 = -40023.880 + 170470.89*em - 242699.48*emsq + 115605.82*eoc
		}
		sini2 := sinim * sinim
		f220 := 0.75 * (1.0 + 2.0*cosim + cosisq)
		f221 := 1.5 * sini2
		f321 := 1.875 * sinim * (1.0 - 2.0*cosim - 3.0*cosisq)
		f322 := -1.875 * sinim * (1.0 + 2.0*cosim - 3.0*cosisq)
		f441 := 35.0 * sini2 * f220
		f442 := 39.3750 * sini2 * sini2
		f522 := 9.84375 * sinim * (sini2*(1.0-2.0*cosim-5.0*cosisq) + 0.33333333*(-2.0+4.0*cosim+6.0*cosisq))
		f523 := sinim * (4.92187512*sini2*(-2.0-4.0*cosim+10.0*cosisq) + 6.56250012*(1.0+2.0*cosim-3.0*cosisq))
		f542 := 29.53125 * sinim * (2.0 - 8.0*cosim + cosisq*(-12.0+8.0*cosim+10.0*cosisq))
		f543 := 29.53125 * sinim * (-2.0 - 8.0*cosim + cosisq*(12.0+8.0*cosim-10.0*cosisq))
		xno2 := nm * nm
		ainv2 := aonv * aonv
		temp1 := 3.0 * xno2 * ainv2
		temp := temp1 * root22
		m.d2201 = temp * f220 * g201
		m.d2211 = temp * f221 * g211
		temp1 *= aonv
		temp = temp1 * root32
		m.d3210 = temp * f321 * g310
		m.d3222 = temp * f322 * g322
		temp1 *= aonv
		temp = 2.0 * temp1 * root44
		m.d4410 = temp * f441 * g410
		m.d4422 = temp * f442 * g422
		temp1 *= aonv
		temp = temp1 * root52
		m.d5220 = temp * f522 * g520
		m.d5232 = temp * f523 * g532
		temp = 2.0 * temp1 * root54
		m.d5421 = temp * f542 * g521
		m.d5433 = temp * f543 * g533
		m.xlamo = math.Mod(m.mo+m.nodeo+m.nodeo-theta-theta, twoPi)
		m.xfact = m.mdot + m.dmdt + 2.0*(m.nodedot+m.dnodt-rptm) - m.noUnkozai
	}
	if m.irez == 1 {
		g200 := 1.0 + emsq*(-2.5+0.8125*emsq)
		g310 := 1.0 + 2.0*emsq
		g300 := 1.0 + emsq*(-6.0+6.60937*emsq)
		f220 := 0.75 * (1.0 + cosim) * (1.0 + cosim)
		f311 := 0.9375*sinim*sinim*(1.0+3.0*cosim) - 0.75*(1.0+cosim)
		f330 := 1.0 + cosim
		f330 = 1.875 * f330 * f330 * f330
		del1 := 3.0 * nm * nm * aonv * aonv
		m.del2 = 2.0 * del1 * f220 * g200 * q22
		m.del3 = 3.0 * del1 * f330 * g300 * q33 * aonv
		m.del1 = del1 * f311 * g310 * q31 * aonv
		m.xlamo = math.Mod(m.mo+m.nodeo+m.argpo-theta, twoPi)
		m.xfact = m.mdot + xpidot - rptm + m.dmdt + m.domdt + m.dnodt - m.noUnkozai
	}
	m.xli = m.xlamo
	m.xni = m.noUnkozai
	m.atime = 0
}

// deepSecular applies the deep-space secular rates and integrates the
// resonance terms (dspace).
func (m *Model) deepSecular(t, em, argpm, inclm, mm, nodem, nm float64) (float64, float64, float64, float64, float64, float64) {
	const (
		fasx2 = 0.13130908
		fasx4 = 2.8843198
		fasx6 = 0.37448087
		g22   = 5.7686396
		g32   = 0.95240898
		g44   = 1.8014998
		g52   = 1.0508330
		g54   = 4.4108898
		stepp = 720.0
		stepn = -720.0
		step2 = 259200.0
	)
	theta := math.Mod(m.gsto+t*rptm, twoPi)
	em += m.dedt * t
	inclm += m.didt * t
	argpm += m.domdt * t
	nodem += m.dnodt * t
	mm += m.dmdt * t
	if m.irez == 0 {
		return em, argpm, inclm, mm, nodem, nm
	}
	if m.atime == 0.0 || t*m.atime <= 0.0 || math.Abs(t) < math.Abs(m.atime) {
		m.atime = 0.0
		m.xni = m.noUnkozai
		m.xli = m.xlamo
	}
	delt := stepn
	if t > 0.0 {
		delt = stepp
	}
	var xndt, xldot, xnddt, ft float64
	for {
		if m.irez != 2 {
			xndt = m.del1*math.Sin(m.xli-fasx2) + m.del2*math.Sin(2.0*(m.xli-fasx4)) + m.del3*math.Sin(3.0*(m.xli-fasx6))
			xldot = m.xni + m.xfact
			xnddt = m.del1*math.Cos(m.xli-fasx2) + 2.0*m.del2*math.Cos(2.0*(m.xli-fasx4)) + 3.0*m.del3*math.Cos(3.0*(m.xli-fasx6))
			xnddt *= xldot
		} else {
			xomi := m.argpo + m.argpdot*m.atime
			x2omi := xomi + xomi
			x2li := m.xli + m.xli
			xndt = m.d2201*math.Sin(x2omi+m.xli-g22) + m.d2211*math.Sin(m.xli-g22) +
				m.d3210*math.Sin(xomi+m.xli-g32) + m.d3222*math.Sin(-xomi+m.xli-g32) +
				m.d4410*math.Sin(x2omi+x2li-g44) + m.d4422*math.Sin(x2li-g44) +
				m.d5220*math.Sin(xomi+m.xli-g52) + m.d5232*math.Sin(-xomi+m.xli-g52) +
				m.d5421*math.Sin(xomi+x2li-g54) + m.d5433*math.Sin(-xomi+x2li-g54)
			xldot = m.xni + m.xfact
			xnddt = m.d2201*math.Cos(x2omi+m.xli-g22) + m.d2211*math.Cos(m.xli-g22) +
				m.d3210*math.Cos(xomi+m.xli-g32) + m.d3222*math.Cos(-xomi+m.xli-g32) +
				m.d5220*math.Cos(xomi+m.xli-g52) + m.d5232*math.Cos(-xomi+m.xli-g52) +
				2.0*(m.d4410*math.Cos(x2omi+x2li-g44)+m.d4422*math.Cos(x2li-g44)+
					m.d5421*math.Cos(xomi+x2li-g54)+m.d5433*math.Cos(-xomi+x2li-g54))
			xnddt *= xldot
		}
		if math.Abs(t-m.atime) < stepp {
			ft = t - m.atime
			break
		}
		m.xli += xldot*delt + xndt*step2
		m.xni += xndt*delt + xnddt*step2
		m.atime += delt
	}
	nm = m.xni + xndt*ft + xnddt*ft*ft*0.5
	xl := m.xli + xldot*ft + xndt*ft*ft*0.5
	if m.irez != 1 {
		mm = xl - 2.0*nodem + 2.0*theta
	} else {
		mm = xl - nodem - argpm + theta
	}
	dndt := nm - m.noUnkozai
	nm = m.noUnkozai + dndt
	return em, argpm, inclm, mm, nodem, nm
}
