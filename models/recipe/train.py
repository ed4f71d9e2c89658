"""Fine-tune the MiniLM encoder as a 3-way NLI cross-encoder and export it to ONNX.

Usage (see models/README.md for the whole recipe):
  python3 train.py --data DATA_DIR --base BASE_DIR --out WORK_DIR [--epochs 2] [--seed 13] [--drop SOURCE ...]
"""
import argparse
import collections
import json
import os
import random
import time

import torch

from augment import (generate, generate_negation_crossings, generate_respellings, generate_restatements, generate_siblings,
                     held_out_added_detail)
from bert import PairClassifier, load_base_weights, load_exported_weights
from negation_eval import negation_pairs
from nli_files import LABELS, evaluate_sources, extra_evaluate_sources, extra_train_sources, train_sources
from tree_pairs import tree_link_health
from wordpiece import WordPiece

QUOTAS = dict(negation=4200, cohyponym=4000, antonym=1500, hypernym=2000, number=1500, colour=1500, swapped=4000)
# Restatement shapes (augment.generate_restatements), taught beside the contradiction sources in one run.
RESTATEMENT_QUOTAS = dict(identity=1500, conjunct_part=3000, conjunct_added=2000, shorter_reversed=2500,
                          modifier_dropped=2000, modifier_added=1500, synonym=2500, state_antonym=2000)
# A 'not' on one side that does not make a contradiction (augment.generate_negation_crossings).
CROSSING_QUOTAS = dict(ruled_out=3000, left_open=2000, negated_clause_part=2000, negated_clause_added=1500,
                       negation_respelled=1500)
# The same statement reordered or respelled (augment.generate_respellings): entailment both ways.
RESPELLING_QUOTAS = dict(fronted_moved=1800, reported_moved=400, respelt=1500)
# Caps on the larger extra/ files: the templated curriculum probes and the monotonicity pairs would
# otherwise outweigh the natural sentences.
EXTRA_CAPS = dict(monotonicity=8000, **{"curriculum_" + t: 1500 for t in
                  ("boolean", "comparative", "conditional", "counting", "negation", "quantifier")})


def batches(encoded, batch_size, rng, bucket=100):
    """Length-bucketed batches: shuffle, sort within chunks of `bucket` batches, shuffle the batches."""
    order = list(range(len(encoded)))
    rng.shuffle(order)
    out = []
    chunk = batch_size * bucket
    for start in range(0, len(order), chunk):
        part = sorted(order[start: start + chunk], key=lambda i: len(encoded[i][0]))
        out.extend(part[i: i + batch_size] for i in range(0, len(part), batch_size))
    rng.shuffle(out)
    return out


def collate(encoded, index):
    width = max(len(encoded[i][0]) for i in index)
    ids = torch.zeros((len(index), width), dtype=torch.long)
    types = torch.zeros_like(ids)
    mask = torch.zeros_like(ids)
    for row, i in enumerate(index):
        a, t = encoded[i][0], encoded[i][1]
        ids[row, : len(a)] = torch.tensor(a)
        types[row, : len(t)] = torch.tensor(t)
        mask[row, : len(a)] = 1
    labels = torch.tensor([encoded[i][2] for i in index])
    return ids, mask, types, labels


@torch.no_grad()
def evaluate(model, tokenizer, pairs, max_len, batch_size=64):
    model.eval()
    encoded = [(*tokenizer.encode_pair(p, h, max_len), LABELS.index(l)) for p, h, l in pairs]
    order = sorted(range(len(encoded)), key=lambda i: len(encoded[i][0]))
    confusion = [[0] * 3 for _ in range(3)]
    for start in range(0, len(order), batch_size):
        index = order[start: start + batch_size]
        ids, mask, types, labels = collate(encoded, index)
        with torch.autocast("cpu", dtype=torch.bfloat16):
            predicted = model(ids, mask, types).float().argmax(-1)
        for gold, pred in zip(labels.tolist(), predicted.tolist()):
            confusion[gold][pred] += 1
    model.train()
    return confusion


def figures(confusion):
    total = sum(map(sum, confusion))
    out = {"accuracy": round(sum(confusion[i][i] for i in range(3)) / max(total, 1), 4)}
    for i, name in enumerate(LABELS):
        if sum(confusion[i]):
            out[name + "_recall"] = round(confusion[i][i] / sum(confusion[i]), 4)
    # Share of pairs whose gold is not contradiction that the model reads as contradiction.
    not_c = sum(confusion[0]) + sum(confusion[1])
    if not_c:
        out["false_contradiction"] = round((confusion[0][2] + confusion[1][2]) / not_c, 4)
    return out


