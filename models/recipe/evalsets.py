"""Write the fixed, seeded evaluation samples that the C# tests use, and the held-out negation set.

  python3 evalsets.py --data DATA_DIR --out ../../tests/Plumbline.Nli.Tests/data/nli --work ../work
All rows come from files that SOURCES.md marks 'evaluate'; nothing here is used for training.
"""
import argparse
import csv
import json
import os
import random

from negation_eval import negation_pairs
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
    ap.add_argument("--out", required=True)
    ap.add_argument("--work", required=True)
    args = ap.parse_args()
    os.makedirs(args.out, exist_ok=True)
    os.makedirs(args.work, exist_ok=True)
    ev = evaluate_sources(args.data)
    rng = random.Random(SEED)
    write_csv(os.path.join(args.out, "mnli-matched-dev-500.csv"), rng.sample(ev["mnli_matched"], 500))
    breaking = [r for r in ev["breaking_nli"] if r[2] == "contradiction"]
    write_csv(os.path.join(args.out, "breaking-nli-contradiction-300.csv"), rng.sample(breaking, 300))
    negations = negation_pairs([p for p, _, _ in ev["snli_dev"]], 1000, SEED)
    write_csv(os.path.join(args.out, "negation-held-out-300.csv"), negations[:300])
    write_csv(os.path.join(args.work, "negation-held-out-1000.csv"), negations)
    with open(os.path.join(args.work, "breaking-nli.jsonl"), "w", encoding="utf-8") as f:
        for p, h, l in ev["breaking_nli"]:
            f.write(json.dumps({"sentence1": p, "sentence2": h, "label": l}) + "\n")


if __name__ == "__main__":
    main()
