"""Feeds many mutated project files through loading, analysis and the summary, and prints the counts.

    nice python tools/fuzz_files.py --count 100000 [--seed 1] [--keep /tmp/fuzz_failures]

Run by hand (CI runs a bounded subset in tests/test_fuzz.py). It prints how many files were
analysed, could not stand (AnalysisError), were refused (ModelError), how many refusals named no
field and no file problem, how many analyses held a non-finite float, and how many raised anything
else; ``--keep`` writes every file of the last three kinds there, for the corpus in
tests/fixtures/fuzz_corpus/.
"""

from __future__ import annotations

import argparse
import random
import sys
import time
from collections import Counter
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from tests.fuzzing import mutated_bytes, outcome, seeds


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--count", type=int, default=10_000)
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--keep", type=Path, help="folder for the files that failed")
    parser.add_argument("--every", type=int, default=10_000, help="print progress every N files")
    args = parser.parse_args()
    rng = random.Random(args.seed)
    base = seeds()
    kinds: Counter[str] = Counter()
    unnamed = non_finite = 0
    examples: dict[str, str] = {}
    start = time.perf_counter()
    for n in range(1, args.count + 1):
        data = mutated_bytes(rng, base)
        result = outcome(data)
        kinds[result.kind] += 1
        failure = None
        if result.kind == "unhandled":
            failure = "unhandled"
        elif not result.named:
            unnamed += 1
            failure = "unnamed"
        elif result.non_finite:
            non_finite += 1
            failure = "non-finite"
        if failure:
            examples.setdefault(failure, f"{result.message.strip()[-300:]} {', '.join(result.non_finite[:3])}")
            if args.keep:
                args.keep.mkdir(parents=True, exist_ok=True)
                (args.keep / f"{failure}-{n:07d}.poise").write_bytes(data)
        if n % args.every == 0:
            rate = n / (time.perf_counter() - start)
            print(f"{n:>8} files, {rate:6.0f}/s: {dict(kinds)}", flush=True)
    elapsed = time.perf_counter() - start
    print(f"files                         {args.count}")
    for kind in ("analysed", "cannot stand", "refused", "unhandled"):
        print(f"{kind:<30}{kinds[kind]}")
    print(f"refusals without a field      {unnamed}")
    print(f"analyses with non-finite      {non_finite}")
    print(f"time                          {elapsed:.0f} s ({args.count / elapsed:.0f} files/s)")
    for failure, example in examples.items():
        print(f"first {failure}: {example}")
    return 1 if kinds["unhandled"] or unnamed or non_finite else 0


if __name__ == "__main__":
    sys.exit(main())
