package calendar

import (
	"testing"
	"time"
)

// The reference for every conversion is the standard library's proleptic
// Gregorian calendar (time.Date in UTC).
func TestAgainstTimePackage(t *testing.T) {
	epoch := time.Date(1970, 1, 1, 0, 0, 0, 0, time.UTC)
	for day := -800000; day <= 800000; day += 37 {
		tm := epoch.AddDate(0, 0, day)
		d := Date(day)
		y, m, dd := d.Civil()
		if y != tm.Year() || m != int(tm.Month()) || dd != tm.Day() {
			t.Fatalf("day %d: Civil = %d-%d-%d, time = %v", day, y, m, dd, tm)
		}
		if New(y, m, dd) != d {
			t.Fatalf("New(%d,%d,%d) = %d, want %d", y, m, dd, New(y, m, dd), d)
		}
		if got := d.DayOfYear(); got != tm.YearDay() {
			t.Fatalf("%v: DayOfYear = %d, want %d", tm, got, tm.YearDay())
		}
		if y >= 0 && y <= 9999 {
			if got, want := d.String(), tm.Format("2006-01-02"); got != want {
				t.Fatalf("String = %q, want %q", got, want)
			}
			p, err := Parse(d.String())
			if err != nil || p != d {
				t.Fatalf("Parse(%q) = %d, %v", d.String(), p, err)
			}
		}
	}
}

func TestParse(t *testing.T) {
	tests := []struct {
		in   string
		want string
		err  error
	}{
		{"2024-02-29", "2024-02-29", nil},
		{"2000-02-29", "2000-02-29", nil}, // divisible by 400: leap (common practice)
		{"1900-02-29", "", ErrRange},      // divisible by 100, not 400: common year
		{"2023-02-29", "", ErrRange},
		{"2023-13-01", "", ErrRange},
		{"2023-04-31", "", ErrRange},
		{"2023-4-1", "", ErrSyntax},
		{"2023/04/01", "", ErrSyntax},
		{"2023-04-01T00:00", "", ErrSyntax},
		{"", "", ErrSyntax},
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			d, err := Parse(tc.in)
			if err != tc.err {
				t.Fatalf("err = %v, want %v", err, tc.err)
			}
			if err == nil && d.String() != tc.want {
				t.Fatalf("got %s, want %s", d, tc.want)
			}
		})
	}
}

func TestDayOf366AndWaterYear(t *testing.T) {
	tests := []struct {
		date      string
		doy366    int
		waterYear int
	}{
		{"2023-01-01", 1, 2023},
		{"2023-02-28", 59, 2023},
		{"2023-03-01", 61, 2023}, // 1 March is day 61 in the 366-day year
		{"2024-02-29", 60, 2024},
		{"2024-03-01", 61, 2024},
		{"2023-09-30", 274, 2023},
		{"2023-10-01", 275, 2024}, // water year starts 1 October
		{"2023-12-31", 366, 2024},
		{"2024-12-31", 366, 2025},
	}
	for _, tc := range tests {
		d, err := Parse(tc.date)
		if err != nil {
			t.Fatal(err)
		}
		if got := d.DayOf366(); got != tc.doy366 {
			t.Errorf("%s: DayOf366 = %d, want %d", tc.date, got, tc.doy366)
		}
		if got := d.WaterYear(); got != tc.waterYear {
			t.Errorf("%s: WaterYear = %d, want %d", tc.date, got, tc.waterYear)
		}
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"2024-02-29", "1999-12-31", "0000-01-01", "9999-12-31", "2023-02-30"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		d, err := Parse(s)
		if err != nil {
			return
		}
		if d.String() != s {
			t.Fatalf("Parse(%q).String() = %q", s, d.String())
		}
	})
}

func BenchmarkParseBytes(b *testing.B) {
	in := []byte("2019-07-23")
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ParseBytes(in); err != nil {
			b.Fatal(err)
		}
	}
}
