package report

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"

	"rebound/cmd/rebound/internal/pipeline"
)

// PrintRanking prints the ranking table: the top and bottom n stations, or
// every station when all is set (or the list is short). When the
// sensitivity analysis ran, each station's rank interval follows its rank.
func PrintRanking(w io.Writer, r *pipeline.Run, n int, all bool) {
	res := r.Result
	total := len(res.Order)
	title := r.Config.Title
	if title == "" {
		title = "Resilience ranking"
	}
	fmt.Fprintf(w, "%s: %s, score 0-100 (higher = more resilient), rank 1 = most resilient\n\n", title, plural(total, "station"))
	nameW := 4
	for _, s := range r.Attrs.Stations {
		nameW = max(nameW, min(utf8.RuneCountInString(s.Name), 36))
	}
	idW := 7
	for _, s := range r.Attrs.Stations {
		idW = max(idW, utf8.RuneCountInString(s.ID))
	}
	cl, clHead := "", ""
	if r.Clusters != nil {
		clHead = "cluster  "
	}
	iv := rankInterval{r}
	fmt.Fprintf(w, "%4s  %s%-*s  %-*s  %6s  %6s  %s%s\n", "rank", iv.header(), idW, "station", nameW, "name", "score", "events", clHead, "flags")
	row := func(i int) {
		s := r.Attrs.Stations[i]
		score := Round(res.Score[i], 1)
		if score == "" {
			score = "-"
		}
		if r.Clusters != nil {
			cl = fmt.Sprintf("%7s  ", clusterCell(r.Clusters, s.ID))
		}
		fmt.Fprintf(w, "%4d  %s%-*s  %-*s  %6s  %6d  %s%s\n", res.Rank[i], iv.cell(i), idW, s.ID, nameW, clip(s.Name, 36), score, r.Raw.Events[i], cl, strings.Join(res.Flags[i], " "))
	}
	if all || total <= 2*n {
		for _, i := range res.Order {
			row(i)
		}
	} else {
		for _, i := range res.Order[:n] {
			row(i)
		}
		fmt.Fprintf(w, "%4s  (%s not shown; -all shows every station)\n", "...", plural(total-2*n, "station"))
		for _, i := range res.Order[total-n:] {
			row(i)
		}
	}
	if note := iv.note(); note != "" {
		fmt.Fprintf(w, "\n%s", note)
	}
	fmt.Fprintf(w, "\n%s\n", Caution)
}

func clip(s string, n int) string {
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	r := []rune(s)
	return string(r[:n-1]) + "…"
}
