package main

import (
	"embed"
	"io"
)

// The JSON Schemas (draft 2020-12) of the JSON documents that run, scan,
// check and verify write, published in schema/ and printed by --format
// json-schema. Every JSON output of the tests is validated against them.
//
//go:embed schema/*.schema.json
var schemaFS embed.FS

// Identifiers of the schemas, written into each document as "schema".
const (
	runSchemaID   = "urn:ricochet:schema:run:1"
	scanSchemaID  = "urn:ricochet:schema:scan:1"
	checkSchemaID = "urn:ricochet:schema:check:1"
	// verifySchemaID identifies the JSON of ricochet verify.
	verifySchemaID = "urn:ricochet:schema:verify:1"
)

// writeSchema prints the schema of a command's JSON output.
func writeSchema(w io.Writer, command string) error {
	b, err := schemaFS.ReadFile("schema/" + command + ".schema.json")
	if err != nil {
		return err
	}
	_, err = w.Write(b)
	return err
}
