package integrate

import "sync"

// Work storage reused across the integrations of an event and across
// events (sync.Pool: per-processor caches, safe for the parallel workers
// of a scan), so that repeated Scatter calls allocate only their small
// per-event state and the garbage collector seldom runs.
var (
	solverPool sync.Pool // *rk.Solver, reconfigured by rk.Reuse
	tailPool   sync.Pool // *tailWork
)

// getTailWork returns tail work storage from the pool if it fits, else
// new storage.
func getTailWork(dim, n, passes int) *tailWork {
	if t, ok := tailPool.Get().(*tailWork); ok && len(t.y) == dim && t.n == n && t.passes == passes {
		return t
	}
	return newTailWork(dim, n, passes)
}

// putTailWork gives t back to the pool; t must not be used afterwards.
func putTailWork(t *tailWork) { tailPool.Put(t) }
