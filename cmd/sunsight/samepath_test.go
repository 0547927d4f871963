package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Two outputs of one command on the same path, or one inside the other's
// folder, are refused before anything runs: exit 2 naming both flags, and
// nothing written (the CSV set was written, then the plots refused; with
// --force the plots replaced it; export kept only the AEM in the OEM's file).
func TestTwoOutputsOnOnePath(t *testing.T) {
	scen := "../../examples/nadir-6u-sso.yaml"
	layoutScen := filepath.Join(t.TempDir(), "layout.yaml")
	os.WriteFile(layoutScen, []byte(layoutCLIScenario), 0o644)
	for _, c := range []struct {
		flags []string // the two flags named in the message
		args  func(d string) []string
	}{
		{[]string{"--csv", "--plots"}, func(d string) []string {
			return []string{"run", scen, "--duration", "1h", "--quiet", "--csv", d + "/same", "--plots", d + "/same"}
		}},
		{[]string{"--csv", "--plots"}, func(d string) []string {
			return []string{"run", scen, "--duration", "1h", "--quiet", "--force", "--csv", d + "/same", "--plots", d + "/same/"}
		}},
		{[]string{"--csv", "--report"}, func(d string) []string {
			return []string{"run", scen, "--duration", "1h", "--quiet", "--csv", d + "/out", "--report", d + "/out/r.html"}
		}},
		{[]string{"--plots", "--cpuprofile"}, func(d string) []string {
			return []string{"run", scen, "--duration", "1h", "--quiet", "--plots", d + "/p", "--cpuprofile", d + "/./p/cpu.prof"}
		}},
		{[]string{"--oem", "--aem"}, func(d string) []string {
			return []string{"export", scen, "--oem", d + "/x.oem", "--aem", d + "/../" + filepath.Base(d) + "/x.oem"}
		}},
		{[]string{"--csv", "--plots"}, func(d string) []string {
			return []string{"season", scen, "--span", "2d", "--cases", "2", "--case-duration", "1h", "--refine", "0", "--csv", d + "/s", "--plots", d + "/s/p"}
		}},
		{[]string{"--out", "--cpuprofile"}, func(d string) []string {
			return []string{"layout", layoutScen, "--out", d + "/l", "--cpuprofile", d + "/l"}
		}},
		{[]string{"--out", "--cpuprofile"}, func(d string) []string {
			return []string{"budget", budgetScenario, "--units", "2", "--out", d + "/b", "--cpuprofile", d + "/b/cpu.prof"}
		}},
		{[]string{"--out", "--cpuprofile"}, func(d string) []string {
			return []string{"sweep", scen, "--vary", "orbit.altitude_km=400,500", "--out", d + "/w", "--cpuprofile", d + "/w/cpu.prof"}
		}},
	} {
		d := t.TempDir()
		args := c.args(d)
		var so, se bytes.Buffer
		code := runMain(args, &so, &se)
		msg := se.String()
		if code != exitUsage || !strings.Contains(msg, c.flags[0]) || !strings.Contains(msg, c.flags[1]) {
			t.Errorf("%v: exit %d, stderr %q; want 2 naming %v", args, code, msg, c.flags)
		}
		if ents, _ := os.ReadDir(d); len(ents) != 0 {
			t.Errorf("%v: left %v", args, ents)
		}
	}
}
