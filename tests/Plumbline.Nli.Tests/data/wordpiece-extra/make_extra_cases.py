"""Writes cases.jsonl: texts that stress Unicode handling, with the token ids the model recipe's reference
WordPiece tokenizer (models/recipe/wordpiece.py) gives for them over models/nli-minilm-int8/vocab.txt.

    python3 make_extra_cases.py   (run from this folder, with the model directory in place)
"""
import hashlib
import json
import os
import sys

ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", "..", "..", ".."))
sys.path.insert(0, os.path.join(ROOT, "models", "recipe"))
from wordpiece import WordPiece  # noqa: E402

VOCAB = os.path.join(ROOT, "models", "nli-minilm-int8", "vocab.txt")

TEXTS = [
    "ΟΔΟΣ ΚΑΙ ΣΟΦΙΑ ΣΑΣ.",
    "Σ alone, ΑΣ' and ΟΔΟΣΑ",
    "한국어 텍스트입니다",
    "line\u2028separator and paragraph\u2029separator",
    "no\u00a0break and thin\u2009space and ideographic\u3000space",
    "zero\u200bwidth, joiner\u200dhere, soft\u00adhyphen",
    "combining e\u0301 and a\u0308 marks",
    "İstanbul and ĲSSEL and ǅ",
    "ﬁne ligature and ＦＵＬＬ width",
    "Straße, ß and ẞ",
    "Ёлка и Йога",
    "Tiếng Việt có dấu",
    "emoji 👍🏽 and flags 🇫🇷 and 🫨",
    "text with [SEP] and [CLS] inside",
    "𠀀 ext-B ideograph and 日本 kanji and カタカナ",
    "bell\x07 and\x0b vertical tab and\x85 next line",
    "\ufeffbyte order mark",
    "é" * 101,
    "x" * 100,
    "Ω Å K angstrom and kelvin signs",
    "Ⅻ roman numeral, ½ fraction, ² superscript",
    "مرحبا بالعالم and שלום",
    "नमस्ते दुनिया",
    "a\u0301\u0327\u0300 stacked marks",
]

tokenizer = WordPiece(VOCAB)
digest = hashlib.sha256(open(VOCAB, "rb").read()).hexdigest()
with open("cases.jsonl", "w", encoding="utf-8") as out:
    out.write(json.dumps({"vocab_sha256": digest}) + "\n")
    for text in TEXTS:
        out.write(json.dumps({"text": text, "ids": tokenizer.encode(text)}, ensure_ascii=True) + "\n")
