package workbook

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/xuri/excelize/v2"
)

func (w *writer) clusters() {
	const s = SheetClusters
	r, c := w.r, w.e.Clusters
	cols := []column{{"Station", 11, fmtText}, {"Name", 30, fmtText}, {"Cluster", 8, fmtInt}, {"Rank", 7, fmtInt}}
	for _, f := range c.Features {
		cols = append(cols, column{f, max(10, min(24, float64(len(f))*0.9)), fmtFeature})
	}
	cols = append(cols, column{"Left out because", 30, fmtText}, column{"Cluster label", 11, fmtText})
	// Rows by cluster, then station order, so each cluster is one block
	// for the scatter chart.
	idx := make([]int, len(c.Labels))
	for i := range idx {
		idx[i] = i
	}
	key := func(i int) int {
		if c.Labels[i] < 0 {
			return math.MaxInt
		}
		return c.Labels[i]
	}
	slices.SortStableFunc(idx, func(a, b int) int { return cmp.Compare(key(a), key(b)) })
	var rows [][]any
	fa, fb := c.Leading()
	w.scatter = nil
	for k, i := range idx {
		st := r.Attrs.Stations[i]
		row := []any{st.ID, st.Name, blank{}, r.Result.Rank[i]}
		if l := c.Labels[i]; l >= 0 {
			row[2] = l + 1
			if n := len(w.scatter); n == 0 || w.scatter[n-1].name != fmt.Sprintf("cluster %d", l+1) {
				w.scatter = append(w.scatter, scatterSeries{name: fmt.Sprintf("cluster %d", l+1), r0: k + 2})
			}
			w.scatter[len(w.scatter)-1].r1 = k + 2
		}
		for j := range c.Features {
			v := math.NaN()
			if c.Values[i] != nil {
				v = c.Values[i][j]
			}
			row = append(row, nanBlank(v))
		}
		label := ""
		if c.Labels[i] >= 0 {
			label = fmt.Sprintf("cluster %d", c.Labels[i]+1)
		}
		row = append(row, c.Reasons[i], label)
		rows = append(rows, row)
	}
	for q := range w.scatter {
		w.scatter[q].cx, w.scatter[q].cy, w.scatter[q].cn = 5+fa, 5+fb, len(cols)
		w.scatter[q].xLabel, w.scatter[q].yLabelXY = c.Features[fa], c.Features[min(fb, len(c.Features)-1)]
	}
	w.table(s, cols, rows)
}

func (w *writer) profiles() {
	const s = SheetProfiles
	c := w.e.Clusters
	cols := []column{{"Cluster", 8, fmtInt}, {"Stations", 9, fmtInt}, {"Description (standardised centroid in words)", 36, fmtText},
		{"Most typical station (medoid)", 14, fmtText}}
	for _, f := range c.Features {
		cols = append(cols, column{"Mean " + f, max(10, min(24, float64(len(f))*0.9)), fmt3})
	}
	var rows [][]any
	for k, p := range c.Profiles {
		medoid := ""
		if k < len(c.Medoids) {
			medoid = c.Medoids[k]
		}
		row := []any{k + 1, p.Size, p.Description, medoid}
		for j := range c.Features {
			row = append(row, nanBlank(p.Mean[j]))
		}
		rows = append(rows, row)
	}
	w.table(s, cols, rows)

	// Standardised centroids below.
	top := len(rows) + 4
	w.str(s, cell(1, top-1), "Cluster centroids in standard deviations from the mean of all clustered stations")
	w.style(s, cell(1, top-1), cell(1, top-1), w.bold)
	zc := []column{{"Cluster", 8, fmtInt}, {"Stations", 9, fmtInt}, {"Description", 36, fmtText}, {"", 14, fmtText}}
	for _, f := range c.Features {
		zc = append(zc, column{f + " (sd)", max(10, min(24, float64(len(f))*0.9)), fmt2})
	}
	var zrows [][]any
	for k, p := range c.Profiles {
		row := []any{k + 1, p.Size, p.Description, blank{}}
		for j := range c.Features {
			row = append(row, nanBlank(p.Centroid[j]))
		}
		zrows = append(zrows, row)
	}
	w.tableAt(s, top, zc, zrows, false)

	if len(c.Choice) > 0 {
		top += len(zrows) + 3
		w.str(s, cell(1, top-1), "Validity of each number of clusters tried")
		w.style(s, cell(1, top-1), cell(1, top-1), w.bold)
		kc := []column{{"k", 8, fmtInt}, {"Mean silhouette width (Rousseeuw 1987)", 12, fmt3}, {"Calinski–Harabasz", 14, fmt2},
			{"Davies–Bouldin", 14, fmt3}, {"Within-cluster sum of squares", 14, fmt2}}
		var krows [][]any
		for _, sc := range c.Choice {
			krows = append(krows, []any{sc.K, nanBlank(sc.Silhouette), nanBlank(sc.CalinskiHarabasz), nanBlank(sc.DaviesBouldin), nanBlank(sc.WithinSS)})
		}
		w.tableAt(s, top, kc, krows, false)
	}
	w.set(w.f.SetPanes(s, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}))
}

