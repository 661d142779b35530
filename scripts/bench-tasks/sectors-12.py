# Yardstick for sectors-12.json, by a different method: for every sector (n, m) in a window, the
# elementary symmetric functions e_N of the states q^((|p|+|p+n|+|p+m|)/3) by a direct DP over the
# states (no cycle weights, no Newton recursion, no stopping rule), weighted by q^(n^2+nm+m^2).
# Exponents in units of 1/3 below 180 (= O(q^60)). Window: n^2+nm+m^2 >= (3/4) max(|n|,|m|)^2, so
# every sector with max(|n|,|m|) >= 9 lies beyond q^60; a state with |p| >= 66 lies beyond q^60.
import numpy as np

SIZE, NMAX, W = 180, 12, 8
total = np.zeros((NMAX + 1, SIZE), dtype=object)
for n in range(-W, W + 1):
    for m in range(-W, W + 1):
        w = 3 * (n * n + n * m + m * m)
        if w >= SIZE:
            continue
        lim = SIZE - w
        E = np.zeros((NMAX + 1, lim), dtype=object)
        E[0, 0] = 1
        for p in range(-70, 71):
            e = abs(p) + abs(p + n) + abs(p + m)
            if e >= lim:
                continue
            for N in range(NMAX, 0, -1):
                E[N, e:] += E[N - 1, : lim - e]
        total[1:, w:] += E[1:, :]
k = 179  # q^(179/3)
print(f"Z(12) coefficient of q^{k}/3: {total[12, k]}")
