"""A BERT encoder in PyTorch whose weights are loaded from the base model's ONNX graph, plus a 3-way
sequence-pair classification head."""
import math

import numpy as np
import onnx
import torch
from onnx import numpy_helper
from torch import nn

HIDDEN, HEADS, LAYERS, FFN, VOCAB, POSITIONS = 384, 12, 6, 1536, 30522, 512
LN_EPS = 1e-12


class Layer(nn.Module):
    def __init__(self):
        super().__init__()
        self.query, self.key, self.value = nn.Linear(HIDDEN, HIDDEN), nn.Linear(HIDDEN, HIDDEN), nn.Linear(HIDDEN, HIDDEN)
        self.attn_out = nn.Linear(HIDDEN, HIDDEN)
        self.attn_norm = nn.LayerNorm(HIDDEN, eps=LN_EPS)
        self.ffn_in = nn.Linear(HIDDEN, FFN)
        self.ffn_out = nn.Linear(FFN, HIDDEN)
        self.ffn_norm = nn.LayerNorm(HIDDEN, eps=LN_EPS)
        self.dropout = nn.Dropout(0.1)

    def forward(self, x, mask_bias):
        b, t, _ = x.shape
        head = HIDDEN // HEADS

        def split(y):
            return y.view(b, t, HEADS, head).transpose(1, 2)

        q, k, v = split(self.query(x)), split(self.key(x)), split(self.value(x))
        scores = q @ k.transpose(-1, -2) / math.sqrt(head) + mask_bias
        ctx = (self.dropout(scores.softmax(-1)) @ v).transpose(1, 2).reshape(b, t, HIDDEN)
        x = self.attn_norm(x + self.dropout(self.attn_out(ctx)))
        h = nn.functional.gelu(self.ffn_in(x))
        return self.ffn_norm(x + self.dropout(self.ffn_out(h)))


class PairClassifier(nn.Module):
    def __init__(self, labels=3):
        super().__init__()
        self.word = nn.Embedding(VOCAB, HIDDEN)
        self.position = nn.Embedding(POSITIONS, HIDDEN)
        self.token_type = nn.Embedding(2, HIDDEN)
        self.embed_norm = nn.LayerNorm(HIDDEN, eps=LN_EPS)
        self.layers = nn.ModuleList(Layer() for _ in range(LAYERS))
        self.pooler = nn.Linear(HIDDEN, HIDDEN)
        self.dropout = nn.Dropout(0.1)
        self.head = nn.Linear(HIDDEN, labels)

    def forward(self, input_ids, attention_mask, token_type_ids):
        t = input_ids.shape[1]
        positions = torch.arange(t, device=input_ids.device).unsqueeze(0)
        x = self.word(input_ids) + self.token_type(token_type_ids) + self.position(positions)
        x = self.dropout(self.embed_norm(x))
        mask_bias = (1.0 - attention_mask[:, None, None, :].to(x.dtype)) * -10000.0
        for layer in self.layers:
            x = layer(x, mask_bias)
        pooled = torch.tanh(self.pooler(x[:, 0]))
        return self.head(self.dropout(pooled))


def graph_weights(onnx_path):
    """(graph, initializers by name, weights by parameter name). Named initializers map directly; MatMul weights
    are anonymous and stored [in, out], so each is named after the bias of the Add that consumes its output."""
    graph = onnx.load(onnx_path).graph
    arrays = {i.name: numpy_helper.to_array(i) for i in graph.initializer}
    consumers = {}
    for node in graph.node:
        for name in node.input:
            consumers.setdefault(name, []).append(node)
    named = dict(arrays)
    for node in graph.node:
        if node.op_type == "MatMul" and node.input[1] in arrays:
            add = next(n for n in consumers[node.output[0]] if n.op_type == "Add")
            bias = next(i for i in add.input if i in arrays)
            named[bias[: -len(".bias")] + ".weight"] = arrays[node.input[1]].T
    return graph, arrays, named


def load_base_weights(model, onnx_path):
    """Copy the encoder weights out of the base model's ONNX graph (graph_weights names them)."""
    graph, arrays, named = graph_weights(onnx_path)
    for node in graph.node:
        if node.op_type == "Gemm":
            w, bias = node.input[1], node.input[2]
            transposed = any(a.name == "transB" and a.i == 1 for a in node.attribute)
            named["pooler.dense.weight"] = arrays[w] if transposed else arrays[w].T
            named["pooler.dense.bias"] = arrays[bias]

    def put(param, key):
        value = torch.from_numpy(np.ascontiguousarray(named[key])).float()
        if tuple(param.shape) != tuple(value.shape):
            raise ValueError(f"{key}: shape {tuple(value.shape)} != {tuple(param.shape)}")
        with torch.no_grad():
            param.copy_(value)

    put(model.word.weight, "embeddings.word_embeddings.weight")
    put(model.position.weight, "embeddings.position_embeddings.weight")
    put(model.token_type.weight, "embeddings.token_type_embeddings.weight")
    put(model.embed_norm.weight, "embeddings.LayerNorm.weight")
    put(model.embed_norm.bias, "embeddings.LayerNorm.bias")
    for i, layer in enumerate(model.layers):
        p = f"encoder.layer.{i}."
        for mod, key in [(layer.query, "attention.self.query"), (layer.key, "attention.self.key"),
                         (layer.value, "attention.self.value"), (layer.attn_out, "attention.output.dense"),
                         (layer.ffn_in, "intermediate.dense"), (layer.ffn_out, "output.dense")]:
            put(mod.weight, p + key + ".weight")
            put(mod.bias, p + key + ".bias")
        put(layer.attn_norm.weight, p + "attention.output.LayerNorm.weight")
        put(layer.attn_norm.bias, p + "attention.output.LayerNorm.bias")
        put(layer.ffn_norm.weight, p + "output.LayerNorm.weight")
        put(layer.ffn_norm.bias, p + "output.LayerNorm.bias")
    put(model.pooler.weight, "pooler.dense.weight")
    put(model.pooler.bias, "pooler.dense.bias")
    return model


def load_exported_weights(model, onnx_path):
    """Copy every weight, the classification head included, out of an fp32 graph that export.py wrote for
    this PairClassifier, so a run can continue from a shipped or candidate model. Biases and norms keep their
    parameter names in the graph; MatMul weights are anonymous and stored [in, out], so each is named after
    the bias of the Add that consumes its output; Gemm (pooler, head) carries its bias as third input."""
    graph, arrays, named = graph_weights(onnx_path)
    named = {k: v for k, v in named.items() if not k.startswith("onnx::")}
    for node in graph.node:
        if node.op_type == "Gemm":
            transposed = any(a.name == "transB" and a.i == 1 for a in node.attribute)
            w = arrays[node.input[1]]
            named[node.input[2][: -len(".bias")] + ".weight"] = w if transposed else w.T
    state = model.state_dict()
    missing = sorted(set(state) - set(named))
    if missing:
        raise ValueError(f"{onnx_path}: no weights for {missing}")
    model.load_state_dict({k: torch.from_numpy(np.ascontiguousarray(named[k])).float() for k in state})
    return model
