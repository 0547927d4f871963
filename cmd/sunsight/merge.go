package main

import (
	"flag"
	"io"
)

func init() {
	register(command{name: "merge", summary: "join the output folders of a sharded sweep into one sweep.csv", run: runMerge})
}

func runMerge(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("merge", flag.ContinueOnError)
	fs.SetOutput(stderr)
	noPlots := fs.Bool("no-plots", false, "write the table but no figures")
	pos, err := parseInterleaved(fs, args)
	if err != nil {
		return flagError(err)
	}
	if len(pos) == 0 {
		return usagef("want the shard folders; usage: sunsight merge DIR... (the first one receives every case and sweep.csv)")
	}
	return writeSweepOutputs(pos, *noPlots, pos[0], stdout)
}
