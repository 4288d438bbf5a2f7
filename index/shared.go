package index

import (
	"fmt"
	"slices"

	"rebound/index/calendar"
)

// RegionalEvent is a run of days on which at least the stated share of the
// stations of a group with a record were in an event of one kind.
type RegionalEvent struct {
	ID         string // "<kind>-R-<start>", with the group after a slash when there are groups
	Group      string
	Kind       string
	Start, End calendar.Date
	// Stations is the number of stations whose events overlap it.
	Stations int
}

// markRegional finds the regional events of each group and sets Regional
// on every station event that overlaps one of its kind. byStation[i] are
// the events of station i and groups[i] its group ("" for one group). A
// station has a record from its first event's start to its last event's
// end: the events table says nothing of the days before or after.
func markRegional(byStation [][]*Event, groups []string, minShare float64) []RegionalEvent {
	var out []RegionalEvent
	members := map[string][]int{}
	var names []string
	for i, g := range groups {
		if _, ok := members[g]; !ok {
			names = append(names, g)
		}
		members[g] = append(members[g], i)
	}
	slices.Sort(names)
	for _, g := range names {
		out = append(out, regionalInGroup(byStation, members[g], g, minShare, len(names) > 1)...)
	}
	return out
}

func regionalInGroup(byStation [][]*Event, idx []int, group string, minShare float64, named bool) []RegionalEvent {
	first, last := calendar.Date(1<<30), calendar.Date(-1<<30)
	kinds := map[string]bool{}
	for _, i := range idx {
		for _, e := range byStation[i] {
			first, last = min(first, e.Start), max(last, e.End)
			kinds[e.Kind] = true
		}
	}
	if first > last {
		return nil
	}
	n := int(last-first) + 2
	record := make([]int, n)
	for _, i := range idx {
		evs := byStation[i]
		if len(evs) == 0 {
			continue
		}
		lo, hi := evs[0].Start, evs[0].End
		for _, e := range evs {
			lo, hi = min(lo, e.Start), max(hi, e.End)
		}
		record[lo-first]++
		record[hi-first+1]--
	}
	for d := 1; d < n; d++ {
		record[d] += record[d-1]
	}
	var out []RegionalEvent
	kindList := make([]string, 0, len(kinds))
	for k := range kinds {
		kindList = append(kindList, k)
	}
	slices.Sort(kindList)
	in := make([]int, n)
	for _, kind := range kindList {
		clear(in)
		for _, i := range idx {
			// Each station counts once per day, whatever the number of
			// its rows (one per variable) or overlapping events.
			var spans [][2]int
			for _, e := range byStation[i] {
				if e.Kind == kind {
					spans = append(spans, [2]int{int(e.Start - first), int(e.End - first)})
				}
			}
			slices.SortFunc(spans, func(a, b [2]int) int { return a[0] - b[0] })
			end := -1
			for _, s := range spans {
				lo := max(s[0], end+1)
				if lo <= s[1] {
					in[lo]++
					in[s[1]+1]--
					end = s[1]
				}
			}
		}
		for d := 1; d < n; d++ {
			in[d] += in[d-1]
		}
		var runs []RegionalEvent
		for d := 0; d < n-1; d++ {
			hit := in[d] > 0 && float64(in[d]) >= minShare*float64(record[d])
			switch {
			case hit && (len(runs) == 0 || runs[len(runs)-1].End != first+calendar.Date(d-1)):
				runs = append(runs, RegionalEvent{Group: group, Kind: kind, Start: first + calendar.Date(d), End: first + calendar.Date(d)})
			case hit:
				runs[len(runs)-1].End = first + calendar.Date(d)
			}
		}
		for k := range runs {
			r := &runs[k]
			r.ID = kind + "-R-" + r.Start.String()
			if named {
				r.ID += "/" + group
			}
			for _, i := range idx {
				hitStation := false
				for _, e := range byStation[i] {
					if e.Kind == kind && e.Start <= r.End && e.End >= r.Start {
						e.Regional = r.ID
						hitStation = true
					}
				}
				if hitStation {
					r.Stations++
				}
			}
		}
		out = append(out, runs...)
	}
	return out
}

// describeRegional says how many regional events there were, by kind.
func describeRegional(rs []RegionalEvent) string {
	by := map[string]int{}
	for _, r := range rs {
		by[r.Kind]++
	}
	keys := sortedKeys(by)
	s := ""
	for k, kind := range keys {
		if k > 0 {
			s += ", "
		}
		s += fmt.Sprintf("%d %s", by[kind], kind)
	}
	if s == "" {
		return "none"
	}
	return s
}
