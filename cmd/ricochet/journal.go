package main

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"

	"github.com/schollz/progressbar/v3"

	"ricochet/background/vec"
)

// num is a float64 whose JSON form round-trips exactly (shortest decimal)
// and carries NaN and ±Inf as strings.
type num float64

func (x num) MarshalJSON() ([]byte, error) {
	f := float64(x)
	switch {
	case math.IsNaN(f):
		return []byte(`"NaN"`), nil
	case math.IsInf(f, 1):
		return []byte(`"+Inf"`), nil
	case math.IsInf(f, -1):
		return []byte(`"-Inf"`), nil
	}
	return strconv.AppendFloat(nil, f, 'g', -1, 64), nil
}

func (x *num) UnmarshalJSON(b []byte) error {
	s := string(bytes.Trim(b, `"`))
	f, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return err
	}
	*x = num(f)
	return nil
}

// vec4 is a four-vector whose components have the JSON form of num.
type vec4 vec.Vec4

func (v vec4) MarshalJSON() ([]byte, error) {
	return json.Marshal([4]num{num(v[0]), num(v[1]), num(v[2]), num(v[3])})
}

func (v *vec4) UnmarshalJSON(b []byte) error {
	var n [4]num
	if err := json.Unmarshal(b, &n); err != nil {
		return err
	}
	*v = vec4{float64(n[0]), float64(n[1]), float64(n[2]), float64(n[3])}
	return nil
}

// journalFormat names the format of the scan record file.
const journalFormat = "ricochet-scan-records/1"

// journalHeader is the first line of a record file. Hash identifies the
// scenario and scan settings; a file with another hash is not resumed.
type journalHeader struct {
	Format   string    `json:"format"`
	Hash     string    `json:"hash"`
	Version  string    `json:"version"`
	Scenario *Scenario `json:"scenario"`
	Grid     []num     `json:"grid"`
	// Models lists the completions of a --spread scan, in job order.
	Models []string `json:"models,omitempty"`
}

type journalTrailer struct {
	Complete bool `json:"complete"`
	Points   int  `json:"points"`
}

// scanHash hashes everything that determines the recorded numbers: the
// program version, the validated scenario (with numerics), the grid and
// the models of a --spread scan (absent otherwise, so that records of
// ordinary scans keep their hash).
func scanHash(s *Scenario, members []string) (string, []num) {
	var grid []num
	for _, e := range epsGrid(s.Scan.EpsMin, s.Scan.EpsMax, s.Scan.Points) {
		grid = append(grid, num(e))
	}
	b, _ := json.Marshal(struct {
		V      string
		S      *Scenario
		G      []num
		Spread []string `json:",omitempty"`
	}{version, s, grid, members})
	h := sha256.Sum256(b)
	return hex.EncodeToString(h[:12]), grid
}

// interruptAfter, when positive, stops a recorded scan after that many
// newly computed points, as an interruption would (used by tests).
var interruptAfter int

var errInterrupted = errors.New("scan interrupted")

// collect returns the records of every grid point: computed, or read from
// the record file path when resuming, and appended to it as they finish.
func collect(s *Scenario, raw, path string, resume bool, members []string, workers int, bar *progressbar.ProgressBar) ([]record, error) {
	defer func() {
		if bar != nil {
			bar.Finish()
			bar.Exit()
		}
	}()
	tick := func() {
		if bar != nil {
			bar.Add(1)
		}
	}
	if path == "" {
		recs, err := runRecords(s, nil, members, workers, func(record) error { tick(); return nil })
		return recs, err
	}
	hash, grid := scanHash(s, members)
	hdr := journalHeader{Format: journalFormat, Hash: hash, Version: version, Scenario: s, Grid: grid, Models: members}
	njobs := len(grid) * max(1, len(members))
	done := map[int]record{}
	var f *os.File
	if resume {
		var complete bool
		var keep int64
		var err error
		done, complete, keep, err = readJournal(path, hash)
		if err != nil {
			return nil, err
		}
		if complete {
			return ordered(done, njobs), nil
		}
		f, err = os.OpenFile(path, os.O_RDWR, 0)
		if err != nil {
			return nil, badf("--resume: %v", err)
		}
		// Drop a partly written last line.
		if err := f.Truncate(keep); err != nil {
			return nil, err
		}
		if _, err := f.Seek(keep, 0); err != nil {
			return nil, err
		}
		if bar != nil {
			bar.Add(len(done))
		}
	} else {
		if st, err := os.Stat(path); err == nil && st.Size() > 0 {
			return nil, badf("--output %s exists; add --resume to complete it or remove it", path)
		}
		var err error
		f, err = os.Create(path)
		if err != nil {
			return nil, badf("--output: %v", err)
		}
		if err := appendLine(f, hdr); err != nil {
			f.Close()
			return nil, err
		}
	}
	newPts := 0
	recs, err := runRecords(s, done, members, workers, func(r record) error {
		if err := appendLine(f, r); err != nil {
			return err
		}
		tick()
		newPts++
		if interruptAfter > 0 && newPts >= interruptAfter {
			return errInterrupted
		}
		return nil
	})
	if cerr := f.Close(); err == nil && cerr != nil {
		err = cerr
	}
	if err != nil {
		return nil, err
	}
	return recs, writeCanonical(path, hdr, recs)
}

