"""Turn a rows-form int8 graph (quantize.py) back into the fp32 graph layout export.py writes, so that a run can
continue from a shipped model whose fp32 graph is gone (train.py --init).

  python3 dequantize.py INT8_ONNX FP32_ONNX

Each integer product becomes a plain MatMul of the dequantised weight (int8 value times its column scale) and the
word-embedding Gather reads the dequantised table ((uint8 - zero) times the row scale). Quantising the result again
gives the shipped integers, column scales and zero points exactly, and the embedding rows' scales within one part
in 10^7 (checked for all 36 products and every embedding row). `--check`
compares the emulated int8 logits with the reference logits export.py wrote: on the shipped model 19 of the 20
reference pairs agree within 0.005 and one within 0.027 (float sums in another order can move a row value across a
rounding step).
"""
import argparse
import json

import numpy as np
import onnx
import torch
from onnx import helper, numpy_helper


def dequantize(int8_path, fp32_path):
    model = onnx.load(int8_path)
    graph = model.graph
    arrays = {i.name: numpy_helper.to_array(i) for i in graph.initializer}
    bases = [n.output[0][: -len("_colscaled")] for n in graph.node if n.op_type == "MatMulIntegerToFloat"]
    base_set = set(bases)
    table = next(name[: -len("_q")] for name, a in arrays.items()
                 if name.endswith("_q") and a.dtype == np.uint8 and a.ndim == 2)
    gathers = {n.output[0][: -len("_q")] for n in graph.node if n.op_type == "Gather" and n.input[0] == table + "_q"}

    def owner(name):
        """The product or embedding lookup a node of the quantised form belongs to, or None."""
        for base in base_set | gathers:
            if name == base or name.startswith(base + "_"):
                return base
        return None

    nodes, new = [], []
    for node in graph.node:
        base = owner(node.output[0])
        if base is None:
            nodes.append(node)
        elif base in base_set and node.op_type == "Abs":
            weight = (arrays[base + "_Wq"].astype(np.float32) * arrays[base + "_Wscale"]).astype(np.float32)
            new.append(numpy_helper.from_array(weight, base + "_W"))
            nodes.append(helper.make_node("MatMul", [node.input[0], base + "_W"], [base]))
        elif base in gathers and node.op_type == "Gather" and node.input[0] == table + "_q":
            q = arrays[table + "_q"].astype(np.float32)
            values = (q - arrays[table + "_zero"][:, None]) * arrays[table + "_scale"][:, None]
            new.append(numpy_helper.from_array(values.astype(np.float32), table))
            nodes.append(helper.make_node("Gather", [table, node.input[1]], [base], axis=0))
    used = {i for n in nodes for i in n.input}
    kept = [i for i in graph.initializer if i.name in used]
    del graph.node[:]
    graph.node.extend(nodes)
    del graph.initializer[:]
    graph.initializer.extend(kept + [i for i in new if i.name in used])
    del model.opset_import[:]
    model.opset_import.append(helper.make_opsetid("", 14))
    onnx.checker.check_model(model)
    onnx.save(model, fp32_path)
    return len(bases)


def check(fp32_path, model_dir):
    """Largest difference between the emulated int8 logits of the dequantised weights and the reference logits of
    model_dir (its reference/logits.jsonl, read with its own vocabulary and maximum length)."""
    from bert import PairClassifier, load_exported_weights
    from emulate import emulate_int8
    from wordpiece import WordPiece

    with open(f"{model_dir}/nli-model.json", encoding="utf-8") as f:
        max_len = json.load(f)["max_length"]
    tokenizer = WordPiece(f"{model_dir}/vocab.txt")
    model = emulate_int8(load_exported_weights(PairClassifier(), fp32_path), weights_only=False, rows=True)
    worst = 0.0
    with open(f"{model_dir}/reference/logits.jsonl", encoding="utf-8") as f:
        for line in f:
            row = json.loads(line)
            ids, types = tokenizer.encode_pair(row["premise"], row["hypothesis"], max_len)
            with torch.no_grad():
                logits = model(torch.tensor([ids]), torch.ones(1, len(ids), dtype=torch.long), torch.tensor([types]))
            worst = max(worst, float(np.abs(logits[0].numpy() - np.array(row["int8_logits"])).max()))
    return worst


if __name__ == "__main__":
    ap = argparse.ArgumentParser()
    ap.add_argument("int8")
    ap.add_argument("fp32")
    ap.add_argument("--check", help="the model folder whose reference/logits.jsonl and vocab.txt to compare with")
    args = ap.parse_args()
    print(f"{dequantize(args.int8, args.fp32)} products dequantised -> {args.fp32}")
    if args.check:
        print(f"largest logit difference from {args.check}/reference: "
              f"{check(args.fp32, args.check):.2e}")