def monitor_sets(data, seed, extra=None):
    rng = random.Random(seed)
    ev = evaluate_sources(data)
    out = {
        "mnli_matched": rng.sample(ev["mnli_matched"], 1000),
        "snli_dev": rng.sample(ev["snli_dev"], 1000),
        "breaking_nli": rng.sample(ev["breaking_nli"], 500),
        "breaking_nli_entailment": rng.sample([r for r in ev["breaking_nli"] if r[2] == "entailment"], 300),
        "negation_held_out": negation_pairs([p for p, _, _ in ev["snli_dev"]], 300, seed),
        "added_detail_held_out": held_out_added_detail(ev["snli_dev"] + ev["mnli_matched"], seed, 400),
    }
    if extra:
        # 2-way paraphrase pairs: only the false-contradiction rate means anything; 'not_entailment' is read as neutral.
        para = extra_evaluate_sources(extra)["paraphrase_val"]
        out["paraphrase"] = [(p, h, "entailment" if l == "entailment" else "neutral") for p, h, l in para]
    return out


def run_log(out_dir, file_name):
    """A note(**fields) function that prints one JSON line and appends it to out_dir/file_name."""
    log = open(os.path.join(out_dir, file_name), "a", encoding="utf-8")

    def note(**fields):
        fields["time"] = round(time.time(), 1)
        print(json.dumps(fields), flush=True)
        log.write(json.dumps(fields) + "\n")
        log.flush()

    return note


def train_step(model, optimizer, schedule, loss_fn, encoded, index):
    """One optimiser step on one batch; returns the loss. bf16 autocast: the CPU's bf16 matrix units make
    a step several times faster than fp32; master weights and the optimiser stay fp32."""
    ids, mask, types, labels = collate(encoded, index)
    with torch.autocast("cpu", dtype=torch.bfloat16):
        logits = model(ids, mask, types)
    loss = loss_fn(logits.float(), labels)
    optimizer.zero_grad()
    loss.backward()
    torch.nn.utils.clip_grad_norm_(model.parameters(), 1.0)
    optimizer.step()
    schedule.step()
    return loss.item()


