"""Score training checkpoints on every figure the model card reports, to choose the one to ship.

  python3 candidates.py --data DATA_DIR --extra EXTRA_DIR --trees TREES.jsonl.gz --base BASE_DIR CHECKPOINT.pt ...
Prints one JSON line per checkpoint. Figures come from the PyTorch model in bf16 (fast, close to the shipped
int8 model; the card's final figures are measured again with the C# scorer on the int8 export).
Evaluation files only; the tree recording is read for link health (evaluation only, never fitted).
"""
import argparse
import json
import os

import torch

from bert import PairClassifier
from heldout import held_out_sets
from nli_files import evaluate_sources
from train import evaluate, figures
from tree_pairs import read_tree_pairs, tree_link_health
from wordpiece import WordPiece

SEED = 20261201


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--data", required=True)
    ap.add_argument("--extra", required=True)
    ap.add_argument("--trees", required=True)
    ap.add_argument("--base", required=True)
    ap.add_argument("--max-len", type=int, default=128)
    ap.add_argument("--threads", type=int, default=2)
    ap.add_argument("checkpoints", nargs="+")
    args = ap.parse_args()
    torch.set_num_threads(args.threads)
    tokenizer = WordPiece(os.path.join(args.base, "vocab.txt"))
    ev = evaluate_sources(args.data)
    sets = {
        "mnli_matched": ev["mnli_matched"],
        "snli_dev": ev["snli_dev"],
        "breaking_nli": ev["breaking_nli"],
        **held_out_sets(args.data, args.extra, SEED),
    }
    trees = read_tree_pairs(args.trees)
    for path in args.checkpoints:
        model = PairClassifier()
        model.load_state_dict(torch.load(path))
        model.eval()
        row = {"checkpoint": path}
        for name, rows in sets.items():
            row[name] = figures(evaluate(model, tokenizer, rows, args.max_len))
        row["tree_links"] = tree_link_health(model, tokenizer, trees, args.max_len)
        print(json.dumps(row), flush=True)


if __name__ == "__main__":
    main()