func (w *writer) sensitivity() {
	const s = SheetSensitivity
	sv := w.e.Sensitivity
	cols := []column{{"Indicator", 20, fmtText}, {"Weight used", 10, fmtWeight},
		{fmt.Sprintf("Largest rank change, weight lowered %g %% (ranks)", 100*sv.Step), 16, fmtInt},
		{fmt.Sprintf("Largest rank change, weight raised %g %% (ranks)", 100*sv.Step), 16, fmtInt},
		{"Mean rank change, lowered (ranks)", 13, fmt2}, {"Mean rank change, raised (ranks)", 13, fmt2},
		{"Lowered, drawn leftwards (−ranks)", 13, fmtInt}}
	var rows [][]any
	for _, sw := range sv.Swings { // the largest swing first, as everywhere
		wj := math.NaN()
		for k, ind := range w.r.Raw.Indicators {
			if ind.Name == sw.Indicator {
				wj = w.r.Weights.W[k]
			}
		}
		rows = append(rows, []any{sw.Indicator, nanBlank(wj), nanBlank(sw.Down), nanBlank(sw.Up), nanBlank(sw.MeanDown), nanBlank(sw.MeanUp), nanBlank(-sw.Down)})
	}
	w.table(s, cols, rows)
	w.tornadoRows = len(rows)

	row := len(rows) + 3
	if len(sv.Sobol) > 0 {
		w.str(s, cell(1, row), "Sobol indices of the mean absolute rank shift with respect to each weight (bootstrap intervals)")
		w.style(s, cell(1, row), cell(1, row), w.bold)
		row++
		sc := []column{{"Indicator", 20, fmtText}, {"First-order index", 10, fmt3}, {"First-order, lower", 13, fmt3}, {"First-order, upper", 13, fmt3},
			{"Total index", 13, fmt3}, {"Total, lower", 13, fmt3}, {"Total, upper", 13, fmt3}}
		var srows [][]any
		for _, x := range sv.Sobol {
			srows = append(srows, []any{x.Indicator, nanBlank(x.First), nanBlank(x.FirstLo), nanBlank(x.FirstHi), nanBlank(x.Total), nanBlank(x.TotalLo), nanBlank(x.TotalHi)})
		}
		w.tableAt(s, row, sc, srows, false)
		row += len(srows) + 2
	}
	w.intervalTop = row
	ic := []column{{"Station", 20, fmtText}, {"Rank", 10, fmtInt}, {"Best rank, " + sv.Interval, 16, fmtInt},
		{"Worst rank, " + sv.Interval, 16, fmtInt}, {"Chart: bar start (best rank − 0.5)", 13, fmt2}, {"Chart: bar length (ranks)", 13, fmtInt},
		{"Stability", 16, fmtText}}
	var irows [][]any
	for _, i := range w.r.Result.Order {
		if sv.Low[i] <= 0 {
			continue
		}
		irows = append(irows, []any{w.r.Raw.Stations[i], w.r.Result.Rank[i], sv.Low[i], sv.High[i],
			float64(sv.Low[i]) - 0.5, sv.High[i] - sv.Low[i] + 1, sv.Stability[i]})
	}
	w.tableAt(s, row, ic, irows, false)
	w.intervalRows = len(irows)
	row += len(irows) + 2
	w.str(s, cell(1, row), "Monte Carlo over the weights")
	w.style(s, cell(1, row), cell(1, row), w.bold)
	counts := map[string]int{}
	for _, st := range sv.Stability {
		counts[st]++
	}
	var parts []string
	for _, k := range []string{"robust-top", "robust-bottom", "stable", "weight-dependent", "unranked"} {
		if counts[k] > 0 {
			parts = append(parts, fmt.Sprintf("%s %d", k, counts[k]))
		}
	}
	for _, line := range []string{
		fmt.Sprintf("%d weight vectors drawn; each station's rank interval (%s) is on the Ranking sheet.", sv.Samples, sv.Interval),
		fmt.Sprintf("Mean Spearman correlation of the sampled rankings with the base ranking: %.3f.", sv.Spearman),
		fmt.Sprintf("Stations by stability (top and bottom bands of %d): %s.", sv.TopN, strings.Join(parts, ", ")),
	} {
		row++
		w.str(s, cell(1, row), line)
	}
}

