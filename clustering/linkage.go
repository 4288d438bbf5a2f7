package clustering

import "fmt"

// Linkage says how the distance between two clusters follows from the
// distances between their members. The zero value is Ward.
type Linkage int

const (
	// Ward merges the pair of clusters whose union adds least to the
	// within-cluster sum of squares (Ward 1963). Heights are reported as
	// scipy.cluster.hierarchy.ward and R's hclust "ward.D2" report them:
	// sqrt(2·ΔESS), which for two single items is their Euclidean distance.
	Ward Linkage = iota
	// Single uses the distance between the closest members.
	Single
	// Complete uses the distance between the farthest members.
	Complete
	// Average uses the mean distance over all pairs of members (UPGMA).
	Average
)

var linkageNames = [...]string{Ward: "ward", Single: "single", Complete: "complete", Average: "average"}

// String returns the lower-case name of l: "ward", "single", "complete" or
// "average".
func (l Linkage) String() string {
	if l < 0 || int(l) >= len(linkageNames) {
		return fmt.Sprintf("Linkage(%d)", int(l))
	}
	return linkageNames[l]
}

// ParseLinkage returns the Linkage named s, one of the names String
// returns.
func ParseLinkage(s string) (Linkage, error) {
	for l, name := range linkageNames {
		if s == name {
			return Linkage(l), nil
		}
	}
	return 0, fmt.Errorf("clustering: linkage %q: want ward, single, complete or average", s)
}

// MarshalText returns the name of l.
func (l Linkage) MarshalText() ([]byte, error) {
	if l < 0 || int(l) >= len(linkageNames) {
		return nil, fmt.Errorf("clustering: unknown linkage %d", int(l))
	}
	return []byte(l.String()), nil
}

// UnmarshalText sets l from its name, as ParseLinkage does.
func (l *Linkage) UnmarshalText(b []byte) error {
	v, err := ParseLinkage(string(b))
	if err != nil {
		return err
	}
	*l = v
	return nil
}
