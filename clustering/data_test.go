package clustering

import (
	"encoding/csv"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// readIris reads a testdata file in the layout of iris.csv and returns the
// four measurements and the species names.
func readIris(t testing.TB, name string) (*mat.Dense, []string) {
	t.Helper()
	recs := readCSV(t, name)
	x := mat.NewDense(len(recs), 4, nil)
	species := make([]string, len(recs))
	for i, r := range recs {
		for j := range 4 {
			v, err := strconv.ParseFloat(r[j+1], 64)
			if err != nil {
				t.Fatalf("%s:%d: %v", name, i+2, err)
			}
			x.Set(i, j, v)
		}
		species[i] = r[5]
	}
	return x, species
}

// readLabels reads the second column of a row,cluster testdata file.
func readLabels(t testing.TB, name string) []int {
	t.Helper()
	recs := readCSV(t, name)
	labels := make([]int, len(recs))
	for i, r := range recs {
		v, err := strconv.Atoi(r[1])
		if err != nil {
			t.Fatalf("%s:%d: %v", name, i+2, err)
		}
		labels[i] = v
	}
	return labels
}

// readCSV returns the records of a testdata CSV file without its header.
func readCSV(t testing.TB, name string) [][]string {
	t.Helper()
	f, err := os.Open(filepath.Join("testdata", name))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return recs[1:]
}

// codes turns category names into labels 0, 1, ... in order of first
// appearance.
func codes(names []string) []int {
	var seen []string
	out := make([]int, len(names))
	for i, s := range names {
		j := slices.Index(seen, s)
		if j < 0 {
			j = len(seen)
			seen = append(seen, s)
		}
		out[i] = j
	}
	return out
}

// groups returns a partition as a sorted list of sorted member lists, for
// comparison up to label permutation.
func groups(labels []int) [][]int {
	m := map[int][]int{}
	for i, l := range labels {
		m[l] = append(m[l], i)
	}
	var out [][]int
	for _, g := range m {
		out = append(out, g)
	}
	slices.SortFunc(out, func(a, b []int) int { return a[0] - b[0] })
	return out
}

// samePartition reports whether two labellings agree up to a renaming of
// the labels.
func samePartition(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	ab, ba := map[int]int{}, map[int]int{}
	for i := range a {
		if v, ok := ab[a[i]]; ok && v != b[i] {
			return false
		}
		if v, ok := ba[b[i]]; ok && v != a[i] {
			return false
		}
		ab[a[i]], ba[b[i]] = b[i], a[i]
	}
	return true
}
