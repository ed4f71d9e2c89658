"""Writes the tiny byte-level BPE classifier used by the bring-your-own-model tests.

The files mimic a RoBERTa-style export: vocab.json + merges.txt (byte-level alphabet, six merges),
config.json with id2label in an order other than ours, and model.onnx whose only inputs are input_ids
and attention_mask (no token_type_ids). The graph returns, per pair, the mean of a fixed embedding row
over the unmasked tokens, so padding that leaked into the mean would change the logits.

expected.jsonl holds token ids derived by hand from the vocabulary below and the logits numpy computes
for those ids. Run with a Python that has numpy and onnx:  python3 make_tiny_bpe.py
"""
import json

import numpy as np
import onnx
from onnx import TensorProto, helper, numpy_helper


def byte_alphabet():
    # The usual byte-to-printable-character table of byte-level BPE (common practice): printable
    # Latin-1 bytes stand for themselves, the others are shifted past U+0100.
    keep = list(range(ord("!"), ord("~") + 1)) + list(range(0xA1, 0xAC + 1)) + list(range(0xAE, 0xFF + 1))
    table, shift = {}, 0
    for b in range(256):
        if b in keep:
            table[b] = chr(b)
        else:
            table[b] = chr(256 + shift)
            shift += 1
    return table


SPECIALS = ["<s>", "<pad>", "</s>", "<unk>"]
MERGES = [("a", "t"), ("c", "at"), ("\u0120", "cat"), ("t", "h"), ("th", "e"), ("s", "at")]

table = byte_alphabet()
vocab = {token: i for i, token in enumerate(SPECIALS)}
for b in range(256):
    vocab[table[b]] = len(vocab)  # id = 4 + byte value
for left, right in MERGES:
    vocab[left + right] = len(vocab)

with open("vocab.json", "w", encoding="utf-8") as f:
    json.dump(vocab, f, ensure_ascii=False)
with open("merges.txt", "w", encoding="utf-8") as f:
    f.write("#version: 0.2\n")
    for left, right in MERGES:
        f.write(f"{left} {right}\n")

config = {
    "model_type": "roberta",
    "_name_or_path": "tiny-bpe-pair-classifier",
    "max_position_embeddings": 18,
    "id2label": {"0": "CONTRADICTION", "1": "NEUTRAL", "2": "ENTAILMENT"},
}
with open("config.json", "w", encoding="utf-8") as f:
    json.dump(config, f, indent=2)
    f.write("\n")

rows = np.arange(len(vocab), dtype=np.float64)[:, None]
cols = np.arange(3, dtype=np.float64)[None, :]
embedding = (np.sin(0.37 * rows + 1.3 * cols) * (cols + 1)).astype(np.float32)

nodes = [
    helper.make_node("Gather", ["embedding", "input_ids"], ["vectors"], axis=0),
    helper.make_node("Cast", ["attention_mask"], ["mask"], to=TensorProto.FLOAT),
    helper.make_node("Unsqueeze", ["mask", "axis2"], ["mask3"]),
    helper.make_node("Mul", ["vectors", "mask3"], ["masked"]),
    helper.make_node("ReduceSum", ["masked", "axis1"], ["summed"], keepdims=0),
    helper.make_node("ReduceSum", ["mask", "axis1"], ["count"], keepdims=1),
    helper.make_node("Div", ["summed", "count"], ["logits"]),
]
graph = helper.make_graph(
    nodes,
    "tiny_pair_classifier",
    [helper.make_tensor_value_info("input_ids", TensorProto.INT64, ["batch", "sequence"]),
     helper.make_tensor_value_info("attention_mask", TensorProto.INT64, ["batch", "sequence"])],
    [helper.make_tensor_value_info("logits", TensorProto.FLOAT, ["batch", 3])],
    initializer=[numpy_helper.from_array(embedding, "embedding"),
                 numpy_helper.from_array(np.array([1], dtype=np.int64), "axis1"),
                 numpy_helper.from_array(np.array([2], dtype=np.int64), "axis2")])
model = helper.make_model(graph, opset_imports=[helper.make_opsetid("", 13)], producer_name="make_tiny_bpe.py")
model.ir_version = 8
onnx.checker.check_model(model)
onnx.save(model, "model.onnx")

# Hand-derived ids: <s>=0 </s>=2, a byte b is 4+b, merged tokens at=260 cat=261 Ġcat=262 th=263 the=264 sat=265.
# "a cat sat" pre-tokenises to "a", "Ġcat", "Ġsat"; "Ġsat" has no merge with Ġ, so it stays Ġ (36) + sat.
# "The" is cased: T (88) h (108) e (105), since only lower-case t h merges.
CASES = [
    ("a cat sat", "the cat", [0, 101, 262, 36, 265, 2, 2, 264, 262, 2]),
    ("The cat", "cat", [0, 88, 108, 105, 262, 2, 2, 261, 2]),
    ("", "at", [0, 2, 2, 260, 2]),
]
with open("expected.jsonl", "w", encoding="utf-8") as f:
    for premise, hypothesis, ids in CASES:
        logits = embedding[np.array(ids)].astype(np.float64).mean(axis=0)
        f.write(json.dumps({"premise": premise, "hypothesis": hypothesis, "input_ids": ids,
                            "logits": [float(x) for x in logits]}) + "\n")
