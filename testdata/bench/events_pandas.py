#!/usr/bin/python3
"""Reference implementation, in pandas and numpy, of what index/events and index/criteria
compute with their default options, for timing the Go code side by side and for checking
that both find the same events. Not run in CI.

Input: a long CSV station,date,variable,value with water_temperature, air_temperature and
discharge (as written by the project's benchmark generator). Output: one row per station x
event x water-quality variable (water_temperature only), plus a per-station criteria table.

Per station, on the daily record from its first to its last date:
  climatology  day-of-year mean and percentile of the values within +/-5 days (by position)
               of every day with that DayOf366 (29 Feb = day 60, interpolated from days 59
               and 61), over the whole record, smoothed by a 31-day moving average that
               wraps around the year (NaN-aware); a variable needs 5 calendar years with
               half their days present (Hobday et al. 2016 recipe)
  heat waves   air temperature > its smoothed 90th percentile for >= 3 days, then gaps of
               <= 2 days joined
  droughts     discharge < Q80 (20th percentile, np.percentile linear, whole record),
               runs <= 5 days apart pooled, events shorter than 5 days dropped
  floods       discharge > Q95, runs joined unless peaks >= 7 days apart and the flow
               between drops below 0.75 x the smaller peak
  dryness      fraction of the 365 days before the event start inside a drought event
               (NaN when the window starts before the record or < 80% of its flows exist)
  responses    water-temperature departure from its climatological mean: peak in the
               window start .. end+14 (cut at the record end and before the next event),
               mean and sum over the event, recovery = first day after the end starting
               7 days within +/- 1 sd of the departures, censored at the record end, a gap
               of more than 3 missing days, or the next event
  criteria     7-day mean of daily means (all 7 days present), days above 18 C, and
               Hashimoto et al. (1982) reliability, resilience and vulnerability

Run: /usr/bin/python3 events_pandas.py SERIES.csv [--out DIR]   (numpy 1.24.2, pandas 1.5.3)
"""
import argparse
import os
import sys
import time

import numpy as np
import pandas as pd

HALF, SMOOTH, MIN_YEARS = 5, 31, 5
HEAT_P, HEAT_MIN, HEAT_GAP = 90, 3, 2
DRY_P, DRY_POOL, DRY_MIN = 20, 5, 5
FLOOD_P, FLOOD_SEP, FLOOD_TROUGH = 95, 7, 0.75
LAG, RUN, TOL_SD, MAX_GAP = 14, 7, 1.0, 3
ANTE_DAYS, ANTE_COVER = 365, 0.8
CRITERION = 18.0


def enough_years(x, years):
    """Whether MIN_YEARS calendar years have half their days or more with a value."""
    yrs = pd.Series(~np.isnan(x)).groupby(years).sum()
    leap = np.array([y % 4 == 0 and (y % 100 != 0 or y % 400 == 0) for y in yrs.index])
    return np.sum(yrs.to_numpy() * 2 >= np.where(leap, 366, 365)) >= MIN_YEARS


def climatology(x, doy, years, pct=None):
    """Smoothed (mean, percentile) curves over 366 days, or None when too short."""
    if not enough_years(x, years):
        return None
    n = len(x)
    offs = np.arange(-HALF, HALF + 1)
    mean = np.full(366, np.nan)
    thr = np.full(366, np.nan)
    order = np.argsort(doy, kind="stable")
    bounds = np.searchsorted(doy[order], np.arange(1, 368))
    for d in range(1, 367):
        if d == 60:
            continue
        idx = order[bounds[d - 1]:bounds[d]]
        pool = (idx[:, None] + offs).ravel()
        v = x[pool[(pool >= 0) & (pool < n)]]
        v = v[~np.isnan(v)]
        if v.size == 0:
            continue
        mean[d - 1] = v.mean()
        if pct is not None:
            thr[d - 1] = np.percentile(v, pct)
    mean[59] = 0.5 * (mean[58] + mean[60])
    thr[59] = 0.5 * (thr[58] + thr[60])
    return smooth(mean), smooth(thr)


def smooth(y):
    ok = ~np.isnan(y)
    k = np.ones(SMOOTH)
    s = np.convolve(np.tile(np.where(ok, y, 0.0), 3), k, "same")[366:732]
    c = np.convolve(np.tile(ok.astype(float), 3), k, "same")[366:732]
    return np.where(ok, s / np.maximum(c, 1), np.nan)


def runs(mask):
    """[start, end] index pairs of the runs of True in mask."""
    m = np.concatenate(([False], mask, [False])).astype(np.int8)
    d = np.diff(m)
    return np.column_stack((np.flatnonzero(d == 1), np.flatnonzero(d == -1) - 1))


def join(r, gap):
    out = []
    for s, e in r:
        if out and s - out[-1][1] - 1 <= gap:
            out[-1][1] = e
        else:
            out.append([s, e])
    return out


def floods(q, thr):
    out = []
    for s, e in runs(q > thr):
        p = s + int(np.argmax(q[s:e + 1]))
        if out:
            ps, pe, pp = out[-1]
            between = q[pe + 1:s]
            between = between[~np.isnan(between)]
            low = between.min() if between.size else -np.inf
            if not (p - pp >= FLOOD_SEP and low < FLOOD_TROUGH * min(q[pp], q[p])):
                out[-1] = [ps, e, p if q[p] > q[pp] else pp]
                continue
        out.append([s, e, p])
    return out


