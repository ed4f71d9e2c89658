"""Link health on real explanation trees (evaluation only): how often the model reads two first-level
explanations written for the same answer as contradicting each other, and how often a link between the
claim and a first-level explanation goes against the answer that explanation was written for."""
import gzip
import json
import random

import torch

from nli_files import LABELS


def _key(text):
    return " ".join(text.lower().split()).rstrip(".!?")


def read_tree_pairs(path, sample=None, seed=13):
    """(claim, {True: [explanations], False: [...]}) per claim of a tree recording, echoes and repeats dropped."""
    opener = gzip.open if path.endswith(".gz") else open
    trees = {}
    with opener(path, "rt", encoding="utf-8") as f:
        for line in f:
            obj = json.loads(line)
            req = obj["request"]
            if req["kind"] != "generate" or req["purpose"] != "abduction" or req["n"] < 2:
                continue  # depth 1 samples several explanations; deeper levels ask for one
            subject = req["subject"]
            seen = {_key(subject)}
            kept = []
            for text in obj["response"]["texts"][: req["n"]]:
                if _key(text) not in seen:
                    seen.add(_key(text))
                    kept.append(text)
            trees.setdefault(subject, {})[req["answer"]] = kept
    items = sorted(trees.items())
    if sample and sample < len(items):
        items = random.Random(seed).sample(items, sample)
    return items


@torch.no_grad()
def predict(model, tokenizer, pairs, max_len, batch_size=64):
    model.eval()
    out = []
    for start in range(0, len(pairs), batch_size):
        chunk = pairs[start: start + batch_size]
        encoded = [tokenizer.encode_pair(p, h, max_len) for p, h in chunk]
        width = max(len(e[0]) for e in encoded)
        ids = torch.zeros((len(chunk), width), dtype=torch.long)
        types, mask = torch.zeros_like(ids), torch.zeros_like(ids)
        for row, (a, t) in enumerate(encoded):
            ids[row, : len(a)] = torch.tensor(a)
            types[row, : len(t)] = torch.tensor(t)
            mask[row, : len(a)] = 1
        with torch.autocast("cpu", dtype=torch.bfloat16):
            out.extend(LABELS[i] for i in model(ids, mask, types).float().argmax(-1).tolist())
    model.train()
    return out


def tree_link_health(model, tokenizer, trees, max_len):
    same, claim_links = [], []
    for claim, by_answer in trees:
        for answer, texts in by_answer.items():
            same += [(a, b) for a in texts for b in texts if a != b]
            claim_links += [((claim, e), answer) for e in texts] + [((e, claim), answer) for e in texts]
    same_labels = predict(model, tokenizer, same, max_len)
    claim_labels = predict(model, tokenizer, [p for p, _ in claim_links], max_len)
    linked = [l for l in same_labels if l != "neutral"]
    against = [(l == "contradiction") == answer for l, (_, answer) in zip(claim_labels, claim_links) if l != "neutral"]
    return {
        "same_answer_contradiction_share": round(sum(l == "contradiction" for l in linked) / max(len(linked), 1), 4),
        "same_answer_links": len(linked),
        "claim_links_against_answer_share": round(sum(against) / max(len(against), 1), 4),
        "claim_links": len(against),
    }
