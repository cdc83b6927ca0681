package main

import (
	"bytes"
	"fmt"
	"io"
	"sort"
	"strings"
)

// A ref is one reference to an asset inside a text file: data[Start:End]
// is the asset's name, possibly preceded in the file by a directory part
// such as "./".
type ref struct {
	Start, End int
	Name       string
}

// isPathByte reports whether c can be part of a relative URL path as the
// site writes them.
func isPathByte(c byte) bool {
	return 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || '0' <= c && c <= '9' ||
		c == '.' || c == '_' || c == '-' || c == '/'
}

// opensRef reports whether a reference may start right after c in a file of
// kind k: inside a string literal for JavaScript and JSON, in url() or a
// string for CSS, in an attribute value (or srcset list) for HTML and SVG.
func opensRef(k kind, c byte) bool {
	switch k {
	case kindJS:
		return c == '"' || c == '\'' || c == '`'
	case kindJSON:
		return c == '"'
	case kindCSS:
		return c == '(' || c == '"' || c == '\''
	case kindHTML:
		return c == '"' || c == '\'' || c == '=' || c == '(' || c == ',' ||
			c == ' ' || c == '\t' || c == '\n' || c == '\r'
	}
	return false
}

// findRefs finds the references to the given assets in data, a file of
// kind k. A reference is a whole path token, opened by a delimiter that
// suits k, equal to an asset name or ending in "/" and an asset name; the
// longest asset name wins.
func findRefs(k kind, data []byte, assets map[string]bool) []ref {
	if k == kindBinary {
		return nil
	}
	var refs []ref
	for i := 0; i < len(data); i++ {
		if !isPathByte(data[i]) || i > 0 && isPathByte(data[i-1]) {
			continue
		}
		j := i
		for j < len(data) && isPathByte(data[j]) {
			j++
		}
		if i == 0 || !opensRef(k, data[i-1]) {
			i = j
			continue
		}
		tok := data[i:j]
		for start := 0; start < len(tok); {
			if assets[string(tok[start:])] {
				refs = append(refs, ref{Start: i + start, End: j, Name: string(tok[start:])})
				break
			}
			slash := bytes.IndexByte(tok[start:], '/')
			if slash < 0 {
				break
			}
			start += slash + 1
		}
		i = j
	}
	return refs
}

// rewriteRefs replaces every reference in data (the file name) to an asset
// in hashed by the asset's hashed name. A file naming itself is left alone,
// with a warning, since its hash cannot include its own name.
func rewriteRefs(name string, data []byte, hashed map[string]string, logw io.Writer) []byte {
	k := typeOf(name).kind
	if k == kindBinary {
		return data
	}
	known := make(map[string]bool, len(hashed)+1)
	for n := range hashed {
		known[n] = true
	}
	known[name] = true
	refs := findRefs(k, data, known)
	if len(refs) == 0 {
		return data
	}
	var b bytes.Buffer
	last := 0
	for _, r := range refs {
		if r.Name == name {
			fmt.Fprintf(logw, "build: %s refers to itself; that reference keeps the plain name\n", name)
			continue
		}
		b.Write(data[last:r.Start])
		b.WriteString(hashed[r.Name])
		last = r.End
	}
	b.Write(data[last:])
	return b.Bytes()
}

// hashOrder returns the files to hash (all but index.html and sw.js) so
// that each comes after every asset it refers to. Ties go by name, so the
// order is deterministic. A cycle of references is an error.
func hashOrder(files map[string][]byte) ([]string, error) {
	assets := make(map[string]bool, len(files))
	for name := range files {
		if name != indexName && name != swName {
			assets[name] = true
		}
	}
	deps := make(map[string]map[string]bool, len(assets))
	for name := range assets {
		deps[name] = make(map[string]bool)
		for _, r := range findRefs(typeOf(name).kind, files[name], assets) {
			if r.Name != name {
				deps[name][r.Name] = true
			}
		}
	}
	var order []string
	done := make(map[string]bool, len(assets))
	for len(order) < len(assets) {
		var ready []string
		for name := range assets {
			if done[name] {
				continue
			}
			ok := true
			for d := range deps[name] {
				if !done[d] {
					ok = false
					break
				}
			}
			if ok {
				ready = append(ready, name)
			}
		}
		if len(ready) == 0 {
			var stuck []string
			for name := range assets {
				if !done[name] {
					stuck = append(stuck, name)
				}
			}
			sort.Strings(stuck)
			return nil, fmt.Errorf("assets refer to each other in a cycle: %s", strings.Join(stuck, ", "))
		}
		sort.Strings(ready)
		for _, name := range ready {
			done[name] = true
		}
		order = append(order, ready...)
	}
	return order, nil
}