def sample_scores(model, tokenizer, monitors, max_len, trees=None):
    out = {name: figures(evaluate(model, tokenizer, rows, max_len)) for name, rows in monitors.items()}
    if trees:
        out["tree_links"] = tree_link_health(model, tokenizer, trees, max_len)
    return out


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--data", required=True)
    ap.add_argument("--base", required=True)
    ap.add_argument("--out", required=True)
    ap.add_argument("--epochs", type=int, default=2)
    ap.add_argument("--batch", type=int, default=32)
    ap.add_argument("--lr", type=float, default=5e-5)
    ap.add_argument("--max-len", type=int, default=128)
    ap.add_argument("--seed", type=int, default=13)
    ap.add_argument("--drop", nargs="*", default=[], help="augmentation sources to leave out (ablation)")
    ap.add_argument("--threads", type=int, default=2)
    ap.add_argument("--extra", help="the extra/ folder of more open pairs (its SOURCES.md 'train' files)")
    ap.add_argument("--holdout", type=int, default=3000, help="labelled pairs kept out of training for calibration")
    ap.add_argument("--trees", help="a tree recording (evaluation only) whose link health is printed per epoch")
    ap.add_argument("--checkpoints", type=int, default=2, help="checkpoints per epoch")
    ap.add_argument("--siblings", type=int, default=6000, help="sibling-hypothesis pairs (augment.generate_siblings)")
    ap.add_argument("--init", help="an fp32 graph export.py wrote (model-fp32.onnx) to continue from, head included")
    ap.add_argument("--respellings", action="store_true", help="add reordered and respelled statements (entailment)")
    ap.add_argument("--subsample", type=int, help="train on this many pairs drawn from the whole mix")
    args = ap.parse_args()

    torch.manual_seed(args.seed)
    torch.set_num_threads(args.threads)
    rng = random.Random(args.seed)
    os.makedirs(args.out, exist_ok=True)
    note = run_log(args.out, "train-log.jsonl")

    tokenizer = WordPiece(os.path.join(args.base, "vocab.txt"))
    train = train_sources(args.data)
    if args.extra:
        extra = extra_train_sources(args.extra, train["taxinli_rest"])
        for name, cap in EXTRA_CAPS.items():
            rng.shuffle(extra[name])
            extra[name] = extra[name][:cap]
        train.update({k: v for k, v in extra.items() if k not in args.drop})
    # The calibration split: labelled pairs drawn from every human-written source, never trained on.
    labelled = [(p, h, l, name) for name, rows in train.items() for p, h, l in rows]
    rng.shuffle(labelled)
    held, pairs = labelled[: args.holdout], labelled[args.holdout:]
    held_keys = {(p, h) for p, h, _, _ in held}
    with open(os.path.join(args.out, "calibration-pairs.jsonl"), "w", encoding="utf-8") as f:
        for p, h, l, name in held:
            f.write(json.dumps({"premise": p, "hypothesis": h, "label": l, "source": name}) + "\n")
    quotas = {k: v for k, v in QUOTAS.items() if k not in args.drop}
    generated = generate(train, args.seed, {k: quotas.get(k, 0) for k in QUOTAS})
    pairs += [g for g in generated if g[3] in quotas]
    if args.extra:
        restatement_quotas = {k: (0 if k in args.drop else v) for k, v in RESTATEMENT_QUOTAS.items()}
        pairs += [g for g in generate_restatements(train, args.seed, restatement_quotas) if g[3] not in args.drop]
        crossing_quotas = {k: (0 if k in args.drop else v) for k, v in CROSSING_QUOTAS.items()}
        pairs += [g for g in generate_negation_crossings(train, args.seed, crossing_quotas) if g[3] not in args.drop]
    if "sibling" not in args.drop:
        pairs += generate_siblings(train, args.seed, args.siblings)
    if args.respellings:
        pairs += [g for g in generate_respellings(train, args.seed, RESPELLING_QUOTAS) if g[3] not in args.drop]
    pairs = [x for x in pairs if (x[0], x[1]) not in held_keys]
    if args.subsample and args.subsample < len(pairs):
        # A short continued run: one full schedule (warm-up and decay) over a random share of every source.
        pairs = random.Random(args.seed + 7).sample(pairs, args.subsample)
    counts = collections.Counter(name for *_, name in pairs)
    note(event="data", counts=counts, total=len(pairs), drop=args.drop, seed=args.seed)
    with open(os.path.join(args.out, "train-pairs.jsonl"), "w", encoding="utf-8") as f:
        for p, h, l, name in pairs:
            f.write(json.dumps({"premise": p, "hypothesis": h, "label": l, "source": name}) + "\n")

    encoded = [(*tokenizer.encode_pair(p, h, args.max_len), LABELS.index(l)) for p, h, l, _ in pairs]
    monitors = monitor_sets(args.data, args.seed, args.extra)
    trees = None
    if args.trees:
        from tree_pairs import read_tree_pairs
        trees = read_tree_pairs(args.trees, sample=400, seed=args.seed)

    if args.init:
        # A continued run: same data split (same seed), but the batches in a new order.
        model = load_exported_weights(PairClassifier(), args.init)
        rng = random.Random(args.seed + 1000)
        note(event="init", file=args.init, **sample_scores(model, tokenizer, monitors, args.max_len, trees))
    else:
        model = load_base_weights(PairClassifier(), os.path.join(args.base, "model.onnx"))
    model.train()
    # The word-embedding table is frozen: it is most of the parameters, its update dominates a CPU step,
    # and the augmentations rely on the pretrained relations between words.
    model.word.weight.requires_grad_(False)
    no_decay = ("bias", "norm")
    groups = [
        {"params": [p for n, p in model.named_parameters() if p.requires_grad and not any(k in n for k in no_decay)], "weight_decay": 0.01},
        {"params": [p for n, p in model.named_parameters() if p.requires_grad and any(k in n for k in no_decay)], "weight_decay": 0.0},
    ]
    optimizer = torch.optim.AdamW(groups, lr=args.lr)
    steps_per_epoch = (len(encoded) + args.batch - 1) // args.batch
    total_steps = steps_per_epoch * args.epochs
    warmup = int(0.06 * total_steps)
    schedule = torch.optim.lr_scheduler.LambdaLR(
        optimizer, lambda s: min((s + 1) / max(warmup, 1), max(0.0, (total_steps - s) / max(total_steps - warmup, 1))))
    loss_fn = torch.nn.CrossEntropyLoss()

    step = 0
    started = time.time()
    every = max(steps_per_epoch // max(args.checkpoints, 1), 1)
    for epoch in range(1, args.epochs + 1):
        running = 0.0
        for index in batches(encoded, args.batch, rng):
            running += train_step(model, optimizer, schedule, loss_fn, encoded, index)
            step += 1
            if step % 25 == 0:
                note(event="step", epoch=epoch, step=step, of=total_steps, loss=round(running / 25, 4),
                     lr=schedule.get_last_lr()[0], elapsed_s=round(time.time() - started))
                running = 0.0
            if step % every == 0 and step % steps_per_epoch != 0:
                name = f"step{step}.pt"
                torch.save(model.state_dict(), os.path.join(args.out, name))
                note(event="checkpoint", file=name, **sample_scores(model, tokenizer, monitors, args.max_len, trees))
        torch.save(model.state_dict(), os.path.join(args.out, f"epoch{epoch}.pt"))
        note(event="epoch", epoch=epoch, file=f"epoch{epoch}.pt", **sample_scores(model, tokenizer, monitors, args.max_len, trees))
    torch.save(model.state_dict(), os.path.join(args.out, "final.pt"))
    note(event="done", elapsed_s=round(time.time() - started))


if __name__ == "__main__":
    main()
