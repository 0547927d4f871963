package sweep

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"strings"

	"go.yaml.in/yaml/v3"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// Plan is a checked sweep: the base scenario text, its axes and every case's
// values. NewPlan builds and validates every case before anything runs.
type Plan struct {
	Axes  []Axis
	Zip   bool
	Cases [][]string // per case, one value per axis

	base []byte
	dir  string
	// scen[i] is case i's scenario and sum[i] the SHA-256 of its record.
	scen []*scenario.Scenario
	sum  []string
}

// NewPlan edits base (scenario file text; dir is its folder) once per case,
// checks every case with scenario.Parse and builds everything run builds
// (study.Prepare, as check does), so a case that loads but cannot be built
// is refused before any case runs. Errors name the case and the key.
func NewPlan(base []byte, dir string, axes []Axis, zip bool) (*Plan, error) {
	if _, err := scenario.Parse(base, dir); err != nil {
		return nil, err
	}
	cases, err := Cases(axes, zip)
	if err != nil {
		return nil, err
	}
	p := &Plan{Axes: axes, Zip: zip, Cases: cases, base: base, dir: dir}
	for i, vals := range cases {
		s, err := p.build(vals)
		if err == nil {
			_, err = study.Prepare(s)
		}
		if err != nil {
			return nil, fmt.Errorf("sweep: case %d (%s): %w", i, describeCase(axes, vals), err)
		}
		rec := sha256.Sum256(s.Record())
		p.scen = append(p.scen, s)
		p.sum = append(p.sum, hex.EncodeToString(rec[:]))
	}
	return p, nil
}

func describeCase(axes []Axis, vals []string) string {
	s := ""
	for k, a := range axes {
		if k > 0 {
			s += ", "
		}
		s += a.Key + "=" + vals[k]
	}
	return s
}

func (p *Plan) build(vals []string) (*scenario.Scenario, error) {
	var doc yaml.Node
	if err := yaml.Unmarshal(p.base, &doc); err != nil || len(doc.Content) == 0 {
		return nil, fmt.Errorf("sweep: the scenario text could not be read again: %v", err)
	}
	root := doc.Content[0]
	// The special keys replace whole subtrees, so apply them before the
	// finer edits that may refine them.
	for pass := range 2 {
		for k, a := range p.Axes {
			special := a.Key == KeyLayout || a.Key == KeyMode
			if special != (pass == 0) {
				continue
			}
			if err := set(root, a.Key, vals[k]); err != nil {
				return nil, fmt.Errorf("sweep: --vary %s: %w", a.Key, err)
			}
		}
	}
	// The edited tree keeps the lines of the user's file; the values the
	// sweep set have none and are named by the --vary that set them.
	s, err := scenario.ParseNode(root, p.dir)
	var errs scenario.Errors
	if errors.As(err, &errs) {
		for _, e := range errs {
			if e.Line == 0 {
				e.Origin = p.setBy(e.Path)
			}
		}
	}
	return s, err
}

// setBy names the --vary whose edit holds path, or is held by it, or "".
func (p *Plan) setBy(path string) string {
	for _, a := range p.Axes {
		key := a.Key
		switch key {
		case KeyLayout:
			key = "body.sensors"
		case KeyMode:
			key = "attitude"
		}
		if within(path, key) || within(key, path) {
			return "set by --vary " + a.Key
		}
	}
	return ""
}

// within reports whether path p is at or under path top.
func within(p, top string) bool {
	return p == top || strings.HasPrefix(p, top+".") || strings.HasPrefix(p, top+"[")
}

// Scenario returns case i's checked scenario.
func (p *Plan) Scenario(i int) *scenario.Scenario { return p.scen[i] }

// Keys returns the varied keys in axis order.
func (p *Plan) Keys() []string {
	out := make([]string, len(p.Axes))
	for i, a := range p.Axes {
		out[i] = a.Key
	}
	return out
}
