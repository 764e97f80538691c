"""The benchmark's yardstick for `forelog score --json`: the same core figures computed
the way an analyst would with the scientific Python stack, from the exported diary file.

Reads a Forelog diary file (JSON v1, as `forelog export` writes it), applies the counting
rules of SCORING.md for the final forecast (void never scored; window end T = min(close,
resolution); only forecasts at or before T count; the final forecast is the latest of
those, the one written last when two share a time), and computes with numpy the Brier
score, the log score (p clipped to [0.001, 0.999]) and the 11 calibration bins (edges
(2k - 1)/20). Prints them as JSON so the benchmark can check both sides agree.

Run: /usr/bin/python3 test/bench/score_peer.py DIARY.json
"""

import json
import sys

import numpy as np

EDGES = np.array([(2 * k - 1) / 20 for k in range(1, 11)])


def instants(texts):
    """ISO 8601 instants (the export writes UTC, ending in Z) as epoch milliseconds."""
    stripped = np.char.rstrip(np.asarray(texts, dtype=str), "Z")
    return stripped.astype("datetime64[ms]").astype(np.int64)


def main(path):
    with open(path, encoding="utf-8") as f:
        diary = json.load(f)

    resolved = [
        q for q in diary["questions"]
        if q.get("resolution") and q["resolution"]["outcome"] in ("yes", "no")
    ]
    n_q = len(resolved)
    closes = instants([q["closes_at"] for q in resolved])
    resolved_at = instants([q["resolution"]["at"] for q in resolved])
    window_end = np.minimum(closes, resolved_at)
    outcome = np.array([q["resolution"]["outcome"] == "yes" for q in resolved], dtype=float)

    owner, at_text, p = [], [], []
    for i, q in enumerate(resolved):
        for fc in q["forecasts"]:
            owner.append(i)
            at_text.append(fc["at"])
            p.append(fc["p"])
    owner = np.array(owner, dtype=np.int64)
    at = instants(at_text)
    p = np.array(p, dtype=float)
    order_in_file = np.arange(len(p))

    counts = at <= window_end[owner]
    owner, at, p, order_in_file = owner[counts], at[counts], p[counts], order_in_file[counts]
    # Sort by question, then time, then file order: the last row of each question is its final forecast.
    order = np.lexsort((order_in_file, at, owner))
    owner, p = owner[order], p[order]
    last = np.flatnonzero(np.r_[owner[1:] != owner[:-1], True]) if len(owner) else np.array([], dtype=np.int64)
    scored = owner[last]
    final_p = p[last]
    o = outcome[scored]

    brier = float(np.mean((final_p - o) ** 2)) if len(final_p) else None
    clipped = np.clip(final_p, 0.001, 0.999)
    log_score = float(-np.mean(np.log(np.where(o == 1, clipped, 1 - clipped)))) if len(final_p) else None
    bin_of = np.searchsorted(EDGES, final_p, side="right")
    bins = []
    for k in range(11):
        in_bin = bin_of == k
        n = int(in_bin.sum())
        if n:
            bins.append({"index": k, "n": n, "mean_p": float(final_p[in_bin].mean()), "observed": float(o[in_bin].mean())})

    json.dump({"scored": int(len(final_p)), "unscored": n_q - int(len(final_p)), "brier": brier, "log_score": log_score, "bins": bins}, sys.stdout)
    sys.stdout.write("\n")


if __name__ == "__main__":
    if len(sys.argv) != 2:
        sys.exit("usage: score_peer.py DIARY.json")
    main(sys.argv[1])
