"""Second training stage: continue from the first stage's checkpoint on pairs that teach that small
meaning-preserving edits are not contradictions (augment.generate_refinement), mixed with a replay of
first-stage pairs so that nothing learned there is lost.

  python3 refine.py --data DATA_DIR --base BASE_DIR --init WORK/run/final.pt --first WORK/run/train-pairs.jsonl --out WORK/refine
"""
import argparse
import collections
import json
import os
import random
import time

import torch

from augment import generate_refinement
from bert import PairClassifier
from nli_files import LABELS, train_sources
from train import batches, monitor_sets, run_log, sample_scores, train_step
from wordpiece import WordPiece

QUOTAS = dict(deletion=4000, insertion=2000, synonym=2000, identity=1000)
REPLAY = 9000


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--data", required=True)
    ap.add_argument("--base", required=True)
    ap.add_argument("--init", required=True)
    ap.add_argument("--first", required=True, help="the first stage's train-pairs.jsonl")
    ap.add_argument("--out", required=True)
    ap.add_argument("--lr", type=float, default=2e-5)
    ap.add_argument("--batch", type=int, default=32)
    ap.add_argument("--max-len", type=int, default=128)
    ap.add_argument("--seed", type=int, default=13)
    ap.add_argument("--threads", type=int, default=2)
    args = ap.parse_args()
    torch.manual_seed(args.seed)
    torch.set_num_threads(args.threads)
    rng = random.Random(args.seed)
    os.makedirs(args.out, exist_ok=True)
    note = run_log(args.out, "refine-log.jsonl")

    tokenizer = WordPiece(os.path.join(args.base, "vocab.txt"))
    train = train_sources(args.data)
    pairs = [tuple(g) for g in generate_refinement(train, args.seed, QUOTAS)]
    with open(args.first, encoding="utf-8") as f:
        first = [json.loads(line) for line in f]
    pairs += [(r["premise"], r["hypothesis"], r["label"], "replay:" + r["source"]) for r in rng.sample(first, REPLAY)]
    note(event="data", counts=collections.Counter(p[3].split(":")[0] for p in pairs), total=len(pairs))
    with open(os.path.join(args.out, "refine-pairs.jsonl"), "w", encoding="utf-8") as f:
        for p, h, l, name in pairs:
            f.write(json.dumps({"premise": p, "hypothesis": h, "label": l, "source": name}) + "\n")
    encoded = [(*tokenizer.encode_pair(p, h, args.max_len), LABELS.index(l)) for p, h, l, _ in pairs]

    model = PairClassifier()
    model.load_state_dict(torch.load(args.init))
    model.train()
    model.word.weight.requires_grad_(False)
    optimizer = torch.optim.AdamW([p for p in model.parameters() if p.requires_grad], lr=args.lr, weight_decay=0.01)
    plan = batches(encoded, args.batch, rng)
    schedule = torch.optim.lr_scheduler.LambdaLR(optimizer, lambda s: max(0.0, 1 - s / len(plan)))
    loss_fn = torch.nn.CrossEntropyLoss()
    started, running = time.time(), 0.0
    for step, index in enumerate(plan, 1):
        running += train_step(model, optimizer, schedule, loss_fn, encoded, index)
        if step % 25 == 0:
            note(event="step", step=step, of=len(plan), loss=round(running / 25, 4), elapsed_s=round(time.time() - started))
            running = 0.0
    torch.save(model.state_dict(), os.path.join(args.out, "final.pt"))
    note(event="done", **sample_scores(model, tokenizer, monitor_sets(args.data, args.seed), args.max_len))


if __name__ == "__main__":
    main()