// charts adds the native charts, after every data sheet is written.
func (w *writer) charts() {
	if w.err != nil {
		return
	}
	w.rankingChart()
	if w.e.Sensitivity != nil && w.tornadoRows > 0 {
		w.tornadoChart()
	}
	if w.e.Clusters != nil && len(w.scatter) > 0 && len(w.e.Clusters.Features) >= 2 {
		w.scatterChart()
	}
}

func title(t string) excelize.ChartTitle {
	return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: t, Font: &excelize.Font{Bold: true, Size: 12}}}}
}

func axisTitle(t string) excelize.ChartTitle {
	return excelize.ChartTitle{Paragraph: []excelize.RichTextRun{{Text: t, Font: &excelize.Font{Size: 9}}}}
}

func (w *writer) rankingChart() {
	const s = SheetRanking
	n := len(w.r.Result.Order)
	if n == 0 {
		return
	}
	last := n + 1
	st, sc := w.rankCol["station"], w.rankCol["score"]
	height := uint(max(320, 16*n+150))
	solid := func(c string) excelize.Fill { return excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{c}} }
	gap := uint(40)
	w.set(w.f.AddChart(s, cell(w.rankCol["ncols"]+2, 2), &excelize.Chart{
		Type: excelize.Bar,
		Series: []excelize.ChartSeries{{
			Name: fmt.Sprintf("'%s'!$%s$1", s, colName(sc)), Categories: ref(s, st, 2, st, last), Values: ref(s, sc, 2, sc, last),
			Fill: solid(seriesColours[0]),
		}},
		Title:     title("Score by station (rank 1 at the top)"),
		Legend:    excelize.ChartLegend{Position: "none"},
		Dimension: excelize.ChartDimension{Width: 520, Height: height},
		XAxis:     excelize.ChartAxis{ReverseOrder: true, Font: excelize.Font{Size: 8, Color: "#333333"}},
		YAxis:     excelize.ChartAxis{Title: axisTitle("score (0–100, higher = more resilient)"), Minimum: ptr(0.0), Maximum: ptr(100.0), MajorGridLines: true, MajorUnit: 20},
		GapWidth:  &gap,
	}))
	sv := w.e.Sensitivity
	if sv == nil || w.intervalRows == 0 {
		return
	}
	// The rank interval as floating bars: an unfilled bar up to the best
	// rank, then a filled one across the interval (Sensitivity sheet).
	const d = SheetSensitivity
	r0, r1 := w.intervalTop+1, w.intervalTop+w.intervalRows
	overlap := 100
	w.set(w.f.AddChart(s, cell(w.rankCol["ncols"]+11, 2), &excelize.Chart{
		Type: excelize.BarStacked,
		Series: []excelize.ChartSeries{
			{Name: fmt.Sprintf("'%s'!$E$%d", d, w.intervalTop), Categories: ref(d, 1, r0, 1, r1), Values: ref(d, 5, r0, 5, r1),
				Fill: excelize.Fill{Type: "pattern", Pattern: 0}},
			{Name: fmt.Sprintf("'%s'!$F$%d", d, w.intervalTop), Categories: ref(d, 1, r0, 1, r1), Values: ref(d, 6, r0, 6, r1),
				Fill: solid(seriesColours[2])},
		},
		Title:     title("Rank interval under varied weights (" + sv.Interval + ")"),
		Legend:    excelize.ChartLegend{Position: "none"},
		Dimension: excelize.ChartDimension{Width: 520, Height: height},
		XAxis:     excelize.ChartAxis{ReverseOrder: true, Font: excelize.Font{Size: 8, Color: "#333333"}},
		YAxis:     excelize.ChartAxis{Title: axisTitle("rank (1 = most resilient)"), Minimum: ptr(0.0), Maximum: ptr(float64(n) + 0.5), MajorGridLines: true},
		Overlap:   &overlap,
		GapWidth:  &gap,
	}))
}

