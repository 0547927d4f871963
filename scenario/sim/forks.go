package sim

import (
	"sync"

	"codeberg.org/sunsight/sunsight/orbit"
)

// integration hands each piece of the grid a numerical integration
// (orbit.Restarter) in the state the one integration from the epoch has
// when the piece starts, so the pieces run on several cores and give bit
// for bit the numbers of one run from the epoch: the integrator's steps do
// not depend on the times it is asked, and each fork is taken before the
// first time its piece asks. The one integration advances as later pieces
// are asked for (each piece costs it one piece of integration alone, no
// sensors or geometry); its forks are kept, one per piece.
type integration struct {
	mu    sync.Mutex
	run   orbit.Restarter
	forks []orbit.Restarter // forks[c]: taken at step c·piece − 1
	piece int               // steps per piece
	step  float64           // s
}

func newIntegration(p orbit.Restarter, piece int, step float64) *integration {
	return &integration{run: p, piece: piece, step: step}
}

// forPiece returns a fresh fork for piece c (k0 = c·piece).
func (in *integration) forPiece(c int) orbit.Propagator {
	in.mu.Lock()
	defer in.mu.Unlock()
	for len(in.forks) <= c {
		if n := len(in.forks); n > 0 {
			in.run.StateAt(float64(n*in.piece-1) * in.step)
		}
		in.forks = append(in.forks, in.run.Fork())
	}
	return in.forks[c].Fork()
}
