"""Builds a randomly initialised decoder-only model folder in the layout ONNX Runtime GenAI reads:
genai_config.json, model.onnx, tokenizer.json, tokenizer_config.json.

  make_decoder.py tiny  OUT   the test model (a few hundred KB) plus reference/ for the C# tests
  make_decoder.py bench OUT   a model of a small published size (about 135M parameters) for the benchmark

The weights are random: the model writes meaningless text. It exists to check the plumbing (loading,
the key/value cache, sampling, answer probabilities) against references computed here in PyTorch.
"""

import json
import os
import sys

import torch

from bpe import Tokenizer, train
from decoder import Decoder, Shape, export, genai_config

EOS = "<|endoftext|>"

# An invented training text for the byte-level BPE merges: few-shot answer and explanation prompts
# in the shape the engine uses, so that the answer words become single tokens.
CORPUS = [
    "Answer each question with True or False.",
    "Q: Lanterns on Mossberry Lane are lit at dusk? True or False?\nA: True",
    "Q: The Mossberry ferry crosses the lake twice a day? True or False?\nA: False",
    "Q: Every bakery in Thornvale opens on Sunday? True or False?\nA: False",
    "Q: The clock tower of Thornvale has four faces? True or False?\nA: True",
    "Explain the given answer to each question in one sentence.",
    "A: True, because the lamplighter walks the lane every evening.",
    "A: False, because the ferry only sails in the morning.",
    "Rewrite each statement so that it says the opposite.",
    "Statement: The lake is frozen in winter.\nOpposite: The lake is not frozen in winter.",
    "true false TRUE FALSE true, false. It is not true that the bridge is closed.",
] * 8

TRUE_WORDS = ["True", "true", "TRUE"]
FALSE_WORDS = ["False", "false", "FALSE"]

ANSWER_PROMPT = (
    "Answer each question with True or False.\n\n"
    "Q: Lanterns on Mossberry Lane are lit at dusk? True or False?\nA: True\n\n"
    "Q: The Mossberry ferry crosses the lake twice a day? True or False?\nA: False\n\n"
    "Q: {}? True or False?\nA:"
)
STATEMENTS = ["The clock tower of Thornvale has four faces", "Every bakery in Thornvale opens on Sunday",
              "The lake is frozen in winter"]
GREEDY_PROMPTS = ["Q: The lake is frozen in winter? True or False?\nA: True, because",
                  "Statement: The bridge is closed.\nOpposite:"]


def printable(text):
    return all(c == "\n" or " " <= c <= "~" for c in text)


def build(shape: Shape, tokenizer: Tokenizer, seed):
    torch.manual_seed(seed)
    model = Decoder(shape).eval()
    with torch.no_grad():
        # A random head gives a nearly flat next-token distribution; a sharper one keeps greedy
        # references clear of float rounding and makes nucleus truncation visible.
        model.head.weight.mul_(4.0)
        # Random weights would write arbitrary bytes; the head's bias keeps the text printable ASCII
        # (and keeps rows past the tokenizer's vocabulary, in the benchmark model, out of reach).
        for i in range(shape.vocab):
            keep = i < tokenizer.size and (i in tokenizer.specials.values() or printable(tokenizer.decode([i])))
            model.head.bias[i] = 0.0 if keep else -30.0
    return model


def variant_sequences(tokenizer, prompt_ids, prompt, words):
    """Token sequences of each answer word (with and without a leading space) as it would follow the
    prompt; a sequence another one extends is kept once, as the shorter one."""
    found = []
    for word in words:
        for variant in (word, " " + word):
            full = tokenizer.encode(prompt + variant)
            seq = full[len(prompt_ids):] if full[:len(prompt_ids)] == prompt_ids else tokenizer.encode(variant)
            found.append(tuple(seq))
    kept = []
    for seq in sorted(set(found), key=len):
        if not any(seq[:len(k)] == k for k in kept):
            kept.append(seq)
    return kept


