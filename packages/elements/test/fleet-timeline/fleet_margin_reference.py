#!/usr/bin/env python3
"""Independent reference values for packages/elements/test/fleet-timeline/fleet-timeline.test.ts [C].

The smallest bound b with P(|X| <= b) = p for X ~ N(m, sigma^2), solved with scipy's normal CDF
and Brent's method (scipy 1.17.1), and scipy.special.erfc at a few points. Run:
    python3 packages/elements/test/fleet-timeline/fleet_margin_reference.py
and paste the printed lines into the test if the cases change.
"""
from scipy.optimize import brentq
from scipy.special import erfc
from scipy.stats import norm

CASES = [  # (mean, sigma, p)
    (0.0, 1.0, 0.95),
    (3.0, 1.0, 0.95),
    (1.0e-8, 5.0e-9, 0.95),
    (2.5e-8, 4.0e-9, 0.9973),
    (-1.2e-8, 8.0e-9, 0.68),
    (1.0e-8, 1.0e-9, 0.95),
]

for m, s, p in CASES:
    f = lambda b: norm.cdf((b - abs(m)) / s) - norm.cdf((-b - abs(m)) / s) - p
    z = norm.ppf((1 + p) / 2)
    b = brentq(f, abs(m), abs(m) + z * s + s, xtol=1e-30, rtol=1e-15)
    print(f"[{m!r}, {s!r}, {p!r}, {float(z)!r}, {float(b)!r}],")
for p in [0.68, 0.95, 0.9973]:
    print(f"[{p!r}, {float(norm.ppf(p))!r}],")
for x in [-1.5, -0.3, 0.0, 0.7, 2.0, 4.5]:
    print(f"[{x!r}, {float(erfc(x))!r}],")