def station(sid, g, rows, crit):
    g = g.reindex(pd.date_range(g.index.min(), g.index.max(), freq="D"))
    dates = g.index
    n = len(dates)
    leap = dates.is_leap_year
    doy = (dates.dayofyear + ((~leap) & (dates.month > 2))).to_numpy()
    years = dates.year.to_numpy()
    col = lambda v: g[v].to_numpy(dtype=float) if v in g else np.full(n, np.nan)
    air, water, q = col("air_temperature"), col("water_temperature"), col("discharge")

    events = []  # (start, end, kind, driver peak)
    c = climatology(air, doy, years, HEAT_P)
    if c is not None:
        seas, thr = c[0][doy - 1], c[1][doy - 1]
        r = [s for s in runs(air > thr) if s[1] - s[0] + 1 >= HEAT_MIN]
        for s, e in join(r, HEAT_GAP):
            events.append((s, e, "heatwave", np.nanmax(air[s:e + 1] - seas[s:e + 1])))
    in_drought = np.zeros(n, bool)
    have_q = enough_years(q, years)
    if have_q:
        qthr = np.nanpercentile(q, DRY_P)
        for s, e in join(runs(q < qthr), DRY_POOL):
            if e - s + 1 >= DRY_MIN:
                events.append((s, e, "drought", np.nanmin(q[s:e + 1])))
                in_drought[s:e + 1] = True
        for s, e, p in floods(q, np.nanpercentile(q, FLOOD_P)):
            events.append((s, e, "flood", q[p]))
    events.sort(key=lambda ev: (ev[0], ev[1], ev[2]))

    cum_dry = np.concatenate(([0], np.cumsum(in_drought)))
    cum_q = np.concatenate(([0], np.cumsum(~np.isnan(q))))
    starts = np.array([ev[0] for ev in events], dtype=int)

    c = climatology(water, doy, years)
    if c is not None:
        anom = water - c[0][doy - 1]
        tol = TOL_SD * np.nanstd(anom, ddof=1)
        for (s, e, kind, drv) in events:
            later = starts[starts > e]
            stop = later.min() if later.size else n
            w = anom[s:min(e + LAG, stop - 1, n - 1) + 1]
            if np.all(np.isnan(w)):
                peak, ttp = np.nan, -1
            else:
                ttp = int(np.nanargmax(w))
                peak = w[ttp]
            ev = anom[s:e + 1]
            obs = int(np.sum(~np.isnan(ev)))
            mean = np.nanmean(ev) if obs else np.nan
            cum = np.nansum(ev) if obs else np.nan
            run = gap = 0
            i = e + 1
            while True:
                if i >= n:
                    rec, days, why = False, n - 1 - e, "record_end"
                    break
                if i >= stop:
                    rec, days, why = False, stop - 1 - e, "next_event"
                    break
                v = anom[i]
                if np.isnan(v):
                    run = 0
                    gap += 1
                    if gap > MAX_GAP:
                        rec, days, why = False, i - gap - e, "gap"
                        break
                else:
                    gap = 0
                    run = run + 1 if abs(v) <= tol else 0
                    if run == RUN:
                        rec, days, why = True, i - RUN + 1 - e, ""
                        break
                i += 1
            if s >= ANTE_DAYS and cum_q[s] - cum_q[s - ANTE_DAYS] >= np.ceil(ANTE_COVER * ANTE_DAYS) and have_q:
                dry = (cum_dry[s] - cum_dry[s - ANTE_DAYS]) / ANTE_DAYS
            else:
                dry = np.nan
            rows.append((sid, kind, dates[s].date(), dates[e].date(), e - s + 1, drv, "water_temperature",
                         peak, ttp, mean, cum, rec, days, why, dry))

    w7 = pd.Series(water).rolling(7, min_periods=7).mean().to_numpy()
    ok = ~np.isnan(w7)
    fail = w7 > CRITERION
    nf = int(fail.sum())
    prev_fail = np.concatenate(([False], fail[:-1] & ok[:-1]))
    trans = int(np.sum(prev_fail & ok & ~fail))
    ev_max = [np.max(w7[a:b + 1] - CRITERION) for a, b in runs(fail)]
    crit.append((sid, int(ok.sum()), nf, (ok.sum() - nf) / ok.sum() if ok.sum() else np.nan,
                 trans / nf if nf else np.nan, np.mean(ev_max) if ev_max else np.nan))


def main(argv):
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("series")
    ap.add_argument("--out", default=".")
    a = ap.parse_args(argv)
    t0 = time.perf_counter()
    df = pd.read_csv(a.series, dtype={"station": "category", "variable": "category", "value": "float64"})
    df["date"] = pd.to_datetime(df["date"], format="%Y-%m-%d")
    t1 = time.perf_counter()
    wide = df.pivot_table(index=["station", "date"], columns="variable", values="value", aggfunc="first",
                          dropna=False, observed=True)
    del df
    rows, crit = [], []
    for sid, g in wide.groupby(level="station", observed=True):
        g = g.droplevel("station").dropna(how="all")
        if len(g):
            station(sid, g, rows, crit)
    t2 = time.perf_counter()
    ev = pd.DataFrame(rows, columns=["station", "kind", "start", "end", "duration_days", "driver_peak", "variable",
                                     "peak_departure", "time_to_peak_days", "mean_departure",
                                     "cumulative_departure", "recovered", "recovery_days", "censor_reason",
                                     "antecedent_dryness"])
    ev.to_csv(os.path.join(a.out, "events_pandas.csv"), index=False, float_format="%.6f")
    pd.DataFrame(crit, columns=["station", "days", "days_above", "reliability", "resilience", "vulnerability"]) \
        .to_csv(os.path.join(a.out, "criteria_pandas.csv"), index=False, float_format="%.6f")
    print(f"read {t1 - t0:.2f} s, compute {t2 - t1:.2f} s, total {t2 - t0:.2f} s; "
          f"{len(crit)} stations, {len(rows)} event rows", file=sys.stderr)


if __name__ == "__main__":
    main(sys.argv[1:])
