#!/usr/bin/env python3
"""Independent reference solutions for the neuron package tests.

The equations are written here from the published papers (Hodgkin & Huxley 1952 in
the modern -65 mV convention; Brette & Gerstner 2005; Izhikevich 2003), in their
natural units (ms, mV, and pA/nS/pF for AdEx), and integrated with SciPy's
solve_ivp (DOP853, rtol 1e-10, atol 1e-12). Spikes and resets are solve_ivp events
with restarts. Run once with Debian's python3-scipy:

    /usr/bin/python3 gen_reference.py > reference.json
"""
import json
import math

import numpy as np
import scipy
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

RTOL, ATOL, METHOD = 1e-10, 1e-12, "DOP853"


# --- Hodgkin-Huxley (ms, mV, uA/cm^2, mS/cm^2, uF/cm^2) ---------------------------
def efun(x):
    # x / (1 - exp(-x)), with its limit 1 at x = 0
    return 1.0 if abs(x) < 1e-9 else x / (1.0 - math.exp(-x))


def hh_rates(v):
    am = efun((v + 40.0) / 10.0)
    bm = 4.0 * math.exp(-(v + 65.0) / 18.0)
    ah = 0.07 * math.exp(-(v + 65.0) / 20.0)
    bh = 1.0 / (1.0 + math.exp(-(v + 35.0) / 10.0))
    an = 0.1 * efun((v + 55.0) / 10.0)
    bn = 0.125 * math.exp(-(v + 65.0) / 80.0)
    return am, bm, ah, bh, an, bn


GNA, GK, GL, ENA, EK, EL, CM = 120.0, 36.0, 0.3, 50.0, -77.0, -54.387, 1.0


def hh_ionic(v, m, h, n):
    return GNA * m**3 * h * (v - ENA) + GK * n**4 * (v - EK) + GL * (v - EL)


def hh_inf(v):
    am, bm, ah, bh, an, bn = hh_rates(v)
    return am / (am + bm), ah / (ah + bh), an / (an + bn)


def hh_rhs(i_amp):
    def f(t, y):
        v, m, h, n = y
        am, bm, ah, bh, an, bn = hh_rates(v)
        return [(i_amp - hh_ionic(v, m, h, n)) / CM,
                am * (1 - m) - bm * m, ah * (1 - h) - bh * h, an * (1 - n) - bn * n]
    return f


def hh_case(amp, on, stop, samples):
    rest = brentq(lambda v: hh_ionic(v, *hh_inf(v)), -90.0, -50.0, xtol=1e-13)
    y0 = [rest, *hh_inf(rest)]
    up = lambda t, y: y[0]
    up.direction = 1.0
    spikes, vals = [], {}
    for (a, b, i_amp) in [(0.0, on, 0.0), (on, stop, amp)]:
        s = solve_ivp(hh_rhs(i_amp), (a, b), y0, method=METHOD, rtol=RTOL, atol=ATOL,
                      events=up, dense_output=True)
        spikes += list(s.t_events[0])
        for ts in samples:
            if a <= ts <= b:
                vals[ts] = s.sol(ts)[0]
        y0 = s.y[:, -1]
    return {"rest_mV": rest, "amp_uA_per_cm2": amp, "on_ms": on, "stop_ms": stop,
            "spikes_ms": spikes, "sample_ms": samples, "V_mV": [vals[t] for t in samples]}


# --- reset models with events and restarts -----------------------------------------
def reset_run(rhs, y0, stop, peak, reset):
    ev = lambda t, y: y[0] - peak
    ev.terminal, ev.direction = True, 1.0
    t, spikes = 0.0, []
    while t < stop:
        s = solve_ivp(rhs, (t, stop), y0, method=METHOD, rtol=RTOL, atol=ATOL, events=ev)
        if s.status == 1:
            t = s.t_events[0][0]
            spikes.append(t)
            y0 = reset(s.y_events[0][0])
        else:
            t = stop
    return spikes


def adex_case(vpeak, amp_pA, stop):
    C, gL, EL, VT, DT, tw, a, b = 281.0, 30.0, -70.6, -50.4, 2.0, 144.0, 4.0, 80.5

    def rhs(t, y):
        v, w = y
        return [(-gL * (v - EL) + gL * DT * math.exp((v - VT) / DT) - w + amp_pA) / C,
                (a * (v - EL) - w) / tw]
    sp = reset_run(rhs, [EL, 0.0], stop, vpeak, lambda y: [EL, y[1] + b])
    return {"vpeak_mV": vpeak, "amp_pA": amp_pA, "stop_ms": stop, "spikes_ms": sp}


def izh_case(name, a, b, c, d, amp, stop):
    def rhs(t, y):
        v, u = y
        return [0.04 * v * v + 5 * v + 140 - u + amp, a * (b * v - u)]
    sp = reset_run(rhs, [-65.0, b * -65.0], stop, 30.0, lambda y: [c, y[1] + d])
    return {"class": name, "abcd": [a, b, c, d], "I": amp, "stop_ms": stop, "spikes_ms": sp}


def main():
    out = {
        "generator": "gen_reference.py (equations written from the papers, not from the Go code)",
        "scipy": scipy.__version__, "numpy": np.__version__,
        "method": METHOD, "rtol": RTOL, "atol": ATOL,
        "hh": [hh_case(10.0, 10.0, 150.0, [5.0, 10.5, 12.0, 60.0, 149.0]),
               hh_case(2.0, 10.0, 60.0, [5.0, 12.0, 20.0, 40.0, 59.0])],
        "adex": [adex_case(-40.4, 1000.0, 200.0), adex_case(-40.4, 600.0, 200.0)],
        "izhikevich": [izh_case("regular spiking", 0.02, 0.2, -65, 8, 10.0, 200.0),
                       izh_case("fast spiking", 0.1, 0.2, -65, 2, 10.0, 200.0),
                       izh_case("chattering", 0.02, 0.2, -50, 2, 10.0, 200.0)],
    }
    print(json.dumps(out, indent=1))


if __name__ == "__main__":
    main()
