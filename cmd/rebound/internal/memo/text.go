package memo

import (
	"fmt"
	"maps"
	"path/filepath"
	"slices"
	"strings"
	"unicode"
	"unicode/utf8"

	"rebound/cmd/rebound/internal/pipeline"
	"rebound/config"
)

// esc escapes Markdown markup in text that comes from the user or the data,
// so that it prints as written.
func esc(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch r {
		case '\\', '`', '*', '_', '{', '}', '[', ']', '<', '>', '#', '|', '!', '$':
			b.WriteByte('\\')
		case '\n', '\r':
			r = ' '
		}
		b.WriteRune(r)
	}
	return b.String()
}

// code formats s as inline code, with a fence longer than any run of
// backticks in s.
func code(s string) string {
	fence := "`"
	for strings.Contains(s, fence) {
		fence += "`"
	}
	if strings.HasPrefix(s, "`") || strings.HasSuffix(s, "`") {
		return fence + " " + s + " " + fence
	}
	return fence + s + fence
}

func base(path string) string { return filepath.Base(path) }

func plural(n int, word string) string {
	if n == 1 {
		return word
	}
	switch {
	case strings.HasSuffix(word, "y") && !strings.HasSuffix(word, "ay"):
		return word[:len(word)-1] + "ies"
	}
	return word + "s"
}

func count(n int, word string) string { return fmt.Sprintf("%d %s", n, plural(n, word)) }

// countHave is "1 station has" or "3 stations have".
func countHave(n int, word string) string {
	if n == 1 {
		return count(n, word) + " has"
	}
	return count(n, word) + " have"
}

func joinAnd(xs []string) string {
	switch len(xs) {
	case 0:
		return ""
	case 1:
		return xs[0]
	case 2:
		return xs[0] + " and " + xs[1]
	}
	return strings.Join(xs[:len(xs)-1], ", ") + " and " + xs[len(xs)-1]
}

// listIDs lists station identifiers, escaped.
func listIDs(ids []string) string {
	out := make([]string, len(ids))
	for i, id := range ids {
		out[i] = esc(id)
	}
	return joinAnd(out)
}

// lowerFirst lowers the first letter of a label for use inside a
// sentence, unless the second is upper case too (an abbreviation).
func lowerFirst(s string) string {
	if s == "" {
		return ""
	}
	r, n := utf8.DecodeRuneInString(s)
	if r2, _ := utf8.DecodeRuneInString(s[n:]); unicode.IsUpper(r2) {
		return s
	}
	return string(unicode.ToLower(r)) + s[n:]
}

func kindWord(k string) string {
	switch k {
	case "heatwave":
		return "heat wave"
	}
	return strings.ReplaceAll(k, "_", " ")
}

func kindWords(kinds []string) []string {
	out := make([]string, len(kinds))
	for i, k := range kinds {
		out[i] = plural(2, kindWord(k))
	}
	return out
}

// eventKinds lists the kinds of event in the run, sorted.
func eventKinds(r *pipeline.Run) []string {
	if r.Events == nil {
		return nil
	}
	seen := map[string]bool{}
	for _, e := range r.Events.Events {
		seen[e.Kind] = true
	}
	return slices.Sorted(maps.Keys(seen))
}

func normWords(cfg *config.Config) string {
	methods := map[config.NormMethod]bool{}
	for j := range cfg.Indicators {
		methods[cfg.NormMethod(j)] = true
	}
	var names []string
	for _, m := range config.NormMethods {
		if methods[m] {
			names = append(names, map[config.NormMethod]string{config.MinMax: "min–max", config.ZScore: "z-scores",
				config.Rank: "ranks", config.TargetN: "distance from a target"}[m])
		}
	}
	return joinAnd(names)
}

func scopeWords(s config.Scope) string {
	switch s {
	case config.ScopeGroup:
		return "each peer group separately"
	case config.ScopeCluster:
		return "each cluster separately"
	}
	return "all stations together"
}

func weightWords(r *pipeline.Run) string {
	switch r.Weights.Method {
	case config.Equal:
		return "equally"
	case config.AHPW:
		return fmt.Sprintf("by pairwise comparisons, AHP, consistency ratio %s", num(r.Weights.AHP.CR))
	}
	return "as configured"
}

func aggWords(cfg *config.Config) string {
	if cfg.Aggregation.Method == config.Geometric {
		return "a weighted geometric mean (so a poor value is not fully offset by good ones)"
	}
	return "a weighted mean"
}

// flagWords explains the flags that occur.
func flagWords(flags [][]string) string {
	seen := map[string]bool{}
	for _, fl := range flags {
		for _, f := range fl {
			kind, _, _ := strings.Cut(f, ":")
			seen[kind] = true
		}
	}
	meaning := map[string]string{
		"missing":    "`missing:` the indicator has no value there and was left out",
		"imputed":    "`imputed:` the indicator was filled with its group median",
		"km_rmst":    "`km_rmst:` the recovery time is a restricted mean because too few events recovered for a median",
		"few_events": "`few_events` fewer events than the configured minimum",
		"no_score":   "`no_score` no indicator has a value",
	}
	var parts []string
	for _, k := range slices.Sorted(maps.Keys(seen)) {
		if s, ok := meaning[k]; ok {
			parts = append(parts, s)
		} else {
			parts = append(parts, code(k))
		}
	}
	return strings.Join(parts, "; ")
}

func nz(x float64) float64 {
	if x != x {
		return 0
	}
	return x
}
