"""Reference uncased WordPiece tokenizer for the recipe (and for the C# parity test data).

Follows the usual BERT uncased pre-processing (common practice): drop control characters, map
whitespace to spaces, put spaces around CJK ideographs, lower-case, strip accents (NFD, drop Mn),
split on punctuation, then greedy longest-match-first WordPiece with '##' continuations.
"""
import unicodedata


def _is_control(ch):
    if ch in "\t\n\r":
        return False
    return unicodedata.category(ch).startswith("C")


def _is_whitespace(ch):
    return ch in " \t\n\r" or unicodedata.category(ch) == "Zs"


def _is_punctuation(ch):
    cp = ord(ch)
    if 33 <= cp <= 47 or 58 <= cp <= 64 or 91 <= cp <= 96 or 123 <= cp <= 126:
        return True
    return unicodedata.category(ch).startswith("P")


def _is_cjk(cp):
    return (0x4E00 <= cp <= 0x9FFF or 0x3400 <= cp <= 0x4DBF or 0x20000 <= cp <= 0x2A6DF
            or 0x2A700 <= cp <= 0x2B73F or 0x2B740 <= cp <= 0x2B81F or 0x2B820 <= cp <= 0x2CEAF
            or 0xF900 <= cp <= 0xFAFF or 0x2F800 <= cp <= 0x2FA1F)


class WordPiece:
    def __init__(self, vocab_path, max_chars_per_word=100):
        with open(vocab_path, encoding="utf-8") as f:
            self.vocab = {line.rstrip("\n"): i for i, line in enumerate(f)}
        self.max_chars = max_chars_per_word
        self.cls, self.sep, self.unk, self.pad = (self.vocab[t] for t in ("[CLS]", "[SEP]", "[UNK]", "[PAD]"))

    def basic(self, text):
        out = []
        for ch in text:
            cp = ord(ch)
            if cp == 0 or cp == 0xFFFD or _is_control(ch):
                continue
            if _is_whitespace(ch):
                out.append(" ")
            elif _is_cjk(cp):
                out.append(" " + ch + " ")
            else:
                out.append(ch)
        words = []
        for token in "".join(out).split():
            token = unicodedata.normalize("NFD", token.lower())
            token = "".join(c for c in token if unicodedata.category(c) != "Mn")
            current = ""
            for ch in token:
                if _is_punctuation(ch):
                    if current:
                        words.append(current)
                        current = ""
                    words.append(ch)
                else:
                    current += ch
            if current:
                words.append(current)
        return words

    def word_ids(self, word):
        if len(word) > self.max_chars:
            return [self.unk]
        ids, start = [], 0
        while start < len(word):
            end, found = len(word), None
            while start < end:
                piece = word[start:end] if start == 0 else "##" + word[start:end]
                if piece in self.vocab:
                    found = self.vocab[piece]
                    break
                end -= 1
            if found is None:
                return [self.unk]
            ids.append(found)
            start = end
        return ids

    def encode(self, text):
        return [i for w in self.basic(text) for i in self.word_ids(w)]

    def encode_pair(self, a, b, max_len=128):
        """[CLS] a [SEP] b [SEP], truncating the longer side first, with token type ids."""
        ta, tb = self.encode(a), self.encode(b)
        budget = max_len - 3
        while len(ta) + len(tb) > budget:
            if len(ta) >= len(tb):
                ta.pop()
            else:
                tb.pop()
        ids = [self.cls] + ta + [self.sep] + tb + [self.sep]
        types = [0] * (len(ta) + 2) + [1] * (len(tb) + 1)
        return ids, types
