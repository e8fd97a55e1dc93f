"""Compare the ratings of two sets of results files (before and after a change).

A speed-up must not change a rating (DEVELOPERS.md, "Benchmarks"). Rate the samples before
and after into two folders, then:

    python bench/compare_ratings.py BEFORE_DIR AFTER_DIR [--rtol 1e-6]

Every member, pin and posting of every vehicle is compared: the rating factor (relative
tolerance ``--rtol``), the rating method and the controlling member of each posting. Exit 0
when nothing differs beyond the tolerance, 1 otherwise (each difference listed).
"""

from __future__ import annotations

import argparse
import json
import math
import sys
from pathlib import Path


def _rf(v: object) -> float:
    if v is None:
        return math.inf
    return float(v)


def ratings_of(path: Path) -> dict[tuple[str, ...], tuple[float, str]]:
    """(kind, id, vehicle) -> (rf, method or controlling member) of one results file."""
    d = json.loads(path.read_text(encoding="utf-8"))
    out: dict[tuple[str, ...], tuple[float, str]] = {}
    for m in d["members"]:
        for case, r in m.get("ratings", {}).items():
            out[("member", m["id"], case)] = (_rf(r.get("rf")), str(r.get("method", "")))
    for p in d["pins"]:
        for case, r in p.get("ratings", {}).items():
            out[("pin", p["joint"], case)] = (_rf(r.get("rf")), "")
    for case, post in d["posting"].items():
        out[("posting", case, "")] = (_rf(post.get("rf")), str(post.get("member", "")))
        out[("posting tons", case, "")] = (_rf(post.get("posting_tons")), "")
    return out


def compare(before: Path, after: Path, rtol: float) -> list[str]:
    diffs: list[str] = []
    a, b = ratings_of(before), ratings_of(after)
    for key in sorted(a.keys() | b.keys()):
        if key not in a or key not in b:
            diffs.append(f"{before.name}: {' '.join(key)} only in "
                         f"{'before' if key in a else 'after'}")
            continue
        (ra, ma), (rb, mb) = a[key], b[key]
        same = (ra == rb) or (math.isfinite(ra) and math.isfinite(rb)
                              and abs(ra - rb) <= rtol * max(abs(ra), abs(rb), 1.0))
        if not same or ma != mb:
            rel = (rb - ra) / abs(ra) if math.isfinite(ra) and math.isfinite(rb) and ra else 0.0
            diffs.append(f"{before.name}: {' '.join(k for k in key if k)}: {ra:.6g} -> {rb:.6g}"
                         f" ({rel:+.3%}) {ma!r} -> {mb!r}")
    return diffs


def main() -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("before", type=Path)
    ap.add_argument("after", type=Path)
    ap.add_argument("--rtol", type=float, default=1e-6)
    a = ap.parse_args()
    files = sorted(a.before.glob("*.rating.json"))
    if not files:
        print(f"no *.rating.json in {a.before}", file=sys.stderr)
        return 2
    diffs: list[str] = []
    for f in files:
        other = a.after / f.name
        if not other.exists():
            diffs.append(f"{f.name}: missing in {a.after}")
            continue
        diffs.extend(compare(f, other, a.rtol))
    for line in diffs:
        print(line)
    print(f"{len(files)} results file(s) compared, {len(diffs)} difference(s) beyond "
          f"rtol {a.rtol:g}")
    return 1 if diffs else 0


if __name__ == "__main__":
    sys.exit(main())
