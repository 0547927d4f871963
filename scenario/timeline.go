package scenario

import (
	"fmt"
	"strings"

	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// LawTimeline is the attitude name of a run flown by a mission timeline
// (the timeline key); the phases carry the laws.
const LawTimeline = "timeline"

// Timeline is a mission timeline: phases flown in turn, each with its
// attitude law and end condition, with eigen-axis slews between them.
type Timeline struct {
	Set bool
	// SlewRateRadS and SlewAccelRadS2 bound every slew (zero when no phase
	// slews).
	SlewRateRadS, SlewAccelRadS2 float64
	Phases                       []Phase
}

// Phase is one entry of a timeline.
type Phase struct {
	Name string
	Law  Law
	// Slew turns from the previous phase's attitude onto this one's law.
	Slew bool
	// HoldInEclipse keeps the shadow-entry attitude until shadow exit.
	HoldInEclipse bool
	Until         Until
}

// End conditions of a phase (Until.Kind).
const (
	UntilRunEnd       = ""              // the last phase only: to the end of the run
	UntilElapsed      = "elapsed"       // ElapsedS after the phase starts
	UntilRateBelow    = "rate_below"    // the detumble's rate falls to RateRadS
	UntilSunSeen      = "sun_seen"      // the sun seen by SeenSensors sensors for SeenForS
	UntilEclipseEntry = "eclipse-entry" // the next shadow entry
	UntilEclipseExit  = "eclipse-exit"  // the next shadow exit
)

// Until is a phase's end condition.
type Until struct {
	Kind        string
	ElapsedS    float64
	RateRadS    float64
	SeenForS    float64
	SeenSensors int
}

// Eclipse behaviours of a phase (timeline.phases[].during_eclipse).
const (
	EclipseFly  = "fly"
	EclipseHold = "hold"
)

// noSlewLaws are the laws a slew cannot turn onto: their attitude moves
// faster than any slew or is redrawn at every step.
var noSlewLaws = []string{attitude.NameTumble, attitude.NameDetumble, attitude.NameIsotropic}

func (r *resolver) timeline(f *fileTimeline, sensors int) Timeline {
	tl := Timeline{Set: true}
	if len(f.Phases) == 0 {
		r.fail("timeline.phases", "value is empty; allowed a list of phases, each with name, attitude and until (the last may omit until)")
		return tl
	}
	names := map[string]bool{}
	slews := false
	for i := range f.Phases {
		fp := &f.Phases[i]
		p := fmt.Sprintf("timeline.phases[%d]", i)
		if fp.Name == "" {
			r.fail(p+".name", "value is empty; allowed a name for the phase")
		} else if names[fp.Name] {
			r.fail(p+".name", "value %q is used twice; allowed a distinct name per phase", fp.Name)
		}
		names[fp.Name] = true
		ph := Phase{Name: fp.Name, Slew: fp.Slew}
		if fp.Attitude.Law == attitude.NameReplay {
			r.fail(p+".attitude.law", "value %q replays a whole run's history; allowed any other law in a phase", fp.Attitude.Law)
		} else {
			ph.Law = r.law(p+".attitude", &fp.Attitude)
		}
		r.choice(p+".during_eclipse", &fp.DuringEclipse, EclipseFly, eclipseBehaviours)
		ph.HoldInEclipse = fp.DuringEclipse == EclipseHold
		if ph.HoldInEclipse {
			// The hold ends with a slew back onto the law.
			slews = true
			if oneOf(fp.Attitude.Law, noSlewLaws) {
				r.fail(p+".during_eclipse", "value hold must slew back onto law %q after the shadow, whose attitude turns faster than a slew can follow; allowed hold with nadir, sun, inertial or spin, or fly", fp.Attitude.Law)
			}
		}
		if fp.Slew {
			slews = true
			switch {
			case i == 0:
				r.fail(p+".slew", "value true on the first phase has no attitude to slew from; allowed slew on later phases")
			case oneOf(fp.Attitude.Law, noSlewLaws):
				r.fail(p+".slew", "value true turns onto law %q, whose attitude turns faster than a slew can follow; allowed slew onto nadir, sun, inertial or spin", fp.Attitude.Law)
			}
		}
		ph.Until = r.until(p+".until", fp.Until, fp.Attitude.Law, i == len(f.Phases)-1, sensors)
		tl.Phases = append(tl.Phases, ph)
	}
	switch {
	case slews:
		if f.SlewRateDegS == nil || f.SlewAccelDegS2 == nil {
			r.fail("timeline", "value has phases with slew or during_eclipse: hold (which slews back after the shadow) but no slew_rate_deg_s and slew_accel_deg_s2; allowed both limits, such as slew_rate_deg_s: 2 and slew_accel_deg_s2: 0.2")
			break
		}
		r.rangeCheck("timeline.slew_rate_deg_s", *f.SlewRateDegS, slewRange, " deg/s")
		r.rangeCheck("timeline.slew_accel_deg_s2", *f.SlewAccelDegS2, slewRange, " deg/s²")
		tl.SlewRateRadS, tl.SlewAccelRadS2 = *f.SlewRateDegS*deg, *f.SlewAccelDegS2*deg
	case f.SlewRateDegS != nil || f.SlewAccelDegS2 != nil:
		r.fail("timeline", "value has slew limits but no phase with slew: true or during_eclipse: hold; allowed the limits with at least one slewing or holding phase, or no limits")
	}
	return tl
}

func (r *resolver) until(p string, u *fileUntil, law string, last bool, sensors int) Until {
	if u == nil {
		if !last {
			r.fail(p, "value is missing; allowed one end condition (elapsed, rate_below_deg_s, sun_seen_for or eclipse); only the last phase may run to the end of the run")
		}
		return Until{}
	}
	var out Until
	n := 0
	if u.Elapsed != nil {
		n++
		out.Kind, out.ElapsedS = UntilElapsed, u.Elapsed.Seconds()
		if *u.Elapsed <= 0 {
			r.fail(p+".elapsed", "value %s is not positive; allowed a length of time > 0 such as 20m", *u.Elapsed)
		}
	}
	if u.RateBelowDegS != nil {
		n++
		out.Kind, out.RateRadS = UntilRateBelow, *u.RateBelowDegS*deg
		r.rangeCheck(p+".rate_below_deg_s", *u.RateBelowDegS, maxRateRange, " deg/s")
		if law != attitude.NameDetumble {
			r.fail(p+".rate_below_deg_s", "value applies to a detumble phase only (law %q keeps its rate); allowed with law: detumble", law)
		}
	}
	if u.SunSeenFor != nil {
		n++
		out.Kind, out.SeenForS = UntilSunSeen, u.SunSeenFor.Seconds()
		if *u.SunSeenFor < 0 {
			r.fail(p+".sun_seen_for", "value %s is negative; allowed a length of time ≥ 0 such as 2m", *u.SunSeenFor)
		}
		if u.SunSeenSensors == nil {
			v := 1
			u.SunSeenSensors = &v
		}
	}
	if u.SunSeenSensors != nil {
		if u.SunSeenFor == nil {
			r.fail(p+".sun_seen_sensors", "value applies with sun_seen_for only; allowed sun_seen_for with it, or no sun_seen_sensors")
		} else if *u.SunSeenSensors < 1 || *u.SunSeenSensors > sensors {
			r.fail(p+".sun_seen_sensors", "value %d is out of range; allowed a whole number in [1, %d] (the sensors listed)", *u.SunSeenSensors, sensors)
		}
		out.SeenSensors = *u.SunSeenSensors
	}
	if u.Eclipse != "" {
		n++
		switch u.Eclipse {
		case untilEclipses[0]:
			out.Kind = UntilEclipseEntry
		case untilEclipses[1]:
			out.Kind = UntilEclipseExit
		default:
			r.fail(p+".eclipse", "value %q is unknown; allowed %s", u.Eclipse, strings.Join(untilEclipses, ", "))
		}
	}
	if n != 1 {
		r.fail(p, "value has %d end conditions; allowed exactly one of elapsed, rate_below_deg_s, sun_seen_for (with sun_seen_sensors), eclipse", n)
	}
	return out
}
