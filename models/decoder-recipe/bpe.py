"""Byte-level BPE: a small trainer, an encoder, and the tokenizer files ONNX Runtime GenAI reads.

The pre-tokenizer is the usual byte-level split (contractions, letter runs, digit runs, punctuation
runs, whitespace), written here with ASCII classes: the recipe only trains on and encodes ASCII text
(asserted), where these classes agree with the Unicode classes the C# side uses.
"""

import json
import re
from collections import Counter

SPLIT = re.compile(r"""'s|'t|'re|'ve|'m|'ll|'d| ?[A-Za-z]+| ?[0-9]+| ?[^\sA-Za-z0-9]+|\s+(?!\S)|\s+""")


def byte_symbols():
    """The reversible byte -> printable character table of byte-level BPE (common practice)."""
    printable = list(range(ord("!"), ord("~") + 1)) + list(range(0xA1, 0xAC + 1)) + list(range(0xAE, 0xFF + 1))
    table = {}
    extra = 0
    for b in range(256):
        if b in printable:
            table[b] = chr(b)
        else:
            table[b] = chr(256 + extra)
            extra += 1
    return table


BYTES = byte_symbols()


def pretokenize(text):
    assert text.isascii(), "the recipe's pre-tokenizer covers ASCII text only"
    return ["".join(BYTES[b] for b in piece.encode("utf-8")) for piece in SPLIT.findall(text)]


def train(corpus, merges_wanted):
    """Most-frequent-pair merges over the pre-tokenized corpus; ties go to the smaller pair."""
    words = Counter()
    for line in corpus:
        words.update(pretokenize(line))
    symbols = {word: list(word) for word in words}
    merges = []
    for _ in range(merges_wanted):
        pairs = Counter()
        for word, count in words.items():
            parts = symbols[word]
            for a, b in zip(parts, parts[1:]):
                pairs[(a, b)] += count
        if not pairs:
            break
        best = min(pairs.items(), key=lambda item: (-item[1], item[0]))[0]
        merges.append(best)
        for word in words:
            symbols[word] = merge_once(symbols[word], best)
    return merges


def merge_once(parts, pair):
    out = []
    i = 0
    while i < len(parts):
        if i + 1 < len(parts) and (parts[i], parts[i + 1]) == pair:
            out.append(parts[i] + parts[i + 1])
            i += 2
        else:
            out.append(parts[i])
            i += 1
    return out


class Tokenizer:
    def __init__(self, merges, specials):
        self.merges = merges
        self.rank = {pair: i for i, pair in enumerate(merges)}
        self.vocab = {BYTES[b]: b for b in range(256)}
        for a, b in merges:
            self.vocab.setdefault(a + b, len(self.vocab))
        self.specials = {}
        for token in specials:
            self.specials[token] = len(self.vocab) + len(self.specials)
        self.size = len(self.vocab) + len(self.specials)
        self.inverse = {i: s for s, i in self.vocab.items()}

    def encode(self, text):
        ids = []
        for piece in pretokenize(text):
            parts = list(piece)
            while len(parts) > 1:
                ranked = [(self.rank.get(pair, len(self.rank)), pair) for pair in zip(parts, parts[1:])]
                rank, pair = min(ranked)
                if rank == len(self.rank):
                    break
                parts = merge_once(parts, pair)
            ids.extend(self.vocab[p] for p in parts)
        return ids

    def decode(self, ids):
        back = {c: b for b, c in BYTES.items()}
        text = "".join(self.inverse[i] for i in ids if i in self.inverse)
        return bytes(back[c] for c in text).decode("utf-8", errors="replace")

    def write(self, folder, eos, chat_template=None):
        """tokenizer.json (the JSON tokenizer format) and tokenizer_config.json."""
        added = [
            {"id": i, "content": s, "single_word": False, "lstrip": False, "rstrip": False, "normalized": False, "special": True}
            for s, i in self.specials.items()
        ]
        byte_level = {"type": "ByteLevel", "add_prefix_space": False, "trim_offsets": True, "use_regex": True}
        spec = {
            "version": "1.0",
            "truncation": None,
            "padding": None,
            "added_tokens": added,
            "normalizer": None,
            "pre_tokenizer": byte_level,
            "post_processor": byte_level,
            "decoder": byte_level,
            "model": {
                "type": "BPE",
                "dropout": None,
                "unk_token": None,
                "continuing_subword_prefix": "",
                "end_of_word_suffix": "",
                "fuse_unk": False,
                "byte_fallback": False,
                "vocab": self.vocab,
                "merges": [f"{a} {b}" for a, b in self.merges],
            },
        }
        with open(f"{folder}/tokenizer.json", "w", encoding="utf-8") as f:
            json.dump(spec, f, ensure_ascii=False, indent=1)
        config = {
            "tokenizer_class": "GPT2Tokenizer",
            "add_bos_token": False,
            "add_prefix_space": False,
            "bos_token": eos,
            "eos_token": eos,
            "unk_token": eos,
            "model_max_length": 2048,
        }
        if chat_template is not None:
            config["chat_template"] = chat_template
        with open(f"{folder}/tokenizer_config.json", "w", encoding="utf-8") as f:
            json.dump(config, f, indent=1)
