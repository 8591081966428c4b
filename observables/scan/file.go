package scan

import (
	"bufio"
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"sort"

	"ricochet/observables/scenario"
)

// RecordFormat names the format of the scan record file: JSON lines, a
// Header first, then one Record per line in the order points finished, and
// once the scan is complete the whole file rewritten in job order with a
// Trailer last.
const RecordFormat = "ricochet-scan-records/1"

// Header is the first line of a record file. Hash identifies the scenario
// and scan settings; a file with another hash is not resumed.
type Header struct {
	Format   string             `json:"format"`
	Hash     string             `json:"hash"`
	Version  string             `json:"version"`
	Scenario *scenario.Scenario `json:"scenario"`
	Grid     []Float            `json:"grid"`
	// Models lists the completions of a spread scan, in job order.
	Models []string `json:"models,omitempty"`
}

// Trailer is the last line of a complete record file.
type Trailer struct {
	Complete bool `json:"complete"`
	Points   int  `json:"points"`
}

// FileError reports a record file that cannot be used for the requested
// scan: an input error, with the file's path.
type FileError struct {
	Path string
	// Exists is set when the file exists and is not empty but the scan
	// was not asked to resume it.
	Exists bool
	// Resume is set for errors found while reading a file to resume.
	Resume bool
	Msg    string
}

func (e *FileError) Error() string { return e.Msg }

// Hash hashes everything that determines the recorded numbers: the
// program version, the validated scenario (with numerics), the grid and
// the models of a spread scan (absent otherwise, so that records of
// ordinary scans keep their hash). It returns the hash and the grid.
func Hash(s *scenario.Scenario, members []string, version string) (string, []Float) {
	var grid []Float
	for _, e := range EpsGrid(s) {
		grid = append(grid, Float(e))
	}
	b, _ := json.Marshal(struct {
		V      string
		S      *scenario.Scenario
		G      []Float
		Spread []string `json:",omitempty"`
	}{version, s, grid, members})
	h := sha256.Sum256(b)
	return hex.EncodeToString(h[:12]), grid
}

// runRecorded runs a scan with a record file (Settings.Record).
func runRecorded(ctx context.Context, s *scenario.Scenario, set *Settings) ([]Record, error) {
	path, members := set.Record, set.Members
	hash, grid := Hash(s, members, set.Version)
	hdr := Header{Format: RecordFormat, Hash: hash, Version: set.Version, Scenario: s, Grid: grid, Models: members}
	njobs := Jobs(s, members)
	done := map[int]Record{}
	var f *os.File
	if set.Resume {
		var complete bool
		var keep int64
		var err error
		done, complete, keep, err = readRecords(path, hash)
		if err != nil {
			return nil, err
		}
		if complete {
			return ordered(done, njobs), nil
		}
		f, err = os.OpenFile(path, os.O_RDWR, 0)
		if err != nil {
			return nil, &FileError{Path: path, Resume: true, Msg: err.Error()}
		}
		// Drop a partly written last line.
		if err := f.Truncate(keep); err != nil {
			return nil, err
		}
		if _, err := f.Seek(keep, 0); err != nil {
			return nil, err
		}
		if set.Progress != nil {
			set.Progress(len(done), njobs)
		}
	} else {
		if st, err := os.Stat(path); err == nil && st.Size() > 0 {
			return nil, &FileError{Path: path, Exists: true, Msg: fmt.Sprintf("record file %s exists", path)}
		}
		var err error
		f, err = os.Create(path)
		if err != nil {
			return nil, &FileError{Path: path, Msg: err.Error()}
		}
		if err := appendLine(f, hdr); err != nil {
			f.Close()
			return nil, err
		}
	}
	recs, err := runJobs(ctx, s, done, set, func(r Record) error { return appendLine(f, r) })
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

// writeCanonical rewrites the record file in job order with a trailer
// (through a synced temporary file and a rename, so the file is never
// left half-written): the final file does not depend on the order in
// which points finished or on interruptions.
func writeCanonical(path string, hdr Header, recs []Record) error {
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
	enc(Trailer{Complete: true, Points: len(recs)})
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

// readRecords reads a record file, checks its hash and returns the
// complete records, whether the trailer is present, and the length of the
// well-formed prefix of the file.
func readRecords(path, hash string) (map[int]Record, bool, int64, error) {
	bad := func(format string, args ...any) error {
		return &FileError{Path: path, Resume: true, Msg: fmt.Sprintf(format, args...)}
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, false, 0, bad("%v", err)
	}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	var keep int64
	done := map[int]Record{}
	first, complete := true, false
	for sc.Scan() {
		line := sc.Bytes()
		if int(keep)+len(line) >= len(data) || data[int(keep)+len(line)] != '\n' {
			break // last line without its newline: partly written
		}
		if first {
			var h Header
			if err := json.Unmarshal(line, &h); err != nil || h.Format != RecordFormat {
				return nil, false, 0, bad("%s is not a ricochet scan record file", path)
			}
			if h.Hash != hash {
				return nil, false, 0, bad("%s was recorded for another scenario or other scan settings (hash %s, these settings %s)", path, h.Hash, hash)
			}
			first = false
		} else {
			var t Trailer
			if json.Unmarshal(line, &t) == nil && t.Complete {
				complete = true
			} else {
				var r Record
				if err := json.Unmarshal(line, &r); err != nil {
					break
				}
				done[r.Index] = r
			}
		}
		keep += int64(len(line)) + 1
	}
	if first {
		return nil, false, 0, bad("%s is empty or not a ricochet scan record file", path)
	}
	return done, complete, keep, nil
}

// ordered returns the records of a complete file in job order.
func ordered(done map[int]Record, n int) []Record {
	keys := make([]int, 0, len(done))
	for k := range done {
		keys = append(keys, k)
	}
	sort.Ints(keys)
	out := make([]Record, 0, n)
	for _, k := range keys {
		out = append(out, done[k])
	}
	return out
}
