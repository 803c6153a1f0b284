"""Distinct value combinations of broadcast inputs, so rate-independent work runs once.

A sweep of 10,000 flow rates over 70 intervals gives 700,000 evaluations but only 70
distinct (geometry, fluid) combinations.  Quantities that do not depend on the flow rate (the
critical velocity) are computed on the distinct combinations and gathered back.  The grouping
is exact (equal floats only) and costs a few array passes of the broadcast size, no sort.
"""

from __future__ import annotations

import math

import numpy as np

__all__ = ["distinct_combinations"]

#: Largest mixed-radix code before the grouping is abandoned (int64 stays exact below it).
_MAX_CODE = 2**62
#: A code table up to this many times the broadcast size is marked densely (no sort).
_DENSE_FACTOR = 4


def distinct_combinations(arrays, shape):
    """Distinct combinations of the values of ``arrays``, each broadcastable to ``shape``.

    Parameters
    ----------
    arrays : sequence of array_like
        Inputs in their own (broadcastable) shapes [any units].
    shape : tuple of int
        The broadcast shape of the evaluation.

    Returns
    -------
    columns : list of numpy.ndarray
        One 1-D array per input: its value in each distinct combination.
    inverse : numpy.ndarray
        Integer array of size ``prod(shape)`` with
        ``columns[i][inverse] == np.broadcast_to(arrays[i], shape).ravel()``.

    Notes
    -----
    Each input is coded by ``np.unique`` over its own (small) elements; the codes are combined
    in mixed radix over the broadcast shape and the codes used are marked in a table, so the
    cost is linear in the broadcast size.  When the code space would be too large to mark, the
    used codes are found with one ``np.unique`` sort; when it would overflow int64 every
    element is its own combination.

    Examples
    --------
    >>> cols, inv = distinct_combinations([np.array([[1.0], [1.0], [2.0]]), [5.0, 6.0]], (3, 2))
    >>> [c.tolist() for c in cols], inv.tolist()
    ([[1.0, 1.0, 2.0, 2.0], [5.0, 6.0, 5.0, 6.0]], [0, 1, 0, 1, 2, 3])
    """
    size = math.prod(shape)
    values, radices = [], []
    key = np.zeros((), dtype=np.int64)
    card = 1
    for a in arrays:
        arr = np.asarray(a, dtype=float)
        u, code = np.unique(arr, return_inverse=True)
        if card * u.size > _MAX_CODE:
            flat = [np.broadcast_to(np.asarray(x, dtype=float), shape).ravel() for x in arrays]
            return flat, np.arange(size)
        key = key * u.size + code.reshape(arr.shape)
        card *= u.size
        values.append(u)
        radices.append(u.size)
    key = np.broadcast_to(key, shape).ravel()
    if card <= _DENSE_FACTOR * max(size, 1):
        seen = np.zeros(card, dtype=bool)
        seen[key] = True
        used = np.flatnonzero(seen)
        remap = np.zeros(card, dtype=np.int64)
        remap[used] = np.arange(used.size)
        inverse = remap[key]
    else:
        used, inverse = np.unique(key, return_inverse=True)
        inverse = inverse.ravel()
    digits = []
    rest = used
    for r in reversed(radices):
        rest, d = np.divmod(rest, r)
        digits.append(d)
    columns = [u[d] for u, d in zip(values, reversed(digits), strict=True)]
    return columns, inverse
