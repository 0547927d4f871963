package main

import (
	"bytes"
	"fmt"
	"io"
	"time"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/orbit/ccsds"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

func init() {
	register(command{name: "export", summary: "write the orbit and attitude a run uses as CCSDS OEM and AEM files", args: "[flags] FILE",
		about: `Samples the orbit (EME2000 states) and the attitude (quaternions, EME2000 → body; unit 0
of a random law) of the scenario FILE over its run and writes them as a CCSDS Orbit
Ephemeris Message (--oem) and Attitude Ephemeris Message (--aem), KVN form. A scenario can
read them back with orbit.ephemeris_file and attitude law: replay.`,
		examples: []string{"sunsight export examples/nadir-6u-sso.yaml --oem orbit.oem --aem attitude.aem --step 60s"},
		run:      runExport})
}

func runExport(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("export")
	oemPath := fs.String("oem", "", "write the orbit to `FILE` (CCSDS OEM, KVN)")
	aemPath := fs.String("aem", "", "write the attitude to `FILE` (CCSDS AEM, KVN)")
	stepS := fs.String("step", "", "sample step, a span such as 60s (default: the scenario's step)")
	force := fs.Bool("force", false, "replace output files that exist")
	fs.pathFlags(false, "oem", "aem")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight export [--oem FILE] [--aem FILE] FILE")
	}
	if *oemPath == "" && *aemPath == "" {
		return usagef("nothing to write; give --oem FILE, --aem FILE or both")
	}
	if err := distinctOutputs(output{"--oem", *oemPath}, output{"--aem", *aemPath}); err != nil {
		return err
	}
	for _, p := range []string{*oemPath, *aemPath} {
		if p != "" {
			if err := checkOutputFile(p, *force); err != nil {
				return err
			}
		}
	}
	s, err := loadScenario(pos[0])
	if err != nil {
		return err
	}
	step := s.Step.Seconds()
	if *stepS != "" {
		sp, err := spanFlag("--step", *stepS, "10s or 1m")
		if err != nil {
			return err
		}
		step = sp.Seconds()
	}
	cfg, err := study.Config(s)
	if err != nil {
		return usageError{fmt.Errorf("%s: %w", describeFile(pos[0]), err)}
	}
	h, err := study.Sample(cfg, step)
	if err != nil {
		return usageError{err}
	}
	name := objectName(s.Name)
	now := time.Now().UTC()
	if *oemPath != "" {
		var b bytes.Buffer
		if err := ccsds.WriteOEM(&b, name, h.Epoch, h.Step, h.States, now); err != nil {
			return err
		}
		if err := atomicfile.Write(*oemPath, b.Bytes()); err != nil {
			return err
		}
	}
	if *aemPath != "" {
		var b bytes.Buffer
		if err := ccsds.WriteAEM(&b, name, h.Times, h.Q, now); err != nil {
			return err
		}
		if err := atomicfile.Write(*aemPath, b.Bytes()); err != nil {
			return err
		}
	}
	_, err = fmt.Fprintf(stdout, "export: %d samples every %g s from %s\n", len(h.Times), h.Step, h.Epoch.Format(time.RFC3339))
	return err
}

// objectName turns a scenario name into a KVN value (no '=' nor line breaks).
func objectName(s string) string {
	b := []rune{}
	for _, r := range s {
		switch {
		case r == '=' || r == '\n' || r == '\r':
			b = append(b, '_')
		default:
			b = append(b, r)
		}
	}
	if len(b) == 0 {
		return "SPACECRAFT"
	}
	return string(b)
}
