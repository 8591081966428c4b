package main

import (
	"fmt"
	"math"
	"os"
	"strings"

	"github.com/spf13/pflag"

	"ricochet/background/vec"
	"ricochet/observables/convention"
	"ricochet/observables/scenario"
)

// defaultScenario is the built-in scenario used when none is given.
const defaultScenario = "rootkerr-pair"

// common holds the flags shared by run and scan.
type common struct {
	scenario string
	gamma    float64
	b        float64
	tol      float64
	radius   float64
	method   string
	// Output conventions.
	signature, units, impact, spin string
	conv                           convention.Set
	// fs is the command's flag set (which overrides were given).
	fs *pflag.FlagSet
	// extra, if set, applies command-specific overrides before validation.
	extra func(*Scenario)
}

func (c *common) register(fs *pflag.FlagSet) {
	c.registerScenario(fs)
	fs.StringVar(&c.signature, "signature", "-+++", "metric signature of printed covariant components and dot products: -+++ or +---")
	fs.StringVar(&c.units, "units", "gaussian", "electromagnetic units of printed charges and couplings: gaussian or heaviside-lorentz")
	fs.StringVar(&c.impact, "impact", "covariant", "impact-parameter definition used for eps and first order: covariant, j (|J|/|p|) or eikonal")
	fs.StringVar(&c.spin, "spin", "vector", "spin output: vector (a = S/m) or tensor (S^{mu nu})")
}

// registerScenario registers the flags that choose and override the
// scenario (without the output-convention flags).
func (c *common) registerScenario(fs *pflag.FlagSet) {
	fs.StringVar(&c.scenario, "scenario", "", "built-in scenario name (see 'ricochet scenarios'); default "+defaultScenario+" when no file is given")
	c.fs = fs
	floatFlag(fs, &c.gamma, "gamma", 0, "1 + 5e-13 ≤ gamma ≤ 1e8", "override kinematics.gamma (Lorentz factor at infinity, 1 + 5e-13..1e8)")
	floatFlag(fs, &c.b, "b", 0, "1e-100 ≤ b ≤ 1e100", "override kinematics.b (impact parameter, 1e-100..1e100)")
	floatFlag(fs, &c.tol, "tol", 0, "1e-15 ≤ tol ≤ 1e-3, or 0 for the default", "override numerics.tol (integrator tolerance, 1e-15..1e-3; 0: the default 1e-13)")
	floatFlag(fs, &c.radius, "radius", 0, "10 ≤ radius ≤ 1e12, or 0 for automatic", "override numerics.radius (start/stop radius in units of b, 10..1e12; 0: automatic)")
	fs.StringVar(&c.method, "method", "", "override numerics.method: "+strings.Join(scenario.MethodNames, ", "))
}

// parseConventions reads the convention flags.
func (c *common) parseConventions() error {
	var err error
	if c.conv.Signature, err = convention.ParseSignature(c.signature); err != nil {
		return badf("--signature = %q; allowed: -+++, +---", c.signature)
	}
	if c.conv.Units, err = convention.ParseUnits(c.units); err != nil {
		return badf("--units = %q; allowed: gaussian, heaviside-lorentz", c.units)
	}
	if c.conv.Impact, err = convention.ParseImpact(c.impact); err != nil {
		return badf("--impact = %q; allowed: covariant, j, eikonal", c.impact)
	}
	if c.conv.Spin, err = convention.ParseSpin(c.spin); err != nil {
		return badf("--spin = %q; allowed: vector, tensor", c.spin)
	}
	return nil
}

