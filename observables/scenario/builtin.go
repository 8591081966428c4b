package scenario

import (
	"embed"
	"fmt"
	"sort"
	"strings"
)

//go:embed scenarios/*.toml
var builtinFS embed.FS

// BuiltinNames lists the built-in scenarios, sorted.
func BuiltinNames() []string {
	ents, _ := builtinFS.ReadDir("scenarios")
	var names []string
	for _, e := range ents {
		names = append(names, strings.TrimSuffix(e.Name(), ".toml"))
	}
	sort.Strings(names)
	return names
}

// Builtin returns the named built-in scenario's TOML text.
func Builtin(name string) ([]byte, error) {
	b, err := builtinFS.ReadFile("scenarios/" + name + ".toml")
	if err != nil {
		return nil, fmt.Errorf("no built-in scenario %q; allowed: %s", name, strings.Join(BuiltinNames(), ", "))
	}
	return b, nil
}

// LoadBuiltin decodes the named built-in scenario (not yet validated, so
// that fields can be changed before Validate fills the defaults).
func LoadBuiltin(name string) (*Scenario, error) {
	b, err := Builtin(name)
	if err != nil {
		return nil, err
	}
	return Parse(b, name)
}
