# Z(1..10) of the line kernel rho(x,y) = (2 pi)^-1 (2cosh(x/2))^-1/2 (2cosh((x-y)/2))^-1 (2cosh(y/2))^-1/2
# (fermions) by an independent computation in python3 + mpmath at 30 digits: Nystrom trapezoid
# after x = a sinh t (a = 6, |x| <= 100), even and odd blocks, eigenvalues by mpmath.eigsy,
# Z(N) = e_N(eigenvalues); two resolutions printed side by side, and Z(1..4) against their
# closed forms (Hatsuda-Moriyama-Okuyama 2012). kernel-mpmath.spec.ts holds its output for 150 180
# (a few minutes).
import sys
from mpmath import mp, mpf, matrix, eigsy, sqrt, cosh, sinh, asinh, pi, nstr
mp.dps = 30
a, X = mpf(6), mpf(100)
T = asinh(X / a)

def Z(m, nmax=10):
    h = T / m
    ts = [h * k for k in range(0, m + 1)]
    xs = [a * sinh(t) for t in ts]
    ws = [a * cosh(t) * h for t in ts]
    e = [1 / sqrt(2 * cosh(x / 2)) for x in xs]
    rho = lambda x, y: 1 / (2 * pi) / (2 * cosh((x - y) / 2))
    ev = []
    # even block: nodes 0..m (node 0 on the axis), odd block: nodes 1..m
    for parity in (1, -1):
        idx = list(range(0 if parity == 1 else 1, m + 1))
        n = len(idx)
        A = matrix(n, n)
        for p, i in enumerate(idx):
            for q, j in enumerate(idx):
                if q < p:
                    continue
                s = sqrt(ws[i] * ws[j]) * e[i] * e[j]
                v = rho(xs[i], xs[j]) + parity * rho(xs[i], -xs[j])
                if i == 0 and j == 0:
                    v = rho(0, 0)
                elif i == 0 or j == 0:
                    v = v / sqrt(2)
                A[p, q] = A[q, p] = s * v
        ev += list(eigsy(A, eigvals_only=True))
    z = [mpf(1)] + [mpf(0)] * nmax
    for l in ev:
        for j in range(nmax, 0, -1):
            z[j] += l * z[j - 1]
    return z

ms = [int(v) for v in sys.argv[1:]] or [130, 150]
zs = [Z(m) for m in ms]
closed = [mpf(1) / 4, 1 / (16 * pi), (pi - 3) / (64 * pi), (10 - pi ** 2) / (1024 * pi ** 2)]
for N in range(1, 11):
    line = f"Z({N}) = " + "  ".join(nstr(z[N], 25) for z in zs)
    line += f"  rel diff {nstr(abs(zs[-1][N] - zs[-2][N]) / zs[-1][N], 2)}"
    if N <= 4:
        line += f"  vs closed form {nstr(abs(zs[-1][N] - closed[N - 1]) / closed[N - 1], 2)}"
    print(line, flush=True)
