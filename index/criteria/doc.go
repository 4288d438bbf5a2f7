// Package criteria compares a station's water temperature with numeric
// criteria set by the user.
//
// # Weekly statistic
//
// Temperature criteria for cold-water fish are commonly written against the
// 7DADM, the 7-day average of the daily maximum water temperature (US EPA
// Region 10, 2003, EPA 910-B-03-002). Here the 7-day value of a day is the
// mean of that day and the six days before it, and it is defined only when
// all seven days have a value (requiring complete windows is common
// practice). A station that records no daily maxima is measured by the 7-day
// mean of its daily means instead; Result.Basis says which statistic was
// used, because the two are not interchangeable: a 7-day mean of means runs
// below the 7DADM by about half the diel range.
//
// # Performance against a criterion
//
// Each day with a 7-day value is satisfactory (S) or a failure (F); failure
// means the value is strictly greater than the criterion. Per criterion the
// package reports the days above it and the reliability, resilience and
// vulnerability of Hashimoto, Stedinger & Loucks (1982), "Reliability,
// resiliency, and vulnerability criteria for water resource system
// performance evaluation", Water Resources Research 18(1):14–20:
//
//   - reliability = satisfactory days / days with a value;
//   - resilience = F→S transitions / failure days, the probability that a
//     failure day is followed by a satisfactory one;
//   - vulnerability = the mean, over failure events (maximal runs of failure
//     days), of each event's largest excess over the criterion (°C).
//
// Two further forms of vulnerability are reported under their own names:
// the mean excess per failure day and the largest excess. Missing days are
// neither S nor F: they are left out of every count, they end a failure
// event, and an F→S transition counts only between consecutive days.
//
// Criterion values belong to the user (local standards differ); there is
// no default criterion.
package criteria
