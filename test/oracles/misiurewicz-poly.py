# Exact algebra for the Misiurewicz tests (no code shared with quadatlas):
# z_n in Z[c] (z_0 = 0, z_{n+1} = z_n^2 + c), F = z_{K+1+P} - z_{K+1};
# S = squarefree part of F (F / gcd(F, F')), then every root of a lower type
# removed: S / gcd(S, z_{K+P} - z_K) (preperiod below K) and
# S / gcd(S, z_{K+1+d} - z_{K+1}) for each proper divisor d of P.
# deg S is the number of distinct (K, P) points; mpmath.polyroots gives them.
# Prints one JSON line per "K,P" argument: {"k", "p", "count", "roots": [[re, im], ...]}.
import json, sys
from fractions import Fraction
import mpmath

def trim(a):
    a = list(a)
    while len(a) > 1 and a[-1] == 0:
        a.pop()
    return a

def add(a, b):
    r = [0] * max(len(a), len(b))
    for i, x in enumerate(a): r[i] += x
    for i, x in enumerate(b): r[i] += x
    return trim(r)

def mul(a, b):
    r = [0] * (len(a) + len(b) - 1)
    for i, x in enumerate(a):
        if x:
            for j, y in enumerate(b): r[i + j] += x * y
    return r

def sub(a, b): return add(a, [-x for x in b])

def divmod_(a, b):
    a = [Fraction(x) for x in a]; b = trim(b)
    q = [Fraction(0)] * max(1, len(a) - len(b) + 1)
    while len(a) >= len(b) and not (len(a) == 1 and a[0] == 0):
        k = len(a) - len(b); f = a[-1] / b[-1]; q[k] = f
        for i, y in enumerate(b): a[i + k] -= f * y
        a = trim(a)
    return trim(q), trim(a)

def gcd(a, b):
    a = trim(a); b = trim(b)
    while not (len(b) == 1 and b[0] == 0):
        a, b = b, divmod_(a, b)[1]
    return [x / a[-1] for x in a]

def deriv(a): return trim([i * a[i] for i in range(1, len(a))] or [0])

def z(n):
    p = [0]
    for _ in range(n): p = add(mul(p, p), [0, 1])
    return p

for arg in sys.argv[1:]:
    K, P = map(int, arg.split(','))
    F = sub(z(K + 1 + P), z(K + 1))
    S = divmod_(F, gcd(F, deriv(F)))[0]
    for g in [sub(z(K + P), z(K))] + [sub(z(K + 1 + d), z(K + 1)) for d in range(1, P) if P % d == 0]:
        S = divmod_(S, gcd(S, g))[0]
    mpmath.mp.dps = 40
    coeffs = [mpmath.mpf(x.numerator) / x.denominator for x in reversed(S)]
    roots = mpmath.polyroots(coeffs, maxsteps=400, extraprec=400) if len(S) > 2 else [-coeffs[1] / coeffs[0]]
    print(json.dumps({"k": K, "p": P, "count": len(S) - 1, "roots": [[mpmath.nstr(mpmath.re(r), 30), mpmath.nstr(mpmath.im(r), 30)] for r in roots]}))