// load reads the scenario from a file argument or a built-in name and
// applies the flag overrides, then validates it.
func (c *common) load(args []string) (*Scenario, string, error) {
	if err := c.parseConventions(); err != nil {
		return nil, "", err
	}
	var data []byte
	var origin string
	switch {
	case len(args) > 1:
		return nil, "", badf("at most one scenario file, got %d arguments", len(args))
	case len(args) == 1 && c.scenario != "":
		return nil, "", badf("give a scenario file or --scenario, not both")
	case len(args) == 1:
		b, err := os.ReadFile(args[0])
		if err != nil {
			return nil, "", badf("%v", err)
		}
		data, origin = b, args[0]
	default:
		name := c.scenario
		if name == "" {
			name = defaultScenario
		}
		b, err := scenario.Builtin(name)
		if err != nil {
			return nil, "", badf("--scenario: %v", err)
		}
		data, origin = b, "built-in:"+name
	}
	s, err := scenario.Parse(data, origin)
	if err != nil {
		return nil, "", badf("%v", err)
	}
	// An override given on the command line applies whatever its value:
	// an explicit zero is refused by validation where zero would mean a
	// default (MarkGiven), never read as "not given".
	if c.fs.Changed("gamma") {
		if c.gamma == 0 {
			return nil, "", badf("--gamma = 0; allowed: 1 + 5e-13 ≤ gamma ≤ 1e8")
		}
		s.Kinematics.Gamma, s.Kinematics.V = c.gamma, 0
	}
	if c.fs.Changed("b") {
		s.Kinematics.B = c.b
		s.MarkGiven("kinematics.b")
	}
	if c.fs.Changed("tol") {
		s.Numerics.Tol = c.tol
	}
	if c.fs.Changed("radius") {
		s.Numerics.Radius = c.radius
	}
	if c.fs.Changed("method") {
		if c.method == "" {
			return nil, "", badf("--method = \"\"; allowed: %s", strings.Join(scenario.MethodNames, ", "))
		}
		s.Numerics.Method = c.method
	}
	if c.extra != nil {
		c.extra(s)
	}
	if err := s.Validate(); err != nil {
		return nil, "", c.flagNames(err)
	}
	if s.Name == "" {
		s.Name = origin
	}
	return s, string(data), nil
}

// overrides pairs the override flags with the scenario fields they set.
var overrides = []struct{ flag, field string }{
	{"gamma", "kinematics.gamma"}, {"b", "kinematics.b"}, {"tol", "numerics.tol"}, {"radius", "numerics.radius"},
	{"method", "numerics.method"}, {"eps-min", "scan.eps_min"}, {"eps-max", "scan.eps_max"}, {"points", "scan.points"},
}

// flagNames rewrites a validation error about a field that a flag set so
// that it names the flag as the user wrote it: "--eps-min = 0
// (scan.eps_min); allowed: ...".
func (c *common) flagNames(err error) error {
	msg := err.Error()
	for _, o := range overrides {
		if c.fs.Lookup(o.flag) == nil || !c.fs.Changed(o.flag) {
			continue
		}
		if i := strings.Index(msg, o.field+" = "); i >= 0 {
			rest := msg[i+len(o.field)+3:]
			val, tail, _ := strings.Cut(rest, ";")
			if j := strings.IndexAny(val, ":"); j >= 0 {
				val, tail = val[:j], val[j+1:]+";"+tail
			}
			return badf("%s--%s = %s (%s);%s", msg[:i], o.flag, val, o.field, tail)
		}
	}
	return err
}

// conventions is printed in the header of every output: the fixed ones and
// those chosen by the convention flags.
func conventions(c convention.Set) []string {
	out := []string{
		"G = c = 1; Levi-Civita eps_{0123} = +1",
		c.Units.Describe(),
		c.Signature.Describe(),
		"four-vectors are printed as contravariant components v^mu in the source rest frame, or along the triad t, l (incoming direction), b (impact direction, from source to probe), n = l x b",
		c.Impact.Describe(),
		c.Spin.Describe(),
		"coupling: eps = |(q - i g)(Q + i P)|/(m b) (electromagnetic) or |M + i N|/b (gravity), signed by its real part; scans vary eps at fixed gamma and spin/b ratios",
		"impulse dp = p_out - p_in, asymptotic; residual = numeric - first order",
	}
	return out
}

// vecErr returns the Euclidean norm of a four-vector's spatial part.
func norm3(v vec.Vec4) float64 { return v.Spatial().Norm() }

func fmtErr(x float64) string {
	if math.IsNaN(x) {
		return "n/a"
	}
	return fmt.Sprintf("%.1e", x)
}
