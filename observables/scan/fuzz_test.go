package scan

import (
	"context"
	"os"
	"path/filepath"
	"testing"
)

// fuzzScenario is the scan the fuzzed record files are checked against:
// three couplings × two values of γ.
const fuzzScenario = `
[background]
kind = "coulomb"
charge = 0.01
[probe]
kind = "charge"
charge = 1
[kinematics]
gamma = 1.5
[scan]
eps_min = 1e-3
eps_max = 1e-2
points = 3
[[scan.axis]]
param = "gamma"
values = [1.5, 2]
`

// FuzzRecordFile: the record-file reader never panics, and every record it
// accepts passes the plan's checks, lies in range and is unique. The seed
// corpus (testdata/fuzz/FuzzRecordFile) holds a valid file and damaged
// ones; a valid file of this build is added as a seed too.
func FuzzRecordFile(f *testing.F) {
	s := mustScenario(f, fuzzScenario)
	p, err := NewPlan(s, nil, "fuzz")
	if err != nil {
		f.Fatal(err)
	}
	path := filepath.Join(f.TempDir(), "seed.jsonl")
	if _, err := Run(context.Background(), s, &Settings{Record: path, Version: "fuzz"}); err != nil {
		f.Fatal(err)
	}
	seed, _ := os.ReadFile(path)
	f.Add(seed)
	f.Fuzz(func(t *testing.T, data []byte) {
		rf, err := parseFile("fuzz.jsonl", data)
		if err != nil {
			if rf != nil {
				t.Fatal("error with a result")
			}
			return
		}
		for _, sh := range []Shard{{}, {1, 2}} {
			c := p.checkFile(rf, sh)
			for i, r := range c.done {
				if i != r.Index || i < 0 || i >= p.Jobs() || !sh.Has(i) {
					t.Fatalf("accepted record %d with index %d", i, r.Index)
				}
				if err := p.Check(r, sh); err != nil {
					t.Fatalf("accepted record fails its check: %v", err)
				}
			}
			if len(c.done)+len(c.conflict) > p.Jobs() {
				t.Fatalf("%d records accepted of %d jobs", len(c.done), p.Jobs())
			}
		}
	})
}
