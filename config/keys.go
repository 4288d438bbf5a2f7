package config

import (
	"fmt"
	"reflect"
	"regexp"
	"slices"
	"strings"
)

var (
	tableRE  = regexp.MustCompile(`^\s*\[\s*([^\[\]]+?)\s*\]\s*(#.*)?$`)
	arrayRE  = regexp.MustCompile(`^\s*\[\[\s*([^\[\]]+?)\s*\]\]\s*(#.*)?$`)
	assignRE = regexp.MustCompile(`^\s*([A-Za-z0-9_\-."' ]+?)\s*=`)
)

// keyLines maps each key path in a TOML text to the line where it is set,
// with array-of-table elements numbered from 1 ("indicator[2].weight"). It
// is a light scan for error messages, not a parser: the decoder has already
// accepted the text.
func keyLines(text string) map[string]Pos {
	lines := map[string]Pos{}
	counts := map[string]int{}
	prefix := ""
	inMulti := "" // closing delimiter of a multi-line string, if inside one
	depth := 0    // bracket depth of a multi-line array value
	for n, line := range strings.Split(text, "\n") {
		ln := n + 1
		if inMulti != "" {
			if strings.Contains(line, inMulti) {
				inMulti = ""
			}
			continue
		}
		if depth > 0 {
			depth += bracketDelta(line)
			continue
		}
		if m := arrayRE.FindStringSubmatch(line); m != nil {
			name := unquoteKey(m[1])
			counts[name]++
			prefix = fmt.Sprintf("%s[%d]", name, counts[name])
			lines[prefix] = Pos{ln, 1}
			continue
		}
		if m := tableRE.FindStringSubmatch(line); m != nil {
			prefix = unquoteKey(m[1])
			lines[prefix] = Pos{ln, 1}
			continue
		}
		if m := assignRE.FindStringSubmatch(line); m != nil {
			key := unquoteKey(m[1])
			if prefix != "" {
				key = prefix + "." + key
			}
			rest := line[len(m[0]):]
			col := len(m[0]) + len(rest) - len(strings.TrimLeft(rest, " \t")) + 1
			if _, dup := lines[key]; !dup {
				lines[key] = Pos{ln, col}
			}
			for _, q := range []string{`"""`, `'''`} {
				if strings.Count(rest, q) == 1 {
					inMulti = q
				}
			}
			depth = bracketDelta(rest)
		}
	}
	return lines
}

// bracketDelta counts '[' minus ']' outside strings and comments.
func bracketDelta(s string) int {
	d := 0
	var quote byte
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case quote != 0:
			if c == '\\' && quote == '"' {
				i++
			} else if c == quote {
				quote = 0
			}
		case c == '"' || c == '\'':
			quote = c
		case c == '#':
			return d
		case c == '[':
			d++
		case c == ']':
			d--
		}
	}
	return max(d, 0)
}

func unquoteKey(k string) string {
	parts := strings.Split(k, ".")
	for i, p := range parts {
		parts[i] = strings.Trim(strings.TrimSpace(p), `"'`)
	}
	return strings.Join(parts, ".")
}

var indexRE = regexp.MustCompile(`\[\d+\]`)

// findLines returns, in line order, the positions of every key whose path,
// with array indices removed, equals path: a key repeated in several
// array-of-table elements has one position per element.
func findLines(lines map[string]Pos, path []string) []Pos {
	want := strings.Join(path, ".")
	var out []Pos
	for k, p := range lines {
		if indexRE.ReplaceAllString(k, "") == want {
			out = append(out, p)
		}
	}
	slices.SortFunc(out, func(a, b Pos) int { return a.Line - b.Line })
	return out
}

// findLine returns the first position of path (see findLines).
func findLine(lines map[string]Pos, path []string) Pos {
	if ps := findLines(lines, path); len(ps) > 0 {
		return ps[0]
	}
	return Pos{}
}

// Pos is a 1-based line and column in a configuration file.
type Pos struct{ Line, Col int }

// validKeys lists the keys allowed inside the table at path, from the toml
// struct tags of t.
func validKeys(t reflect.Type, path []string) []string {
	for _, p := range path {
		t = deref(t)
		if t.Kind() != reflect.Struct {
			return nil
		}
		f, ok := fieldByTag(t, p)
		if !ok {
			return nil
		}
		t = f.Type
	}
	t = deref(t)
	if t.Kind() != reflect.Struct {
		return nil
	}
	var keys []string
	for i := range t.NumField() {
		tag := strings.Split(t.Field(i).Tag.Get("toml"), ",")[0]
		if tag != "" && tag != "-" {
			keys = append(keys, tag)
		}
	}
	slices.Sort(keys)
	return keys
}

func deref(t reflect.Type) reflect.Type {
	for t.Kind() == reflect.Pointer || t.Kind() == reflect.Slice {
		t = t.Elem()
	}
	return t
}

func fieldByTag(t reflect.Type, tag string) (reflect.StructField, bool) {
	for i := range t.NumField() {
		if strings.Split(t.Field(i).Tag.Get("toml"), ",")[0] == tag {
			return t.Field(i), true
		}
	}
	return reflect.StructField{}, false
}

// closest returns the candidate nearest to s by edit distance, or "" when
// none is near enough to be a plausible typo.
func closest(s string, candidates []string) string {
	best, bestD := "", -1
	for _, c := range candidates {
		d := editDistance(strings.ToLower(s), strings.ToLower(c))
		if bestD < 0 || d < bestD {
			best, bestD = c, d
		}
	}
	limit := max(2, len(s)/3)
	if bestD < 0 || bestD > limit {
		return ""
	}
	return best
}

// editDistance is the Levenshtein distance between a and b, counted in
// bytes.
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
