package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/spf13/pflag"
)

// floatValue is a float64 flag that refuses, with the allowed range, what
// strconv.ParseFloat would turn into another number: text that is not a
// number, values beyond the float64 range and nonzero values that
// underflow to zero (1e-400), which a zero-means-default flag would
// otherwise read silently as "not given".
type floatValue struct {
	p       *float64
	allowed string
}

func (f *floatValue) String() string { return strconv.FormatFloat(*f.p, 'g', -1, 64) }
func (f *floatValue) Type() string   { return "float" }
func (f *floatValue) Set(s string) error {
	x, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || (x == 0 && nonzeroText(s)) {
		return fmt.Errorf("allowed: %s", f.allowed)
	}
	*f.p = x
	return nil
}

// nonzeroText reports whether the mantissa of a decimal or hexadecimal
// number has a nonzero digit.
func nonzeroText(s string) bool {
	s = strings.ToLower(strings.TrimSpace(s))
	digits := "123456789"
	cut := "e"
	if strings.HasPrefix(strings.TrimLeft(s, "+-"), "0x") {
		s = strings.TrimPrefix(strings.TrimLeft(s, "+-"), "0x")
		digits += "abcdef"
		cut = "p"
	}
	if i := strings.Index(s, cut); i >= 0 {
		s = s[:i]
	}
	return strings.ContainsAny(s, digits)
}

// intValue is an int flag whose parse errors state the allowed range.
type intValue struct {
	p       *int
	allowed string
}

func (f *intValue) String() string { return strconv.Itoa(*f.p) }
func (f *intValue) Type() string   { return "int" }
func (f *intValue) Set(s string) error {
	x, err := strconv.Atoi(strings.TrimSpace(s))
	if err != nil {
		return fmt.Errorf("allowed: %s", f.allowed)
	}
	*f.p = x
	return nil
}

// floatFlag defines a float flag with its allowed range.
func floatFlag(fs *pflag.FlagSet, p *float64, name string, def float64, allowed, usage string) {
	*p = def
	fs.Var(&floatValue{p, allowed}, name, usage)
}

// intFlag defines an int flag with its allowed range.
func intFlag(fs *pflag.FlagSet, p *int, name string, def int, allowed, usage string) {
	*p = def
	fs.Var(&intValue{p, allowed}, name, usage)
}

// checkOutputPath checks, before any computation, that a file can be
// written at path: its directory exists and is a directory, and path is
// not itself a directory.
func checkOutputPath(flag, path string) error {
	if path == "" {
		return badf("--%s = \"\"; allowed: a file path", flag)
	}
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		return badf("--%s = %q is a directory; allowed: a file path", flag, path)
	}
	dir := filepath.Dir(path)
	st, err := os.Stat(dir)
	if err != nil || !st.IsDir() {
		return badf("--%s = %q: directory %q does not exist; allowed: a file in an existing directory", flag, path, dir)
	}
	return nil
}
