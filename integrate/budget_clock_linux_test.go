package integrate

import (
	"runtime"
	"syscall"
	"time"
	"unsafe"
)

// budgetClock returns the CPU time of the calling thread (the benchmark
// locks its goroutine to the thread; clock_gettime with
// CLOCK_THREAD_CPUTIME_ID, nanosecond resolution), which a loaded machine
// does not inflate by the time the thread waits for a core.
func budgetClock() time.Duration {
	const clockThreadCPUTime = 3
	var ts syscall.Timespec
	if _, _, e := syscall.Syscall(syscall.SYS_CLOCK_GETTIME, clockThreadCPUTime, uintptr(unsafe.Pointer(&ts)), 0); e != 0 {
		panic(e)
	}
	return time.Duration(ts.Nano())
}

func budgetLock()   { runtime.LockOSThread() }
func budgetUnlock() { runtime.UnlockOSThread() }
