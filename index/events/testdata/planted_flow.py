"""Invented daily discharge with planted low- and high-flow events, and the antecedent
dryness of a few dates computed independently with numpy, for events_test.go.

Baseline 11, 9, 11, 9, ... m3/s (11 on even day indices) from 2009-01-01 to 2016-12-31.
Planted lows (drought): 2010-08-01..20 at 5; 2012-07-01..06 and 2012-07-11..16 at 6 (gap of
4 days, pooled); 2013-09-10..12 at 4 (3 days, too short); 2016-02-27..03-04 at 7 (over
29 February). Planted highs (flood): 2011-04-10 at 60, 04-11 at 40, 04-13 at 50 (peaks
3 days apart: one event); 2014-05-01 at 13 and 2014-05-11 at 14 with 10.5 between (trough
above 75% of the smaller peak: one event); 2015-06-01 at 30 and 2015-06-15 at 25 (two events).
Drought: q < Q80 (20th percentile, np.percentile linear, whole record), pooling t_c = 5 days,
then events shorter than 5 days removed. Antecedent window: the 365 days before the date.
Fraction = drought days in the window / 365. Index: D = sum of max(0, thr - q) over the
window (no day is missing), z-scored with the mean and sample sd (ddof=1) of D over every
365-day window of the record (windows ending on each day from day 365 to the last).
Run: /usr/bin/python3 planted_flow.py   (numpy 1.24.2)
"""
import numpy as np
from datetime import date, timedelta

d0 = date(2009, 1, 1)
n = (date(2017, 1, 1) - d0).days
q = np.where(np.arange(n) % 2 == 0, 11.0, 9.0)

def idx(s):
    return (date.fromisoformat(s) - d0).days

def put(a, b, v):
    q[idx(a):idx(b) + 1] = v

put("2010-08-01", "2010-08-20", 5)
put("2012-07-01", "2012-07-06", 6)
put("2012-07-11", "2012-07-16", 6)
put("2013-09-10", "2013-09-12", 4)
put("2016-02-27", "2016-03-04", 7)
put("2011-04-10", "2011-04-10", 60)
put("2011-04-11", "2011-04-11", 40)
put("2011-04-13", "2011-04-13", 50)
put("2014-05-01", "2014-05-01", 13)
put("2014-05-02", "2014-05-10", 10.5)
put("2014-05-11", "2014-05-11", 14)
put("2015-06-01", "2015-06-01", 30)
put("2015-06-15", "2015-06-15", 25)

with open("planted_flow.csv", "w") as f:
    f.write("date,discharge\n")
    for i in range(n):
        f.write(f"{d0 + timedelta(days=i)},{q[i]:g}\n")

thr = np.percentile(q, 20)
print("Q80 =", thr, " Q5 =", np.percentile(q, 95))
below = q < thr
runs, i = [], 0
while i < n:
    if below[i]:
        j = i
        while j + 1 < n and below[j + 1]:
            j += 1
        runs.append([i, j]); i = j + 1
    else:
        i += 1
pooled = [runs[0][:]]
for s, e in runs[1:]:
    if s - pooled[-1][1] - 1 <= 5:
        pooled[-1][1] = e
    else:
        pooled.append([s, e])
events = [(s, e) for s, e in pooled if e - s + 1 >= 5]
for s, e in events:
    print("drought", d0 + timedelta(days=s), d0 + timedelta(days=e), "deficit",
          float(np.sum(np.clip(thr - q[s:e + 1], 0, None))))
dry = np.zeros(n, bool)
for s, e in events:
    dry[s:e + 1] = True
N = 365
deficit = np.clip(thr - q, 0, None)
D = np.convolve(deficit, np.ones(N), "valid")  # D[k] = window k .. k+N-1
mean, sd = D.mean(), D.std(ddof=1)
for s in ["2011-01-01", "2012-07-20", "2013-06-01", "2009-06-01", "2016-03-10"]:
    k = idx(s)
    if k < N:
        print(s, "fraction nan index nan")
        continue
    w = slice(k - N, k)
    print(s, "fraction %.12f index %.12f" % (dry[w].mean(), (deficit[w].sum() - mean) / sd))