func ptr[T any](v T) *T { return &v }

func (w *writer) tornadoChart() {
	const s = SheetSensitivity
	n := w.tornadoRows
	sv := w.e.Sensitivity
	overlap := 100
	gap := uint(40)
	w.set(w.f.AddChart(s, cell(9, 2), &excelize.Chart{
		Type: excelize.Bar,
		Series: []excelize.ChartSeries{
			{Name: fmt.Sprintf("'%s'!$G$1", s), Categories: ref(s, 1, 2, 1, n+1), Values: ref(s, 7, 2, 7, n+1),
				Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{seriesColours[2]}}},
			{Name: fmt.Sprintf("'%s'!$D$1", s), Categories: ref(s, 1, 2, 1, n+1), Values: ref(s, 4, 2, 4, n+1),
				Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{seriesColours[0]}}},
		},
		Title:     title(fmt.Sprintf("Largest rank change when one weight moves ±%g %%", 100*sv.Step)),
		Legend:    excelize.ChartLegend{Position: "bottom"},
		Dimension: excelize.ChartDimension{Width: 640, Height: uint(max(300, 40*n+140))},
		XAxis:     excelize.ChartAxis{ReverseOrder: true, TickLabelPosition: excelize.ChartTickLabelLow, Font: excelize.Font{Size: 9, Color: "#333333"}},
		YAxis:     excelize.ChartAxis{Title: axisTitle("rank change (ranks): weight lowered to the left, raised to the right"), MajorGridLines: true, NumFmt: excelize.ChartNumFmt{CustomNumFmt: "0;0"}},
		Overlap:   &overlap,
		GapWidth:  &gap,
	}))
}

func (w *writer) scatterChart() {
	const s = SheetClusters
	var series []excelize.ChartSeries
	symbols := []string{"circle", "square", "triangle", "diamond", "x", "star"}
	for q, sc := range w.scatter {
		series = append(series, excelize.ChartSeries{
			Name:       fmt.Sprintf("'%s'!$%s$%d", s, colName(sc.cn), sc.r0),
			Categories: ref(s, sc.cx, sc.r0, sc.cx, sc.r1),
			Values:     ref(s, sc.cy, sc.r0, sc.cy, sc.r1),
			Marker: excelize.ChartMarker{Symbol: symbols[q%len(symbols)], Size: 7,
				Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{seriesColours[q%len(seriesColours)]}}},
			Line: excelize.LineOptions{Width: 0.25, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"#FFFFFF"}}},
		})
	}
	first := w.scatter[0]
	w.set(w.f.AddChart(s, cell(len(w.e.Clusters.Features)+7, 2), &excelize.Chart{
		Type:      excelize.Scatter,
		Series:    series,
		Title:     title("Stations by the two features that separate the clusters most"),
		Legend:    excelize.ChartLegend{Position: "bottom"},
		Dimension: excelize.ChartDimension{Width: 620, Height: 440},
		XAxis:     excelize.ChartAxis{Title: axisTitle(first.xLabel), MajorGridLines: true},
		YAxis:     excelize.ChartAxis{Title: axisTitle(first.yLabelXY), MajorGridLines: true},
	}))
}
