"""Builds the tiny SentencePiece NLI models that the C# tests load, and their reference data.

  models/tiny-nli/build.sh          (installs the Debian packages, then runs this file)

Three model folders, each laid out like a public NLI export of its family, with random weights:

  deberta-v3/      Unigram spm.model ([PAD]=0 [CLS]=1 [SEP]=2 [UNK]=3), config.json + tokenizer_config.json,
                   model.onnx with inputs input_ids, attention_mask (no token_type_ids, as exports of models
                   with type_vocab_size 0 have), output logits.
  deberta-v3-bpe/  BPE spm.model with two user-defined symbols, described by our own nli-model.json card
                   (labels left to config.json), model.onnx that also takes token_type_ids.
  xlm-roberta/     Unigram sentencepiece.bpe.model with the sentencepiece default pieces (<unk>=0 <s>=1 </s>=2,
                   no <pad>), so ids carry the fairseq offset: <s>=0 <pad>=1 </s>=2 <unk>=3, piece i -> i+1.
                   config.json model_type xlm-roberta; model.onnx with input_ids, attention_mask.

Every tokenizer is trained by spm_train on corpus.txt (an invented text). Each folder gets reference.jsonl:
per sentence pair the input ids and token type ids (sentencepiece's own encoder on each side, then the
pair frame and longest-side-first truncation below) and the logits PyTorch computes for those ids; and
segments.jsonl: sentencepiece's ids for 300 seeded random texts (no frame, no offset).
"""
import json
import os
import random
import subprocess
import sys

import sentencepiece
import torch
from torch import nn

HERE = os.path.dirname(os.path.abspath(__file__))
CORPUS = os.path.join(HERE, "corpus.txt")
VOCAB = 500
HIDDEN, HEADS, LAYERS, INTERMEDIATE = 32, 2, 2, 64
# Tokenizer configs write this sentinel when a checkpoint sets no length limit (common practice).
NO_LIMIT = 1000000000000000019884624838656

LONG = " ".join(open(CORPUS, encoding="utf-8").read().split("\n")[:6])

# Invented pairs: accents, numbers, punctuation, whitespace, empty sides, non-Latin scripts, characters that
# NFKC folds, characters the tiny vocabularies do not know, text that looks like special tokens, and pairs
# long enough to be cut.
PAIRS = [
    ("The ferry leaves at 07:45 every morning.", "The ferry leaves in the morning."),
    ("Aurélie's crème brûlée is famous in Zürich.", "NAÏVE CAFÉ, São Tomé, Ångström"),
    ("Tickets cost 12 crowns; 1,250.99 in total, 60% off.", "3.50 vs 3.20 (2024-05-17)"),
    ("\"Is the bridge open?\" — \"Only at low tide…\"", "(Yes!) [no] {maybe}; a/b & c|d ~ e"),
    ("", "An empty premise still gets scored."),
    ("An empty hypothesis follows.", ""),
    ("", ""),
    ("  spaced   out\ttext\n", "tab\there\u00a0and\u2003wide spaces"),
    ("Ο φάρος χτίστηκε το 1862.", "Маяк построили в 1862 году."),
    ("灯台は今も使われています。", "フェリーは毎朝出発します。"),
    ("한국어 텍스트 😀 ❄", "Unknown ☃ snowman"),
    ("ＦＵＬＬ ｗｉｄｔｈ １２３ and ﬁne ﬂour ①", "x² ½ Ⅸ ㎞"),
    ("e\u0301te\u0301 cafe\u0301", "été café"),
    ("[CLS] <s> </s> [SEP]", "<pad> [UNK] <unk> [MASK]"),
    ("It was −12 °C, 7 km away.", "31°C at 7km"),
    ("a", "b"),
    ("The cat is awake; otherwise it is asleep.", "A man who is sleeping is not awake."),
    (LONG, "The harbour town has a lighthouse."),
    ("Short premise.", LONG + " " + LONG),
    (LONG, LONG.upper()),
]


