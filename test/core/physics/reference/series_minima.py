"""Reference minima of the series fits, computed once by a method independent of
the code under test, and written to series_minima.json beside this file.

The fits under test run Levenberg-Marquardt on all parameters at once. Here the
parameters that enter the model linearly (the amplitude, and the offset of a
build-up) are solved exactly for each trial time constant k by weighted linear
least squares (variable projection: G. H. Golub, V. Pereyra, "The
differentiation of pseudo-inverses and nonlinear least squares problems whose
variables separate", SIAM J. Numer. Anal. 10, 413-432 (1973)), which leaves a
function of k alone; that is minimised by golden-section search (J. Kiefer,
"Sequential minimax search for a maximum", Proc. AMS 4, 502-506 (1953)). All
arithmetic is in 60-digit decimals (Python's decimal module), so the minimum is
found to far better than double precision.

The inputs are made here with Python floats and written with repr(), so the
test reads back exactly the same doubles.

Run: python3 series_minima.py   (Python 3.8 or later, standard library only)
"""
import json
import math
import os
from decimal import Decimal, getcontext

getcontext().prec = 60
D = Decimal


def decay_design(t, flip):
    c = D(repr(math.cos(flip))) if flip is not None else D(1)
    return lambda k: [(-D(repr(ti)) / k).exp() * c ** i for i, ti in enumerate(t)]


def profile(t, s, sigma, model, flip):
    """F(k): the weighted sum of squares with the linear parameters solved exactly, and those parameters."""
    w = [D(1) / D(repr(x)) ** 2 for x in sigma] if sigma else [D(1)] * len(s)
    y = [D(repr(v)) for v in s]
    if model == 'decay':
        basis = decay_design(t, flip)

        def solve(k):
            g = basis(k)
            a = sum(wi * yi * gi for wi, yi, gi in zip(w, y, g)) / sum(wi * gi * gi for wi, gi in zip(w, g))
            f = sum(wi * (yi - a * gi) ** 2 for wi, yi, gi in zip(w, y, g))
            return f, {'amplitude': a, 'offset': None}

        return solve

    def solve(k):
        u = [D(1) - (-D(repr(ti)) / k).exp() for ti in t]
        # Normal equations of y = a u + b with weights w.
        suu = sum(wi * ui * ui for wi, ui in zip(w, u))
        su = sum(wi * ui for wi, ui in zip(w, u))
        s1 = sum(w)
        suy = sum(wi * ui * yi for wi, ui, yi in zip(w, u, y))
        sy = sum(wi * yi for wi, yi in zip(w, y))
        det = suu * s1 - su * su
        a = (suy * s1 - su * sy) / det
        b = (suu * sy - su * suy) / det
        f = sum(wi * (yi - a * ui - b) ** 2 for wi, ui, yi in zip(w, u, y))
        return f, {'amplitude': a, 'offset': b}

    return solve


def minimise(solve, lo, hi):
    """Golden-section search for the minimum of F on [lo, hi] (after a log-spaced scan picks the bracket)."""
    grid = [lo * (hi / lo) ** (D(i) / 400) for i in range(401)]
    values = [solve(k)[0] for k in grid]
    j = min(range(len(grid)), key=lambda i: values[i])
    if j == 0 or j == len(grid) - 1:
        raise SystemExit('minimum at the edge of the scan: widen it')
    a, b = grid[j - 1], grid[j + 1]
    r = (D(5).sqrt() - 1) / 2
    c, d = b - r * (b - a), a + r * (b - a)
    fc, fd = solve(c)[0], solve(d)[0]
    while (b - a) > D('1e-28') * abs(b):
        if fc < fd:
            b, d, fd = d, c, fc
            c = b - r * (b - a)
            fc = solve(c)[0]
        else:
            a, c, fc = c, d, fd
            d = a + r * (b - a)
            fd = solve(d)[0]
    k = (a + b) / 2
    f, lin = solve(k)
    return k, f, lin


def case(name, model, t, s, flip=None, sigma=None, lo=1.0, hi=1e5):
    k, f, lin = minimise(profile(t, s, sigma, model, flip), D(repr(lo)), D(repr(hi)))
    digits = lambda x: None if x is None else float(x)
    return {
        'name': name,
        'model': model,
        'time': t,
        'signal': s,
        'flip': flip,
        'sigma': sigma,
        'expected': {
            'timeConstant': digits(k),
            'amplitude': digits(lin['amplitude']),
            'offset': digits(lin['offset']),
            'chi2': digits(f),
        },
    }


def main():
    cases = []
    # Build-up with a deterministic scatter of about 1 % of the plateau (the minimum is off the generating values).
    t = [0, 30, 60, 120, 240, 480, 960, 1920]
    s = [0.9 * (1 - math.exp(-v / 400)) + 0.02 + 0.01 * math.sin(1.7 * i + 0.3) for i, v in enumerate(t)]
    cases.append(case('buildup, unweighted', 'buildup', t, s))
    cases.append(case('buildup, weighted', 'buildup', t, s, sigma=[0.002 * (1 + i) for i in range(len(t))]))
    # Decay read with 8 degree pulses, alternating +-6 % scatter: the log-linear line is visibly off the minimum.
    times = [0, 5, 10, 20, 30, 45, 60, 90]
    flip = 8 * math.pi / 180
    data = [3 * math.exp(-v / 25) * math.cos(flip) ** i * (1 + 0.06 * (1 if i % 2 == 0 else -1)) for i, v in enumerate(times)]
    cases.append(case('decay, 8 degree readouts', 'decay', times, data, flip=flip))
    # Decay with 2 % deterministic "noise", unweighted and with unequal uncertainties.
    tt = [0, 4, 8, 12, 16, 20, 24, 28, 32, 36]
    noisy = [1.5 * math.exp(-v / 30) * (1 + 0.02 * math.sin(3.7 * i + 1)) for i, v in enumerate(tt)]
    cases.append(case('decay, unweighted', 'decay', tt, noisy))
    scattered = [1.5 * math.exp(-v / 30) + 0.03 * math.sin(2.3 * i + 0.5) for i, v in enumerate(tt)]
    cases.append(case('decay, weighted', 'decay', tt, scattered, sigma=[0.005 * (1 + i * i) for i in range(len(tt))]))
    out = os.path.join(os.path.dirname(os.path.abspath(__file__)), 'series_minima.json')
    with open(out, 'w') as f:
        json.dump({'generator': 'series_minima.py', 'cases': cases}, f, indent=2)
        f.write('\n')
    for c in cases:
        print(c['name'], c['expected'])


main()
