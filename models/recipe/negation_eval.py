"""Held-out negation check: explicit negations of premises from an evaluate file, written in forms
that the generated training data never uses (contractions and prefixes absent from augment.py)."""
import random

from augment import lower_first, sentence_case

HELD_OUT_PREFIXES = ["It is untrue that {}", "It is wrong to say that {}", "Nobody can truthfully say that {}"]
CONTRACTIONS = {"is": "isn't", "are": "aren't", "was": "wasn't", "were": "weren't", "can": "can't",
                "will": "won't", "has": "hasn't", "have": "haven't"}


def contracted_negation(sentence):
    words = sentence.split(" ")
    for i, w in enumerate(words):
        if w.lower() in CONTRACTIONS and i > 0:
            return " ".join(words[:i] + [CONTRACTIONS[w.lower()]] + words[i + 1:])
    return None


def negation_pairs(premises, count, seed):
    """(premise, negated, 'contradiction') pairs, half contractions, half held-out prefixes, and for
    a quarter of them the direction swapped."""
    rng = random.Random(seed)
    pool = sorted({p for p in premises if 4 <= len(p.split()) <= 25})
    rng.shuffle(pool)
    out = []
    for p in pool:
        if len(out) >= count:
            break
        if len(out) % 2 == 0:
            h = contracted_negation(p)
            if not h:
                continue
        else:
            h = sentence_case(rng.choice(HELD_OUT_PREFIXES).format(lower_first(p)))
        out.append((h, p, "contradiction") if len(out) % 4 == 3 else (p, h, "contradiction"))
    return out
