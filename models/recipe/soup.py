"""Average two checkpoints of the same model, weight by weight: alpha * first + (1 - alpha) * second.
Used to combine the first stage (strong on substitutions and negation) with the second (does not read
meaning-preserving edits as contradictions)."""
import argparse

import torch


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--first", required=True)
    ap.add_argument("--second", required=True)
    ap.add_argument("--alpha", type=float, default=0.5)
    ap.add_argument("--out", required=True)
    args = ap.parse_args()
    a, b = torch.load(args.first), torch.load(args.second)
    torch.save({k: args.alpha * a[k] + (1 - args.alpha) * b[k] for k in a}, args.out)


if __name__ == "__main__":
    main()
