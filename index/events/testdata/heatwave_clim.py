"""Day-of-year climatology of heatwave_synth_2001_2006.csv (base 2001-2005) with numpy,
following Hobday et al. (2016) and the calendar of the authors' reference code: pools by
position (+/-5 days around every base-period day of each DayOf366), 29 Feb interpolated
from its neighbours, np.percentile (linear) and mean, then a 31-day moving average that
wraps around the year. Writes heatwave_synth_clim.csv (day of the 366-day year, mean, p90).
Run: /usr/bin/python3 heatwave_clim.py   (numpy 1.24.2)
"""
import numpy as np
from datetime import date

rows = np.loadtxt("heatwave_synth_2001_2006.csv", delimiter=",", skiprows=1, dtype=str)
t = np.array([date.fromisoformat(s).toordinal() for s in rows[:, 0]])
temp = rows[:, 1].astype(float)

def doy366(o):
    x = date.fromordinal(int(o))
    return date(2012, x.month, x.day).toordinal() - date(2012, 1, 1).toordinal() + 1

doy = np.array([doy366(o) for o in t])
yr = np.array([date.fromordinal(int(o)).year for o in t])
base = np.where((yr >= 2001) & (yr <= 2005))[0]
th = np.full(366, np.nan)
se = np.full(366, np.nan)
for d in range(1, 367):
    if d == 60:
        continue
    idx = base[doy[base] == d]
    pool = np.concatenate([idx + w for w in range(-5, 6)])
    pool = pool[(pool >= 0) & (pool < len(t))]
    th[d - 1] = np.percentile(temp[pool], 90)
    se[d - 1] = temp[pool].mean()
th[59] = 0.5 * (th[58] + th[60])
se[59] = 0.5 * (se[58] + se[60])

def runavg(x, w=31):
    return np.convolve(np.r_[x, x, x], np.ones(w) / w, mode="same")[len(x):2 * len(x)]

np.savetxt("heatwave_synth_clim.csv", np.c_[np.arange(1, 367), runavg(se), runavg(th)],
           fmt=["%d", "%.10f", "%.10f"], delimiter=",", header="day366,seas,thresh", comments="")
