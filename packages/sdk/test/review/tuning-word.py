"""Reference values for tuning-word.test.ts (run: python3 tuning-word.py; Python 3 fractions, exact).

The word W = 2^N * f_nominal * (1 + offset) / f_clk a direct digital synthesizer needs for a fractional offset
(DDS relation f_out = word * f_clk / 2^N; common practice, no source), from the doubles given, in exact rational
arithmetic; printed: the nearest integer word (round half up) and nearest - W in words.
"""
from fractions import Fraction as F
import math

CASES = [
    # offset (double), nominal Hz, clock Hz, bits
    (-4.4860717450235345e-10, 10230000.0, 100000000.0, 64),
    (-4.4860717450235345e-10, 10230000.0, 100000000.0, 48),
    (-4.4647e-10, 10230000.0, 40000000.0, 32),
    (-4.4647e-10, 10230000.0, 122.88e6, 56),
    (3.1e-11, 5e6, 33.333333333333336e6, 60),
]
for offset, nominal, clock, bits in CASES:
    w = 2**bits * F(nominal) * (1 + F(offset)) / F(clock)
    nearest = math.floor(w + F(1, 2))
    print(repr(offset), nominal, repr(clock), bits, '->', nearest, repr(float(nearest - w)))

# KESTREL-15 of packages/sdk/examples/review/kestrel-block-b-mistakes.review.json (32-bit word at 100 MHz): the offset
# the nearest word produces, expected + (nearest - W) * step, step = f_clk / 2^N / f_nominal, for the review's
# expected offset of a = 26 790 000 m (IERS 2010, TT).
expected = F(-4.4860717450235345e-10)
w = 2**32 * F(10230000) * (1 + expected) / F(100000000)
nearest = math.floor(w + F(1, 2))
step = F(100000000) / 2**32 / F(10230000)
print('KESTREL-15 nearest word', nearest, 'produces', repr(float(expected + (nearest - w) * step)))
