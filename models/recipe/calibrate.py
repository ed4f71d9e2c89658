"""Temperature scaling (one scalar T dividing the logits before the softmax), fitted by minimising the
negative log-likelihood of held-out labelled pairs, and the expected calibration error it gives.
The pairs are the training sources' hold-out (train.py --holdout), never trained on; no evaluation file is used
for fitting."""
import math

import torch

from nli_files import LABELS

BINS = 15  # equal-width confidence bins (common practice)


@torch.no_grad()
def logits_of(model, tokenizer, pairs, max_len, batch_size=64):
    """Logits in input order, float64, from the model as given (fp32 or an int8 emulation)."""
    model.eval()
    encoded = [tokenizer.encode_pair(p, h, max_len) for p, h, *_ in pairs]
    order = sorted(range(len(encoded)), key=lambda i: len(encoded[i][0]))
    out = torch.zeros((len(pairs), 3), dtype=torch.float64)
    for start in range(0, len(order), batch_size):
        index = order[start: start + batch_size]
        width = max(len(encoded[i][0]) for i in index)
        ids = torch.zeros((len(index), width), dtype=torch.long)
        types, mask = torch.zeros_like(ids), torch.zeros_like(ids)
        for row, i in enumerate(index):
            a, t = encoded[i]
            ids[row, : len(a)] = torch.tensor(a)
            types[row, : len(t)] = torch.tensor(t)
            mask[row, : len(a)] = 1
        out[index] = model(ids, mask, types).double()
    return out


def nll(logits, gold, temperature):
    return torch.nn.functional.cross_entropy(logits / temperature, gold).item()


def fit_temperature(logits, gold, low=0.05, high=20.0, steps=80):
    """Golden-section search on log T: the NLL of temperature scaling is unimodal in T."""
    a, b = math.log(low), math.log(high)
    ratio = (math.sqrt(5) - 1) / 2
    c, d = b - ratio * (b - a), a + ratio * (b - a)
    for _ in range(steps):
        if nll(logits, gold, math.exp(c)) < nll(logits, gold, math.exp(d)):
            b, d = d, c
            c = b - ratio * (b - a)
        else:
            a, c = c, d
            d = a + ratio * (b - a)
    return math.exp((a + b) / 2)


def expected_calibration_error(logits, gold, temperature=1.0, bins=BINS):
    """Same binning as the C# CalibrationBins: (k/B, (k+1)/B], probability 0 joins the first bin."""
    probs = torch.softmax(logits / temperature, dim=-1)
    confidence, predicted = probs.max(dim=-1)
    correct = (predicted == gold).double()
    index = torch.clamp(torch.ceil(confidence * bins).long() - 1, 0, bins - 1)
    error = 0.0
    for b in range(bins):
        members = index == b
        n = int(members.sum())
        if n:
            error += abs(correct[members].mean().item() - confidence[members].mean().item()) * n
    return error / len(gold)


def gold_of(pairs):
    return torch.tensor([LABELS.index(l) for _, _, l, *_ in pairs])
