package integrate

import (
	"sync"

	"ricochet/integrate/rk"
)

// Work storage reused across the integrations of an event and across
// events (sync.Pool: per-processor caches, safe for the parallel workers
// of a scan), so that repeated Scatter calls allocate only their small
// per-event state and the garbage collector seldom runs. There is one
// pool per state dimension: storage of another dimension never fits, and
// drawing it from a shared pool (left there by events of other models on
// the same processor) would make an event's allocations depend on what
// ran before it.
var (
	solverPools [maxPooledDim + 1]sync.Pool // *rk.Solver by dimension, reconfigured by rk.Reuse
	tailPools   [maxPooledDim + 1]sync.Pool // *tailWork by model dimension
)

// maxPooledDim is the largest pooled dimension: a model's 16 components
// and the coordinate time.
const maxPooledDim = 17

// getSolver returns a solver of dimension n from the pool, or nil.
func getSolver(n int) *rk.Solver {
	if n > maxPooledDim {
		return nil
	}
	s, _ := solverPools[n].Get().(*rk.Solver)
	return s
}

// putSolver gives s (of dimension n) back to the pool.
func putSolver(n int, s *rk.Solver) {
	if n <= maxPooledDim {
		solverPools[n].Put(s)
	}
}

// getTailWork returns tail work storage from the pool if it fits, else
// new storage.
func getTailWork(dim, n, passes int) *tailWork {
	if dim <= maxPooledDim {
		if t, ok := tailPools[dim].Get().(*tailWork); ok && t.n == n && t.passes == passes {
			return t
		}
	}
	return newTailWork(dim, n, passes)
}

// putTailWork gives t back to the pool; t must not be used afterwards.
func putTailWork(t *tailWork) {
	t.sv = nil // no model kept alive by the pool
	if d := len(t.y); d <= maxPooledDim {
		tailPools[d].Put(t)
	}
}
