package main

import (
	"math"
	"reflect"
	"strings"
)

// nanFree converts v into a tree of maps, slices and scalars in which
// every NaN or infinite float becomes nil (JSON null): JSON has no
// representation for them, and a missing number must not be written as 0.
func nanFree(v any) any { return walk(reflect.ValueOf(v)) }

func walk(v reflect.Value) any {
	switch v.Kind() {
	case reflect.Invalid:
		return nil
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			return nil
		}
		return walk(v.Elem())
	case reflect.Float32, reflect.Float64:
		f := v.Float()
		if math.IsNaN(f) || math.IsInf(f, 0) {
			return nil
		}
		return f
	case reflect.Slice, reflect.Array:
		out := make([]any, v.Len())
		for i := range out {
			out[i] = walk(v.Index(i))
		}
		return out
	case reflect.Map:
		out := map[string]any{}
		for _, k := range v.MapKeys() {
			out[k.String()] = walk(v.MapIndex(k))
		}
		return out
	case reflect.Struct:
		out := map[string]any{}
		t := v.Type()
		for i := 0; i < t.NumField(); i++ {
			f := t.Field(i)
			if !f.IsExported() {
				continue
			}
			// The key: the json tag's name, else the toml tag's (the
			// scenario's keys as in its file), else the Go name.
			name := f.Name
			if tag := f.Tag.Get("toml"); tag != "" {
				name = strings.Split(tag, ",")[0]
			}
			omit := false
			if tag := f.Tag.Get("json"); tag != "" {
				parts := strings.Split(tag, ",")
				if parts[0] == "-" {
					continue
				}
				if parts[0] != "" {
					name = parts[0]
				}
				omit = len(parts) > 1 && parts[1] == "omitempty"
			}
			fv := v.Field(i)
			if omit && fv.IsZero() {
				continue
			}
			out[name] = walk(fv)
		}
		return out
	default:
		return v.Interface()
	}
}
