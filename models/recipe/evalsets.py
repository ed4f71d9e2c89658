"""Write the evaluation files kept in the repository: the held-out tree-shaped sets in full (models/nli-eval/)
and the fixed, seeded samples the C# tests use (tests/Plumbline.Nli.Tests/data/nli/).

  python3 evalsets.py --data DATA_DIR --extra EXTRA_DIR --out ../../tests/Plumbline.Nli.Tests/data/nli \
      --full ../nli-eval --work ../work
All rows come from files that SOURCES.md marks 'evaluate' (or are built from their sentences); nothing here is
used for training.
"""
import argparse
import csv
import json
import os
import random

from heldout import held_out_sets
from nli_files import evaluate_sources

SEED = 20261201


def write_csv(path, rows):
    with open(path, "w", encoding="utf-8", newline="") as f:
        w = csv.writer(f)
        w.writerow(["sentence1", "sentence2", "label"])
        w.writerows(rows)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--data", required=True)
    ap.add_argument("--extra", required=True)
    ap.add_argument("--out", required=True)
    ap.add_argument("--full", required=True)
    ap.add_argument("--work", required=True)
    args = ap.parse_args()
    for folder in (args.out, args.full, args.work):
        os.makedirs(folder, exist_ok=True)
    ev = evaluate_sources(args.data)
    rng = random.Random(SEED)
    # The first three samples keep their original draws (same seed, same order of calls).
    write_csv(os.path.join(args.out, "mnli-matched-dev-500.csv"), rng.sample(ev["mnli_matched"], 500))
    breaking = [r for r in ev["breaking_nli"] if r[2] == "contradiction"]
    write_csv(os.path.join(args.out, "breaking-nli-contradiction-300.csv"), rng.sample(breaking, 300))
    held = held_out_sets(args.data, args.extra, SEED)
    write_csv(os.path.join(args.out, "negation-held-out-300.csv"), held["negation"][:300])
    write_csv(os.path.join(args.out, "snli-dev-500.csv"), rng.sample(ev["snli_dev"], 500))
    entailed = [r for r in ev["breaking_nli"] if r[2] == "entailment"]
    write_csv(os.path.join(args.out, "breaking-nli-entailment-300.csv"), rng.sample(entailed, 300))
    for name in ("paraphrase", "added_detail", "antonym"):
        write_csv(os.path.join(args.out, f"{name.replace('_', '-')}-held-out-300.csv"), rng.sample(held[name], 300))
    for name, rows in held.items():
        write_csv(os.path.join(args.full, f"{name.replace('_', '-')}-held-out.csv"), rows)
    with open(os.path.join(args.work, "breaking-nli.jsonl"), "w", encoding="utf-8") as f:
        for p, h, l in ev["breaking_nli"]:
            f.write(json.dumps({"sentence1": p, "sentence2": h, "label": l}) + "\n")


if __name__ == "__main__":
    main()
