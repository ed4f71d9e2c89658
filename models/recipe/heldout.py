"""Held-out evaluation pairs of the shapes an explanation tree is full of, written from evaluation files only
(nothing here is trained on):
  paraphrase     the entailed paraphrase pairs of the syntactic-variation task (evaluation-only in extra/SOURCES.md)
  added_detail   a dev sentence with an added clause or modifier against the sentence (entailment) and the
                 reverse (neutral), built like the training shapes but from MultiNLI matched / SNLI dev sentences
  negation       explicit negations in forms the training data never uses (negation_eval.py)
  antonym        an everyday state word or a WordNet antonym swapped in an SNLI dev sentence (contradiction)
"""
import random

from augment import WordNet, antonym_swap, held_out_added_detail, substitutions
from negation_eval import negation_pairs
from nli_files import evaluate_sources, extra_evaluate_sources


def antonym_pairs(premises, count, seed):
    rng = random.Random(seed)
    wordnet = WordNet()
    pool = sorted({p for p in premises if 4 <= len(p.split()) <= 25})
    rng.shuffle(pool)
    out = []
    for p in pool:
        if len(out) >= count:
            break
        h = antonym_swap(p, rng) if len(out) % 2 == 0 else substitutions(p, wordnet.antonyms, rng, nouns_only=False)
        if h and h != p:
            out.append((p, h, "contradiction") if rng.random() < 0.5 else (h, p, "contradiction"))
    return out


def held_out_sets(data, extra, seed):
    ev = evaluate_sources(data)
    para = extra_evaluate_sources(extra)
    paraphrase = [(p, h, l) for p, h, l in para["paraphrase_val"] + para["paraphrase_train"] if l == "entailment"]
    return {
        "paraphrase": paraphrase,
        "added_detail": held_out_added_detail(ev["snli_dev"] + ev["mnli_matched"], seed, 2000),
        "negation": negation_pairs([p for p, _, _ in ev["snli_dev"]], 1000, seed),
        "antonym": antonym_pairs([p for p, _, _ in ev["snli_dev"]], 1000, seed),
    }