// appendLine writes v as one JSON line and syncs the file, so that a
// finished point survives an interruption.
func appendLine(f *os.File, v any) error {
	b, err := json.Marshal(v)
	if err != nil {
		return err
	}
	if _, err := f.Write(append(b, '\n')); err != nil {
		return err
	}
	return f.Sync()
}

// writeCanonical rewrites the record file in grid order with a trailer
// (through a synced temporary file and a rename, so the file is never
// left half-written): the final file does not depend on the order in
// which points finished or on interruptions.
func writeCanonical(path string, hdr journalHeader, recs []record) error {
	var buf bytes.Buffer
	enc := func(v any) {
		b, _ := json.Marshal(v)
		buf.Write(b)
		buf.WriteByte('\n')
	}
	enc(hdr)
	for _, r := range recs {
		enc(r)
	}
	enc(journalTrailer{Complete: true, Points: len(recs)})
	tmp, err := os.CreateTemp(filepath.Dir(path), ".ricochet-scan-*")
	if err != nil {
		return err
	}
	if _, err := tmp.Write(buf.Bytes()); err != nil {
		tmp.Close()
		os.Remove(tmp.Name())
		return err
	}
	if err := tmp.Sync(); err != nil {
		tmp.Close()
		os.Remove(tmp.Name())
		return err
	}
	tmp.Close()
	return os.Rename(tmp.Name(), path)
}

// readJournal reads a record file, checks its hash and returns the
// complete records, whether the trailer is present, and the length of the
// well-formed prefix of the file.
func readJournal(path, hash string) (map[int]record, bool, int64, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, false, 0, badf("--resume: %v", err)
	}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	var keep int64
	done := map[int]record{}
	first, complete := true, false
	for sc.Scan() {
		line := sc.Bytes()
		if int(keep)+len(line) >= len(data) || data[int(keep)+len(line)] != '\n' {
			break // last line without its newline: partly written
		}
		if first {
			var h journalHeader
			if err := json.Unmarshal(line, &h); err != nil || h.Format != journalFormat {
				return nil, false, 0, badf("--resume: %s is not a ricochet scan record file", path)
			}
			if h.Hash != hash {
				return nil, false, 0, badf("--resume: %s was recorded for another scenario or other scan settings (hash %s, these settings %s)", path, h.Hash, hash)
			}
			first = false
		} else {
			var t journalTrailer
			if json.Unmarshal(line, &t) == nil && t.Complete {
				complete = true
			} else {
				var r record
				if err := json.Unmarshal(line, &r); err != nil {
					break
				}
				done[r.Index] = r
			}
		}
		keep += int64(len(line)) + 1
	}
	if first {
		return nil, false, 0, badf("--resume: %s is empty or not a ricochet scan record file", path)
	}
	return done, complete, keep, nil
}

// ordered returns the records of a complete file in grid order.
func ordered(done map[int]record, n int) []record {
	keys := make([]int, 0, len(done))
	for k := range done {
		keys = append(keys, k)
	}
	sort.Ints(keys)
	out := make([]record, 0, n)
	for _, k := range keys {
		out = append(out, done[k])
	}
	return out
}

// newProgress returns a progress bar on the command's standard error when
// that is a terminal and quiet is false, else nil.
func newProgress(n int, quiet bool) *progressbar.ProgressBar {
	f, ok := stderrW.(*os.File)
	if quiet || !ok {
		return nil
	}
	st, err := f.Stat()
	if err != nil || st.Mode()&os.ModeCharDevice == 0 {
		return nil
	}
	return progressbar.NewOptions(n,
		progressbar.OptionSetWriter(f),
		progressbar.OptionSetDescription("scan"),
		progressbar.OptionShowCount(),
		progressbar.OptionShowIts(),
		progressbar.OptionSetItsString("points"),
		progressbar.OptionSetPredictTime(true),
		progressbar.OptionClearOnFinish(),
		progressbar.OptionThrottle(100e6),
	)
}
