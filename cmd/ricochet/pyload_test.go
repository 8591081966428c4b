package main

import (
	"os/exec"
	"strconv"
	"strings"
	"testing"
)

// pythonLoads loads a CSV file as a Python user would: with the csv
// module, and where numpy is installed with numpy.genfromtxt(names=True)
// without any option for comments or quoting; it checks the number of
// rows and columns and that column col is numeric (finite with numpy).
// Without python3 it logs that the check did not run.
func pythonLoads(t *testing.T, label, path string, rows int, col string) {
	t.Helper()
	py, err := exec.LookPath("python3")
	if err != nil {
		t.Log("python3 not found: Python loading not tested")
		return
	}
	script := `import csv, sys
rows = list(csv.DictReader(open(sys.argv[1], newline="")))
n, col = int(sys.argv[2]), sys.argv[3]
assert len(rows) == n, len(rows)
float(rows[0][col])
try:
    import numpy
except ImportError:
    print("numpy not installed")
    sys.exit(0)
a = numpy.genfromtxt(sys.argv[1], delimiter=",", names=True, dtype=None, encoding="utf-8")
assert len(a) == n, len(a)
assert len(a.dtype.names) == len(rows[0]), (a.dtype.names, list(rows[0]))
assert numpy.all(numpy.isfinite(a[col].astype(float)))
print("numpy ok")
`
	b, err := exec.Command(py, "-c", script, path, strconv.Itoa(rows), col).CombinedOutput()
	if err != nil {
		t.Errorf("%s: python: %v\n%s", label, err, b)
	}
	t.Logf("%s: python: %s", label, strings.TrimSpace(string(b)))
}
