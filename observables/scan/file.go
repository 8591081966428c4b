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
	"reflect"
	"slices"
	"sort"
	"strings"

	"ricochet/observables/scenario"
)

// RecordFormat names the format of the scan record file: JSON lines, a
// Header first, then one Record per line in the order points finished, and
// once the scan (or shard) is complete the whole file rewritten in job
// order with a Trailer last.
const RecordFormat = "ricochet-scan-records/3"

// Header is the first line of a record file. Hash identifies the scenario
// and scan settings; a file with another hash is not resumed or merged.
type Header struct {
	Format  string `json:"format"`
	Hash    string `json:"hash"`
	Version string `json:"version"`
	// Shard is "K/N" for the file of one shard (empty for a whole scan).
	Shard    string             `json:"shard,omitempty"`
	Scenario *scenario.Scenario `json:"scenario"`
	// Grid is the coupling grid; the parameter axes are in the scenario.
	Grid []Float `json:"grid"`
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
// program version, the validated scenario (with numerics and axes), the
// coupling grid and the models of a spread scan. It returns the hash and
// the grid.
func Hash(s *scenario.Scenario, members []string, version string) (string, []Float) {
	var grid []Float
	for _, e := range s.CouplingGrid() {
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

// header returns the header of the record file of a shard of p.
func (p *Plan) header(version string, shard Shard) Header {
	_, grid := Hash(p.Scenario, p.Members, version)
	return Header{Format: RecordFormat, Hash: p.Hash, Version: version, Shard: shard.String(), Scenario: p.Scenario, Grid: grid, Models: p.Members}
}

// runRecorded runs a scan with a record file (Settings.Record).
func runRecorded(ctx context.Context, p *Plan, set *Settings) ([]Record, error) {
	path := set.Record
	hdr := p.header(set.Version, set.Shard)
	done := map[int]Record{}
	if set.Resume {
		rf, err := readFile(path)
		if err != nil {
			return nil, err
		}
		if rf.hdr.Hash != p.Hash {
			return nil, &FileError{Path: path, Resume: true, Msg: fmt.Sprintf("%s was recorded for another scenario or other scan settings (hash %s, these settings %s)", path, rf.hdr.Hash, p.Hash)}
		}
		if rf.hdr.Shard != hdr.Shard {
			return nil, &FileError{Path: path, Resume: true, Msg: fmt.Sprintf("%s holds shard %q, not %q", path, rf.hdr.Shard, hdr.Shard)}
		}
		chk := p.checkFile(rf, set.Shard)
		done = chk.done
		want := set.Shard.Count(p.Jobs())
		if rf.complete && len(chk.problems) == 0 && len(chk.dup) == 0 && len(done) == want && rf.trailer.Points == want {
			return ordered(done), nil
		}
		if set.Warn != nil {
			if len(chk.dup) > 0 {
				set.Warn(fmt.Sprintf("%s: %d points recorded twice with identical values (%s); kept once", path, len(chk.dup), Ranges(chk.dup)))
			}
			if msg := chk.summary(path); msg != "" {
				set.Warn(msg + "; they are recomputed")
			}
			if rf.complete && len(done) < want {
				set.Warn(fmt.Sprintf("%s is marked complete but holds %d valid records of %d; the missing ones are computed", path, len(done), want))
			}
		}
		if set.Progress != nil {
			set.Progress(len(done), want)
		}
		// Start from a consistent file: the header and the valid records.
		if err := writeFile(path, hdr, ordered(done), false); err != nil {
			return nil, err
		}
	} else {
		if st, err := os.Stat(path); err == nil && st.Size() > 0 {
			return nil, &FileError{Path: path, Exists: true, Msg: fmt.Sprintf("record file %s exists", path)}
		}
		if err := writeFile(path, hdr, nil, false); err != nil {
			return nil, &FileError{Path: path, Msg: err.Error()}
		}
	}
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_APPEND, 0)
	if err != nil {
		return nil, &FileError{Path: path, Msg: err.Error()}
	}
	recs, err := runJobs(ctx, p, done, set, func(r Record) error { return appendLine(f, r) })
	if cerr := f.Close(); err == nil && cerr != nil {
		err = cerr
	}
	if err != nil {
		return nil, err
	}
	return recs, writeFile(path, hdr, recs, true)
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

// writeFile writes a record file: the header, the records in the order
// given and, if complete, the trailer, through a synced temporary file
// and a rename, so the file is never left half-written. The complete file
// does not depend on the order in which points finished or on
// interruptions.
func writeFile(path string, hdr Header, recs []Record, complete bool) error {
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
	if complete {
		enc(Trailer{Complete: true, Points: len(recs)})
	}
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

// recordFile is a record file as read, before its records are checked.
type recordFile struct {
	hdr      Header
	lines    []recordLine
	complete bool
	trailer  Trailer
	// bad lists lines that are not records (not JSON, unknown keys).
	bad []string
}

type recordLine struct {
	line int
	rec  Record
}

// readFile reads a record file. A last line without its newline (a write
// cut short) is ignored; other lines that are not records are listed in
// bad. Errors: the file cannot be read or has no record-file header.
func readFile(path string) (*recordFile, error) {
	bad := func(format string, args ...any) error {
		return &FileError{Path: path, Resume: true, Msg: fmt.Sprintf(format, args...)}
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, bad("%v", err)
	}
	return parseFile(path, data)
}

// parseFile parses the contents of a record file (readFile).
func parseFile(path string, data []byte) (*recordFile, error) {
	rf := &recordFile{}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	var pos int
	n := 0
	for sc.Scan() {
		line := sc.Bytes()
		n++
		if pos+len(line) >= len(data) || data[pos+len(line)] != '\n' {
			break // last line without its newline: partly written
		}
		pos += len(line) + 1
		if n == 1 {
			if err := strict(line, &rf.hdr); err != nil || rf.hdr.Format != RecordFormat || rf.hdr.Scenario == nil {
				if bytes.Contains(line, []byte(`"ricochet-scan-records/`)) {
					return nil, &FileError{Path: path, Resume: true, Msg: fmt.Sprintf("%s is a ricochet scan record file of another format version; want %s", path, RecordFormat)}
				}
				return nil, &FileError{Path: path, Resume: true, Msg: fmt.Sprintf("%s is not a ricochet scan record file", path)}
			}
			continue
		}
		var r Record
		if err := strict(line, &r); err == nil {
			if key := missingKey(line); key != "" {
				rf.bad = append(rf.bad, fmt.Sprintf("line %d: not a record (key %q missing)", n, key))
				continue
			}
			rf.lines = append(rf.lines, recordLine{n, r})
			continue
		}
		var t Trailer
		if strict(line, &t) == nil && t.Complete {
			rf.complete, rf.trailer = true, t
			continue
		}
		rf.bad = append(rf.bad, fmt.Sprintf("line %d: not a record", n))
	}
	if n == 0 || rf.hdr.Format == "" {
		return nil, &FileError{Path: path, Resume: true, Msg: fmt.Sprintf("%s is empty or not a ricochet scan record file", path)}
	}
	return rf, nil
}

// strict decodes one JSON value, refusing unknown keys and trailing data.
// recordKeys are the keys every record line carries (the JSON fields of
// Record without omitempty): a line lacking one would decode with a zero
// there (an error estimate of 0, say) and is not a record.
var recordKeys = func() []string {
	var keys []string
	t := reflect.TypeOf(Record{})
	for i := range t.NumField() {
		tag := t.Field(i).Tag.Get("json")
		name, opts, _ := strings.Cut(tag, ",")
		if name != "" && name != "-" && !strings.Contains(opts, "omitempty") {
			keys = append(keys, name)
		}
	}
	return keys
}()

// missingKey returns the first of recordKeys that a record line lacks, or "".
func missingKey(line []byte) string {
	var m map[string]json.RawMessage
	if json.Unmarshal(line, &m) != nil {
		return "?"
	}
	for _, k := range recordKeys {
		if _, ok := m[k]; !ok {
			return k
		}
	}
	return ""
}

func strict(line []byte, v any) error {
	dec := json.NewDecoder(bytes.NewReader(line))
	dec.DisallowUnknownFields()
	if err := dec.Decode(v); err != nil {
		return err
	}
	if dec.More() {
		return fmt.Errorf("trailing data")
	}
	return nil
}

// fileCheck is the outcome of checking the records of a file.
type fileCheck struct {
	done map[int]Record
	// problems lists the records that did not check out, with reasons.
	problems []string
	// dup lists indices recorded twice with identical content (one is
	// kept); conflict those recorded twice with different content
	// (none is kept).
	dup, conflict []int
}

// checkFile checks every record of rf against the plan (Plan.Check).
func (p *Plan) checkFile(rf *recordFile, shard Shard) fileCheck {
	c := fileCheck{done: map[int]Record{}, problems: append([]string(nil), rf.bad...)}
	conflicted := map[int]bool{}
	for _, l := range rf.lines {
		if err := p.Check(l.rec, shard); err != nil {
			c.problems = append(c.problems, fmt.Sprintf("line %d: %v", l.line, err))
			continue
		}
		i := l.rec.Index
		if conflicted[i] {
			continue
		}
		if old, ok := c.done[i]; ok {
			if same(old, l.rec) {
				c.dup = append(c.dup, i)
				continue
			}
			delete(c.done, i)
			conflicted[i] = true
			c.conflict = append(c.conflict, i)
			c.problems = append(c.problems, fmt.Sprintf("line %d: point %d recorded before with other values", l.line, i))
			continue
		}
		c.done[i] = l.rec
	}
	slices.Sort(c.dup)
	return c
}

// summary is a one-line account of the problems of a file, or "".
func (c fileCheck) summary(path string) string {
	if len(c.problems) == 0 {
		return ""
	}
	const show = 3
	msg := fmt.Sprintf("%s: %d records did not check out (", path, len(c.problems))
	for k, p := range c.problems {
		if k == show {
			msg += fmt.Sprintf("; and %d more", len(c.problems)-show)
			break
		}
		if k > 0 {
			msg += "; "
		}
		msg += p
	}
	return msg + ")"
}

// same reports whether two records are identical.
func same(a, b Record) bool {
	x, _ := json.Marshal(a)
	y, _ := json.Marshal(b)
	return bytes.Equal(x, y)
}

// ordered returns records in job order.
func ordered(done map[int]Record) []Record {
	keys := make([]int, 0, len(done))
	for k := range done {
		keys = append(keys, k)
	}
	sort.Ints(keys)
	out := make([]Record, 0, len(done))
	for _, k := range keys {
		out = append(out, done[k])
	}
	return out
}
