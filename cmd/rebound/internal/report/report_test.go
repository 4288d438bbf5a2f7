package report

import (
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestNumAndRound(t *testing.T) {
	tests := []struct {
		x     float64
		num   string
		round string // 2 decimals
	}{
		{0.5700000000000001, "0.57", "0.57"},
		{23.204419889502763, "23.2044198895", "23.20"},
		{math.NaN(), "", ""},
		{-0.001, "-0.001", "0.00"}, // no "-0.00"
		{1e-7, "1e-07", "0.00"},
		{100, "100", "100.00"},
	}
	for _, tc := range tests {
		if got := Num(tc.x); got != tc.num {
			t.Errorf("Num(%v) = %q, want %q", tc.x, got, tc.num)
		}
		if got := Round(tc.x, 2); got != tc.round {
			t.Errorf("Round(%v, 2) = %q, want %q", tc.x, got, tc.round)
		}
	}
}

func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "sub", "out.csv")
	write := func(s string) error {
		return WriteFile(path, func(w io.Writer) error { _, err := io.WriteString(w, s); return err })
	}
	if err := write("first\n"); err != nil {
		t.Fatal(err)
	}
	// A failing writer leaves the earlier file as it was and no temporary
	// file behind.
	err := WriteFile(path, func(w io.Writer) error {
		io.WriteString(w, "half a fi")
		return errors.New("disk on fire")
	})
	if err == nil {
		t.Fatal("want the writer's error")
	}
	if b, _ := os.ReadFile(path); string(b) != "first\n" {
		t.Errorf("file after a failed write: %q", b)
	}
	entries, _ := os.ReadDir(filepath.Dir(path))
	if len(entries) != 1 {
		t.Errorf("left behind: %v", entries)
	}
	if err := write("second\n"); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(path); string(b) != "second\n" {
		t.Errorf("replaced file: %q", b)
	}
}

// WriteFiles replaces a whole set or none of it: when one file cannot be
// written (here its folder is a file), the others keep their old content
// and no temporary file is left.
func TestWriteFilesAllOrNone(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a.csv"), filepath.Join(dir, "figures", "b.png")
	if err := WriteFiles([]File{{a, []byte("old a")}, {b, []byte("old b")}}); err != nil {
		t.Fatal(err)
	}
	blocked := filepath.Join(dir, "blocked")
	os.WriteFile(blocked, nil, 0o644)
	err := WriteFiles([]File{{a, []byte("new a")}, {b, []byte("new b")}, {filepath.Join(blocked, "c.csv"), []byte("c")}})
	if err == nil {
		t.Fatal("want an error for a path under a file")
	}
	for path, want := range map[string]string{a: "old a", b: "old b"} {
		if got, _ := os.ReadFile(path); string(got) != want {
			t.Errorf("%s: %q after a failed set, want %q", path, got, want)
		}
	}
	for _, d := range []string{dir, filepath.Dir(b)} {
		entries, _ := os.ReadDir(d)
		for _, e := range entries {
			if strings.HasPrefix(e.Name(), ".") {
				t.Errorf("temporary file left behind: %s", e.Name())
			}
		}
	}
	if err := WriteFiles([]File{{a, []byte("new a")}, {b, []byte("new b")}}); err != nil {
		t.Fatal(err)
	}
	if got, _ := os.ReadFile(b); string(got) != "new b" {
		t.Errorf("%s: %q", b, got)
	}
}