# Characters beyond the corpus for the random texts: full-width forms, ligatures, circled and super-script digits
# (NFKC folds them), odd spaces and controls, combining marks, scripts and symbols the vocabularies lack.
ODD = list("ＡＢ１２３ﬁﬀ①²½Ⅸ㎏℃\u00a0\u2003\t\n\u200b\u00ad한국😀🚢ÅåǅĲ\u0301\u0308ṩ[]<>") + [
    "[CLS]", "[SEP]", "<s>", "</s>", "<unk>", "[UNK]", "<pad>", "°C", "km", "  ", "   "]


def random_texts(count, seed):
    """Seeded texts mixing corpus words, random corpus characters and the odd characters above."""
    corpus = open(CORPUS, encoding="utf-8").read()
    words, characters = corpus.split(), sorted(set(corpus))
    rng = random.Random(seed)
    texts = []
    for _ in range(count):
        parts = []
        for _ in range(rng.randint(0, 16)):
            draw = rng.random()
            if draw < 0.6:
                parts.append(rng.choice(words))
            elif draw < 0.8:
                parts.append("".join(rng.choice(characters) for _ in range(rng.randint(1, 5))))
            else:
                parts.append(rng.choice(ODD))
        texts.append(rng.choice([" ", " ", "", "  "]).join(parts))
    return texts


def write_segments(folder, sp, seed):
    """segments.jsonl: sentencepiece's own ids for single texts, no frame, no id offset."""
    with open(os.path.join(folder, "segments.jsonl"), "w", encoding="utf-8") as f:
        for text in random_texts(300, seed):
            f.write(json.dumps({"text": text, "ids": sp.encode(text)}, ensure_ascii=False) + "\n")


def train_tokenizer(prefix, model_type, layout, user_defined=()):
    """spm_train on the invented corpus; layout 'deberta' names the special pieces as DeBERTa-v3 does."""
    args = ["spm_train", f"--input={CORPUS}", f"--model_prefix={prefix}", f"--model_type={model_type}",
            f"--vocab_size={VOCAB}", "--character_coverage=1.0", "--num_threads=1", "--random_seed=13",
            "--minloglevel=2"]
    if layout == "deberta":
        args += ["--pad_id=0", "--bos_id=1", "--eos_id=2", "--unk_id=3",
                 "--pad_piece=[PAD]", "--bos_piece=[CLS]", "--eos_piece=[SEP]", "--unk_piece=[UNK]"]
    if user_defined:
        args.append("--user_defined_symbols=" + ",".join(user_defined))
    subprocess.run(args, check=True, stdout=subprocess.DEVNULL)
    os.remove(prefix + ".vocab")
    return sentencepiece.SentencePieceProcessor(model_file=prefix + ".model")


def fit(first, second, budget):
    """Longest side first: drop the last token of the longer side, the first side on a tie."""
    first, second = list(first), list(second)
    while len(first) + len(second) > budget:
        if len(first) >= len(second):
            first.pop()
        else:
            second.pop()
    return first, second


def deberta_frame(sp, premise, hypothesis, max_length):
    cls, sep = sp.piece_to_id("[CLS]"), sp.piece_to_id("[SEP]")
    whole = sp.encode(premise), sp.encode(hypothesis)
    a, b = fit(*whole, max_length - 3)
    ids = [cls] + a + [sep] + b + [sep]
    types = [0] * (len(a) + 2) + [1] * (len(b) + 1)
    return ids, types, len(a) + len(b) < sum(map(len, whole))


def fairseq_id(sp, piece_id):
    # The fairseq dictionary puts <s> <pad> </s> <unk> first; sentencepiece's <unk> (0) becomes 3 and every
    # other piece moves up by one.
    return 3 if piece_id == sp.unk_id() else piece_id + 1


def roberta_frame(sp, premise, hypothesis, max_length):
    whole = [fairseq_id(sp, i) for i in sp.encode(premise)], [fairseq_id(sp, i) for i in sp.encode(hypothesis)]
    a, b = fit(*whole, max_length - 4)
    ids = [0] + a + [2, 2] + b + [2]
    return ids, [0] * len(ids), len(a) + len(b) < sum(map(len, whole))


