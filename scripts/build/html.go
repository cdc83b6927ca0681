package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"regexp"
	"strings"

	"github.com/tdewolff/parse/v2"
	"github.com/tdewolff/parse/v2/html"
)

// pageScan is what scanPage learns about an HTML page.
type pageScan struct {
	csp     []string // content of each CSP <meta>
	inline  []string // problems that the CSP would block: inline scripts, handlers
	styles  []string // inline styles, which the CSP blocks too
	hasHTML bool
	hasHead bool
	hasBody bool
	endTags map[string]bool
}

// scanPage lexes an HTML page and collects its CSP meta tags and every
// inline script, event handler, javascript: URL and inline style.
func scanPage(data []byte) (*pageScan, error) {
	s := &pageScan{endTags: make(map[string]bool)}
	l := html.NewLexer(parse.NewInputBytes(data))
	var tag string          // current start tag, lower case
	var attrs []([2]string) // its attributes, key lower case, value unquoted
	var rawText string      // "script" or "style" while inside one
	for {
		tt, raw := l.Next()
		switch tt {
		case html.ErrorToken:
			if err := l.Err(); err != nil && !errors.Is(err, io.EOF) {
				return nil, err
			}
			return s, nil
		case html.StartTagToken:
			tag = strings.ToLower(string(l.Text()))
			attrs = attrs[:0]
			switch tag {
			case "html":
				s.hasHTML = true
			case "head":
				s.hasHead = true
			case "body":
				s.hasBody = true
			}
		case html.AttributeToken:
			key := strings.ToLower(string(l.AttrKey()))
			val := string(unquote(l.AttrVal()))
			attrs = append(attrs, [2]string{key, val})
			if strings.HasPrefix(key, "on") {
				s.inline = append(s.inline, fmt.Sprintf("event handler %s on <%s>", key, tag))
			}
			if strings.HasPrefix(strings.ToLower(strings.TrimSpace(val)), "javascript:") {
				s.inline = append(s.inline, fmt.Sprintf("javascript: URL in %s of <%s>", key, tag))
			}
			if key == "style" {
				s.styles = append(s.styles, fmt.Sprintf("style attribute on <%s>", tag))
			}
		case html.StartTagCloseToken, html.StartTagVoidToken:
			if tag == "meta" && strings.EqualFold(attr(attrs, "http-equiv"), "content-security-policy") {
				s.csp = append(s.csp, attr(attrs, "content"))
			}
			if tt == html.StartTagCloseToken && (tag == "script" || tag == "style") {
				rawText = tag
			}
		case html.TextToken:
			if rawText != "" && len(bytes.TrimSpace(raw)) > 0 {
				if rawText == "script" {
					s.inline = append(s.inline, "inline <script> with content")
				} else {
					s.styles = append(s.styles, "inline <style> with content")
				}
			}
			rawText = ""
		case html.EndTagToken:
			s.endTags[strings.ToLower(string(l.Text()))] = true
			rawText = ""
		}
	}
}

func unquote(v []byte) []byte {
	if len(v) >= 2 && (v[0] == '"' || v[0] == '\'') && v[len(v)-1] == v[0] {
		return v[1 : len(v)-1]
	}
	return v
}

func attr(attrs [][2]string, key string) string {
	for _, a := range attrs {
		if a[0] == key {
			return a[1]
		}
	}
	return ""
}

var (
	headTag    = regexp.MustCompile(`(?i)<head(\s[^>]*)?>`)
	charsetTag = regexp.MustCompile(`(?i)<meta\s+charset\s*=[^>]*>`)
)

// prepareIndex checks the source of index.html and gives it the
// Content-Security-Policy meta tag if it has none. Inline scripts, event
// handler attributes and javascript: URLs are errors: the policy forbids
// them. Inline styles, also blocked by the policy, are reported to logw.
func prepareIndex(data []byte, logw io.Writer) ([]byte, error) {
	s, err := scanPage(data)
	if err != nil {
		return nil, err
	}
	if len(s.inline) > 0 {
		return nil, fmt.Errorf("the Content-Security-Policy forbids inline scripts; move them to a .js file: %s", strings.Join(s.inline, "; "))
	}
	for _, st := range s.styles {
		fmt.Fprintf(logw, "build: warning: %s: %s is blocked by the Content-Security-Policy\n", indexName, st)
	}
	for _, c := range s.csp {
		if normalizeCSP(c) != normalizeCSP(contentSecurityPolicy) {
			fmt.Fprintf(logw, "build: warning: %s: its Content-Security-Policy differs from the one scripts/serve sends:\n  %s\n", indexName, c)
		}
	}
	if len(s.csp) > 0 {
		return data, nil
	}
	meta := []byte(`<meta http-equiv="Content-Security-Policy" content="` + contentSecurityPolicy + `">`)
	loc := charsetTag.FindIndex(data)
	if loc == nil {
		loc = headTag.FindIndex(data)
	}
	if loc == nil {
		return nil, errors.New("no <head> to put the Content-Security-Policy in")
	}
	out := make([]byte, 0, len(data)+len(meta)+1)
	out = append(out, data[:loc[1]]...)
	out = append(out, '\n')
	out = append(out, meta...)
	return append(out, data[loc[1]:]...), nil
}

// checkIndexOutput checks the built index.html: a complete document with a
// Content-Security-Policy and still no inline script.
func checkIndexOutput(data []byte) error {
	s, err := scanPage(data)
	if err != nil {
		return err
	}
	if len(s.csp) == 0 {
		return errors.New("no Content-Security-Policy meta tag")
	}
	if len(s.inline) > 0 {
		return fmt.Errorf("inline script: %s", strings.Join(s.inline, "; "))
	}
	if !s.hasHTML || !s.hasHead || !s.hasBody {
		return errors.New("missing <html>, <head> or <body>")
	}
	if !s.endTags["html"] || !s.endTags["head"] || !s.endTags["body"] {
		return errors.New("missing </html>, </head> or </body>")
	}
	return nil
}

// normalizeCSP collapses white space and drops a trailing semicolon so that
// policies can be compared.
func normalizeCSP(p string) string {
	var parts []string
	for _, d := range strings.Split(p, ";") {
		if d = strings.Join(strings.Fields(d), " "); d != "" {
			parts = append(parts, d)
		}
	}
	return strings.Join(parts, "; ")
}
