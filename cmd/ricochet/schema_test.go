package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"strings"
	"sync"
	"testing"

	"github.com/santhosh-tekuri/jsonschema/v6"
)

var (
	schemaOnce     sync.Once
	schemaCompiled map[string]*jsonschema.Schema
	schemaErr      error
)

// compiledSchemas compiles the published schemas once (against the
// draft 2020-12 meta-schema, so a malformed schema fails here).
func compiledSchemas() (map[string]*jsonschema.Schema, error) {
	schemaOnce.Do(func() {
		c := jsonschema.NewCompiler()
		c.DefaultDraft(jsonschema.Draft2020)
		c.AssertFormat()
		ids := map[string]string{"run": runSchemaID, "scan": scanSchemaID, "check": checkSchemaID, "verify": verifySchemaID}
		for name, id := range ids {
			b, err := schemaFS.ReadFile("schema/" + name + ".schema.json")
			if err != nil {
				schemaErr = err
				return
			}
			doc, err := jsonschema.UnmarshalJSON(strings.NewReader(string(b)))
			if err != nil {
				schemaErr = err
				return
			}
			if err := c.AddResource(id, doc); err != nil {
				schemaErr = err
				return
			}
		}
		schemaCompiled = map[string]*jsonschema.Schema{}
		for name, id := range ids {
			s, err := c.Compile(id)
			if err != nil {
				schemaErr = err
				return
			}
			schemaCompiled[name] = s
		}
	})
	return schemaCompiled, schemaErr
}

// validateJSON checks a JSON document written by `ricochet command`
// against the command's published schema. Every test that produces JSON
// output calls it.
func validateJSON(t *testing.T, command, out string) {
	t.Helper()
	schemas, err := compiledSchemas()
	if err != nil {
		t.Fatalf("schemas: %v", err)
	}
	inst, err := jsonschema.UnmarshalJSON(strings.NewReader(out))
	if err != nil {
		t.Fatalf("%s output is not JSON: %v", command, err)
	}
	if err := schemas[command].Validate(inst); err != nil {
		t.Errorf("%s output does not validate against schema/%s.schema.json:\n%v", command, command, err)
	}
}

// TestSchemaRejects: the schemas are not vacuous — documents with a Go
// field name, an unlabelled vector or a missing key fail.
func TestSchemaRejects(t *testing.T) {
	schemas, err := compiledSchemas()
	if err != nil {
		t.Fatal(err)
	}
	_, good, _ := run("run", "--format", "json")
	for _, c := range []struct{ what, old, new string }{
		{"Go field name", `"drift": {`, `"Drift": {`},
		{"array vector", `"p_in": {`, `"p_in": [1,2,3,4], "unused": {`},
		{"missing key", `"in_plane_angle":`, `"in_plane_angl":`},
	} {
		bad := strings.Replace(good, c.old, c.new, 1)
		if bad == good {
			t.Fatalf("%s: %q not in the output", c.what, c.old)
		}
		inst, err := jsonschema.UnmarshalJSON(strings.NewReader(bad))
		if err != nil {
			t.Fatalf("%s: %v", c.what, err)
		}
		if schemas["run"].Validate(inst) == nil {
			t.Errorf("%s: the run schema accepts it", c.what)
		}
	}
}

// TestSchemaFormat: --format json-schema prints each published schema.
func TestSchemaFormat(t *testing.T) {
	for _, c := range []string{"run", "scan", "check", "verify"} {
		code, out, e := run(c, "--format", "json-schema")
		want, _ := schemaFS.ReadFile("schema/" + c + ".schema.json")
		if code != 0 || out != string(want) {
			t.Errorf("%s --format json-schema: exit %d, %d bytes (want %d), %s", c, code, len(out), len(want), e)
		}
	}
}

// TestSchemaNoDuplicateKeys: no object of a published schema repeats a
// key (JSON parsers keep one of them silently, RFC 8259 §4).
func TestSchemaNoDuplicateKeys(t *testing.T) {
	files, err := schemaFS.ReadDir("schema")
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range files {
		b, _ := schemaFS.ReadFile("schema/" + f.Name())
		dec := json.NewDecoder(bytes.NewReader(b))
		if err := noDuplicates(dec, f.Name()); err != nil {
			t.Error(err)
		}
	}
}

// noDuplicates reads one JSON value from dec and reports a repeated key.
func noDuplicates(dec *json.Decoder, where string) error {
	tok, err := dec.Token()
	if err != nil {
		return err
	}
	switch tok {
	case json.Delim('{'):
		seen := map[string]bool{}
		for dec.More() {
			k, err := dec.Token()
			if err != nil {
				return err
			}
			key := k.(string)
			if seen[key] {
				return fmt.Errorf("%s: key %q repeated", where, key)
			}
			seen[key] = true
			if err := noDuplicates(dec, where+"/"+key); err != nil {
				return err
			}
		}
		_, err = dec.Token()
	case json.Delim('['):
		for dec.More() {
			if err := noDuplicates(dec, where+"[]"); err != nil {
				return err
			}
		}
		_, err = dec.Token()
	}
	return err
}