def dense_init(model, generator):
    """Random weights large enough that the three logits differ clearly (layer norms keep their defaults)."""
    with torch.no_grad():
        for module in model.modules():
            if isinstance(module, (nn.Linear, nn.Embedding)):
                module.weight.copy_(torch.randn(module.weight.shape, generator=generator) * 0.3)
            if isinstance(module, nn.Linear):
                module.bias.copy_(torch.randn(module.bias.shape, generator=generator) * 0.1)


def heads(x):
    batch, length, _ = x.shape
    return x.view(batch, length, HEADS, HIDDEN // HEADS).transpose(1, 2)


def merge_heads(x):
    batch, _, length, _ = x.shape
    return x.transpose(1, 2).reshape(batch, length, HIDDEN)


class FeedForward(nn.Module):
    def __init__(self):
        super().__init__()
        self.up = nn.Linear(HIDDEN, INTERMEDIATE)
        self.down = nn.Linear(INTERMEDIATE, HIDDEN)
        self.norm = nn.LayerNorm(HIDDEN, eps=1e-7)

    def forward(self, x):
        return self.norm(x + self.down(nn.functional.gelu(self.up(x))))


class AttentionLayer(nn.Module):
    """Self-attention then the feed-forward block, each added back and layer-normalised."""

    def __init__(self, eps):
        super().__init__()
        self.query = nn.Linear(HIDDEN, HIDDEN)
        self.key = nn.Linear(HIDDEN, HIDDEN)
        self.value = nn.Linear(HIDDEN, HIDDEN)
        self.out = nn.Linear(HIDDEN, HIDDEN)
        self.norm = nn.LayerNorm(HIDDEN, eps=eps)
        self.ffn = FeedForward()

    def finish(self, x, scores, v, mask):
        scores = scores + (1.0 - mask) * -10000.0
        attended = merge_heads(torch.softmax(scores, dim=-1) @ v)
        return self.ffn(self.norm(x + self.out(attended)))


class DisentangledLayer(AttentionLayer):
    """Attention with content-to-position and position-to-content terms over bucketed relative positions."""

    def __init__(self):
        super().__init__(eps=1e-7)

    def forward(self, x, relative, buckets, mask):
        q, k, v = heads(self.query(x)), heads(self.key(x)), heads(self.value(x))
        rel_k = heads(self.key(relative).unsqueeze(0))  # [1, heads, 2k, d]
        rel_q = heads(self.query(relative).unsqueeze(0))
        index = buckets.expand(q.shape[0], HEADS, -1, -1)
        content = q @ k.transpose(-1, -2)
        c2p = torch.gather(q @ rel_k.transpose(-1, -2), -1, index)
        p2c = torch.gather(k @ rel_q.transpose(-1, -2), -1, index).transpose(-1, -2)
        return self.finish(x, (content + c2p + p2c) / (3 * (HIDDEN // HEADS)) ** 0.5, v, mask)


class TinyDebertaV3(nn.Module):
    """DeBERTa-v3-shaped: word (and optional segment) embeddings only, relative positions in attention,
    a GELU pooler over the first token, three logits."""

    RELATIVE_BUCKETS = 8

    def __init__(self, vocab_size, type_vocab_size):
        super().__init__()
        self.words = nn.Embedding(vocab_size, HIDDEN)
        self.types = nn.Embedding(type_vocab_size, HIDDEN) if type_vocab_size else None
        self.norm = nn.LayerNorm(HIDDEN, eps=1e-7)
        self.relative = nn.Embedding(2 * self.RELATIVE_BUCKETS, HIDDEN)
        self.relative_norm = nn.LayerNorm(HIDDEN, eps=1e-7)
        self.layers = nn.ModuleList(DisentangledLayer() for _ in range(LAYERS))
        self.pooler = nn.Linear(HIDDEN, HIDDEN)
        self.classifier = nn.Linear(HIDDEN, 3)

    def forward(self, input_ids, attention_mask, token_type_ids=None):
        x = self.words(input_ids)
        if self.types is not None:
            x = x + self.types(token_type_ids)
        x = self.norm(x) * attention_mask.unsqueeze(-1).to(x.dtype)
        positions = torch.arange(input_ids.shape[1])
        k = self.RELATIVE_BUCKETS
        buckets = (positions[:, None] - positions[None, :]).clamp(-k, k - 1) + k
        relative = self.relative_norm(self.relative.weight)
        mask = attention_mask[:, None, None, :].to(x.dtype)
        for layer in self.layers:
            x = layer(x, relative, buckets, mask)
        return self.classifier(nn.functional.gelu(self.pooler(x[:, 0])))


class EncoderLayer(AttentionLayer):
    def __init__(self):
        super().__init__(eps=1e-5)

    def forward(self, x, mask):
        q, k, v = heads(self.query(x)), heads(self.key(x)), heads(self.value(x))
        return self.finish(x, q @ k.transpose(-1, -2) / (HIDDEN // HEADS) ** 0.5, v, mask)


class TinyXlmRoberta(nn.Module):
    """XLM-R-shaped: absolute positions counted from padding id 1 (so they start at 2), one segment row,
    a tanh head over the first token, three logits."""

    PADDING = 1

    def __init__(self, vocab_size, max_positions):
        super().__init__()
        self.words = nn.Embedding(vocab_size, HIDDEN)
        self.positions = nn.Embedding(max_positions, HIDDEN)
        self.types = nn.Embedding(1, HIDDEN)
        self.norm = nn.LayerNorm(HIDDEN, eps=1e-5)
        self.layers = nn.ModuleList(EncoderLayer() for _ in range(LAYERS))
        self.dense = nn.Linear(HIDDEN, HIDDEN)
        self.out_proj = nn.Linear(HIDDEN, 3)

    def forward(self, input_ids, attention_mask):
        real = (input_ids != self.PADDING).to(torch.int64)
        positions = torch.cumsum(real, dim=1) * real + self.PADDING
        x = self.words(input_ids) + self.positions(positions) + self.types(torch.zeros_like(input_ids))
        x = self.norm(x)
        mask = attention_mask[:, None, None, :].to(x.dtype)
        for layer in self.layers:
            x = layer(x, mask)
        return self.out_proj(torch.tanh(self.dense(x[:, 0])))


def export(model, path, with_types):
    names = ["input_ids", "attention_mask"] + (["token_type_ids"] if with_types else [])
    sample = torch.tensor([[1, 40, 41, 2, 42, 2]])
    inputs = (sample, torch.ones_like(sample)) + ((torch.zeros_like(sample),) if with_types else ())
    torch.onnx.export(model, inputs, path, opset_version=14, input_names=names, output_names=["logits"],
                      dynamic_axes={name: {0: "batch", 1: "sequence"} for name in names} | {"logits": {0: "batch"}})


def write_json(path, value):
    with open(path, "w", encoding="utf-8") as f:
        json.dump(value, f, indent=2, ensure_ascii=False)
        f.write("\n")


def write_reference(folder, sp, frame, model, max_length, with_types):
    with open(os.path.join(folder, "reference.jsonl"), "w", encoding="utf-8") as f:
        for premise, hypothesis in PAIRS:
            ids, types, truncated = frame(sp, premise, hypothesis, max_length)
            tensor = torch.tensor([ids])
            inputs = (tensor, torch.ones_like(tensor)) + ((torch.tensor([types]),) if with_types else ())
            with torch.no_grad():
                logits = model(*inputs)[0].tolist()
            f.write(json.dumps({"premise": premise, "hypothesis": hypothesis, "input_ids": ids,
                                "token_type_ids": types, "truncated": truncated, "logits": logits}, ensure_ascii=False) + "\n")


def build_deberta(name, model_type, type_vocab_size, user_defined, labels, card, seed):
    folder = os.path.join(HERE, name)
    os.makedirs(folder, exist_ok=True)
    sp = train_tokenizer(os.path.join(folder, "spm"), model_type, "deberta", user_defined)
    vocab_size = sp.get_piece_size() + 12  # room for [MASK] and padding rows, as the public checkpoints have
    max_positions = 64
    generator = torch.Generator().manual_seed(seed)
    model = TinyDebertaV3(vocab_size, type_vocab_size)
    dense_init(model, generator)
    model.eval()
    export(model, os.path.join(folder, "model.onnx"), with_types=type_vocab_size > 0)
    write_json(os.path.join(folder, "config.json"), {
        "_name_or_path": f"tiny-{name}-nli", "model_type": "deberta-v2", "vocab_size": vocab_size,
        "hidden_size": HIDDEN, "num_hidden_layers": LAYERS, "num_attention_heads": HEADS,
        "max_position_embeddings": max_positions, "type_vocab_size": type_vocab_size,
        "position_biased_input": False, "relative_attention": True, "pad_token_id": 0,
        "id2label": {str(i): label for i, label in enumerate(labels)},
        "label2id": {label: i for i, label in enumerate(labels)}})
    if card is None:
        write_json(os.path.join(folder, "tokenizer_config.json"), {
            "do_lower_case": False, "split_by_punct": False, "vocab_type": "spm", "model_max_length": NO_LIMIT,
            "bos_token": "[CLS]", "eos_token": "[SEP]", "cls_token": "[CLS]", "sep_token": "[SEP]",
            "pad_token": "[PAD]", "unk_token": "[UNK]", "mask_token": "[MASK]"})
        max_length = max_positions
    else:
        write_json(os.path.join(folder, "nli-model.json"), card)
        max_length = card["max_length"]
    write_reference(folder, sp, deberta_frame, model, max_length, with_types=type_vocab_size > 0)
    write_segments(folder, sp, seed)


def build_xlm_roberta(seed):
    folder = os.path.join(HERE, "xlm-roberta")
    os.makedirs(folder, exist_ok=True)
    sp = train_tokenizer(os.path.join(folder, "sentencepiece.bpe"), "unigram", "fairseq")
    assert (sp.unk_id(), sp.bos_id(), sp.eos_id(), sp.pad_id()) == (0, 1, 2, -1)
    vocab_size = sp.get_piece_size() + 2  # <pad> inserted by the fairseq dictionary, <mask> appended
    max_positions = 66  # two rows before the first real position
    generator = torch.Generator().manual_seed(seed)
    model = TinyXlmRoberta(vocab_size, max_positions)
    dense_init(model, generator)
    model.eval()
    export(model, os.path.join(folder, "model.onnx"), with_types=False)
    labels = ["CONTRADICTION", "NEUTRAL", "ENTAILMENT"]
    write_json(os.path.join(folder, "config.json"), {
        "_name_or_path": "tiny-xlm-roberta-nli", "model_type": "xlm-roberta", "vocab_size": vocab_size,
        "hidden_size": HIDDEN, "num_hidden_layers": LAYERS, "num_attention_heads": HEADS,
        "max_position_embeddings": max_positions, "type_vocab_size": 1, "pad_token_id": 1,
        "bos_token_id": 0, "eos_token_id": 2,
        "id2label": {str(i): label for i, label in enumerate(labels)},
        "label2id": {label: i for i, label in enumerate(labels)}})
    write_json(os.path.join(folder, "tokenizer_config.json"), {
        "model_max_length": 512, "bos_token": "<s>", "eos_token": "</s>", "sep_token": "</s>",
        "cls_token": "<s>", "unk_token": "<unk>", "pad_token": "<pad>", "mask_token": "<mask>"})
    write_reference(folder, sp, roberta_frame, model, max_positions - 2, with_types=False)
    write_segments(folder, sp, seed)


def main():
    torch.manual_seed(13)
    build_deberta("deberta-v3", "unigram", 0, (), ["contradiction", "entailment", "neutral"], None, seed=21)
    build_deberta("deberta-v3-bpe", "bpe", 2, ("°C", "km"), ["neutral", "contradiction", "entailment"],
                  {"name": "tiny-deberta-v3-bpe-nli", "architecture": "deberta-v2", "tokenizer": "sentencepiece",
                   "vocabulary": "spm.model", "max_length": 40, "output": "logits"}, seed=22)
    build_xlm_roberta(seed=23)


if __name__ == "__main__":
    sys.exit(main())