def mass(model, prompt_ids, sequences):
    total = 0.0
    for seq in sequences:
        p = 1.0
        for i, token in enumerate(seq):
            p *= torch.softmax(model.next_logits(prompt_ids + list(seq[:i])).double(), -1)[token].item()
        total += p
    return total


def greedy(model, ids, max_tokens, eos_id):
    out, margins = [], []
    for _ in range(max_tokens):
        logits = model.next_logits(ids + out)
        top = torch.topk(logits, 2)
        margins.append((top.values[0] - top.values[1]).item())
        token = top.indices[0].item()
        out.append(token)
        if token == eos_id:
            break
    return out, min(margins)


def references(model, tokenizer, eos_id):
    ref = {"tokens": [], "greedy": [], "answers": []}
    for text in CORPUS[:6] + [" True", " False", "true", " TRUE"]:
        ref["tokens"].append({"text": text, "ids": tokenizer.encode(text)})
    with torch.no_grad():
        for prompt in GREEDY_PROMPTS:
            ids = tokenizer.encode(prompt)
            out, margin = greedy(model, ids, 24, eos_id)
            # A reference the C# runtime must reproduce exactly needs a clear winner at every step.
            assert margin > 1e-3, f"greedy margin {margin} too small for a stable reference"
            ref["greedy"].append({"prompt": prompt, "prompt_ids": ids, "max_tokens": 24, "ids": out,
                                  "text": tokenizer.decode([t for t in out if t != eos_id]), "min_logit_margin": margin})
        for statement in STATEMENTS:
            prompt = ANSWER_PROMPT.format(statement)
            ids = tokenizer.encode(prompt)
            probabilities = torch.softmax(model.next_logits(ids).double(), -1)
            true_seqs = variant_sequences(tokenizer, ids, prompt, TRUE_WORDS)
            false_seqs = variant_sequences(tokenizer, ids, prompt, FALSE_WORDS)
            p_true, p_false = mass(model, ids, true_seqs), mass(model, ids, false_seqs)
            ref["answers"].append({
                "statement": statement, "prompt": prompt, "prompt_ids": ids,
                "next_token_probabilities": [round(p, 9) for p in probabilities.tolist()],
                "true_sequences": [list(s) for s in true_seqs], "false_sequences": [list(s) for s in false_seqs],
                "true_mass": p_true, "false_mass": p_false, "p_true": p_true / (p_true + p_false),
            })
    return ref


def main(kind, out):
    torch.set_num_threads(os.cpu_count() or 1)
    merges = train(CORPUS, 240)
    tokenizer = Tokenizer(merges, [EOS])
    eos_id = tokenizer.specials[EOS]
    if kind == "tiny":
        shape = Shape(vocab=tokenizer.size, hidden=64, layers=2, heads=4, kv_heads=2, ff=192, context=1024)
        seed = 5
    elif kind == "bench":
        # The size of a small published decoder (576 wide, 30 layers, 9 heads, 3 key/value heads).
        # The vocabulary rows past the recipe's tokenizer are never produced (see build) but cost what
        # a real vocabulary of that size costs.
        shape = Shape(vocab=49152, hidden=576, layers=30, heads=9, kv_heads=3, ff=1536, context=2048)
        seed = 7
    else:
        raise SystemExit("usage: make_decoder.py tiny|bench OUT")
    os.makedirs(out, exist_ok=True)
    model = build(shape, tokenizer, seed)
    export(model, f"{out}/model.onnx", external_data=(kind == "bench"))
    tokenizer.write(out, EOS)
    with open(f"{out}/genai_config.json", "w") as f:
        json.dump(genai_config(shape, eos_id), f, indent=1)
    if kind == "tiny":
        os.makedirs(f"{out}/reference", exist_ok=True)
        with open(f"{out}/reference/reference.json", "w") as f:
            json.dump(references(model, tokenizer, eos_id), f, indent=1)
    print(f"wrote {out}: {sum(p.numel() for p in model.parameters())} parameters, vocabulary {tokenizer.size}")


if __name__ == "__main__":
    main(*sys.argv[1:3])
