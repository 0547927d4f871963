package main

import (
	"io"
	"os"
	"sync"

	"github.com/vbauerster/mpb/v8"
	"github.com/vbauerster/mpb/v8/decor"
	"golang.org/x/term"
)

// progress shows how far a run is: a bar with rate and ETA when stderr is a
// terminal; nothing otherwise (logs and pipes stay clean) or with -quiet.
// The display counts steps of the first unit.
type progress struct {
	mu    sync.Mutex
	bars  *mpb.Progress
	bar   *mpb.Bar
	steps int
	off   bool
}

func newProgress(stderr io.Writer, quiet bool, steps int, name string) *progress {
	p := &progress{steps: steps}
	if quiet {
		p.off = true
		return p
	}
	if isTerminal(stderr) {
		p.bars = mpb.New(mpb.WithOutput(stderr), mpb.WithWidth(40))
		p.bar = p.bars.AddBar(int64(steps),
			mpb.PrependDecorators(decor.Name(name+" ", decor.WC{W: len(name) + 1})),
			mpb.AppendDecorators(decor.Percentage(decor.WC{W: 5}), decor.Name(" "),
				decor.AverageSpeed(0, "%.0f steps/s"), decor.Name("  ETA "), decor.AverageETA(decor.ET_STYLE_GO)))
		return p
	}
	p.off = true
	return p
}

func (p *progress) update(done float64) {
	if p.off {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	p.bar.SetCurrent(int64(done * float64(p.steps)))
}

func (p *progress) done() {
	if p.off {
		return
	}
	p.bar.SetCurrent(int64(p.steps))
	p.bars.Wait()
}

// isTerminal reports whether w is a terminal: progress displays write only
// there, so that logs and pipes stay clean.
func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	return ok && term.IsTerminal(int(f.Fd()))
}
