package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestInterruptSignal: a scan started as a process (the test binary
// standing in for the command, see TestMain) and sent SIGINT while
// it runs finishes the points in flight, exits with status 1 saying how
// to resume, and leaves a record file whose every line is a complete
// JSON record; resuming it completes the scan to the file of an
// uninterrupted run, byte for byte.
func TestInterruptSignal(t *testing.T) {
	if testing.Short() {
		t.Skip("starts the command as a process")
	}
	dir := t.TempDir()
	full, part := filepath.Join(dir, "full.jsonl"), filepath.Join(dir, "part.jsonl")
	args := []string{"scan", "--scenario", "coulomb-darwin", "--points", "40", "--quiet", "--workers", "1", "--format", "csv"}
	code, want, e := run(append(args, "--output", full)...)
	if code != 0 {
		t.Fatalf("uninterrupted scan: exit %d %s", code, e)
	}
	cmd := exec.Command(os.Args[0], append(args, "--output", part)...)
	cmd.Env = append(os.Environ(), "RICOCHET_TEST_AS_PROGRAM=1")
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	// Signal once a few points are recorded (header + 3 lines).
	deadline := time.Now().Add(60 * time.Second)
	for {
		b, _ := os.ReadFile(part)
		if bytes.Count(b, []byte("\n")) >= 4 {
			break
		}
		if time.Now().After(deadline) {
			cmd.Process.Kill()
			t.Fatalf("no points recorded within a minute")
		}
		time.Sleep(5 * time.Millisecond)
	}
	if err := cmd.Process.Signal(syscall.SIGINT); err != nil {
		t.Fatal(err)
	}
	err := cmd.Wait()
	ee, ok := err.(*exec.ExitError)
	if !ok || ee.ExitCode() != 1 {
		t.Fatalf("interrupted scan: %v, want exit status 1; stderr %q", err, stderr.String())
	}
	if msg := stderr.String(); !strings.Contains(msg, "finishing the points in flight") || !strings.Contains(msg, "resume with: ricochet scan") {
		t.Errorf("stderr %q: want the interruption and the resume command", msg)
	}
	b, _ := os.ReadFile(part)
	lines := 0
	sc := bufio.NewScanner(bytes.NewReader(b))
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		lines++
		if !json.Valid(sc.Bytes()) {
			t.Errorf("line %d of the interrupted file is not complete JSON: %q", lines, sc.Text())
		}
	}
	if !bytes.HasSuffix(b, []byte("\n")) || lines < 4 || lines > 41 {
		t.Errorf("interrupted file: %d lines", lines)
	}
	code, got, e := run(append(args, "--output", part, "--resume")...)
	if code != 0 {
		t.Fatalf("resume: exit %d %s", code, e)
	}
	f1, _ := os.ReadFile(full)
	f2, _ := os.ReadFile(part)
	if !bytes.Equal(f1, f2) {
		t.Errorf("resumed file differs from the uninterrupted one")
	}
	if got != want {
		t.Errorf("resumed CSV differs from the uninterrupted one")
	}
	t.Logf("interrupted after %d of 40 points; resumed to the uninterrupted file", lines-1)
}
