package main

import (
	"io"

	"codeberg.org/sunsight/sunsight/scenario/sweep"
)

func init() {
	register(command{name: "merge", summary: "join the output folders of a sharded sweep into one sweep.csv", args: "[flags] DIR...",
		about: `Joins the output folders of a sweep run in shards (sunsight sweep --shard K/N) into one
sweep.csv. The first folder receives every case file and the joined table. Every case
file's checksum is verified; the exit status is 3 when any case misses a target.`,
		examples: []string{"sunsight merge out-1 out-2 out-3 out-4"},
		run:      runMerge})
}

func runMerge(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("merge")
	noPlots := fs.Bool("no-plots", false, "write the table but no figures")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) == 0 {
		return usagef("want the shard folders; usage: sunsight merge DIR... (the first one receives every case and sweep.csv)")
	}
	// Every folder a sweep's, and one sweep's, before the first is touched.
	if _, err := sweep.Plans(pos); err != nil {
		return sweepError(err)
	}
	release, err := holdSweepDir(pos[0], !*noPlots)
	if err != nil {
		return err
	}
	defer release()
	return writeSweepOutputs(pos, *noPlots, pos[0], stdout)
}
