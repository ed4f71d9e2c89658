"""A small decoder-only transformer (RMSNorm, rotary positions, grouped-query attention, gated MLP)
with an explicit key/value cache, and its ONNX export in the input/output naming ONNX Runtime GenAI
reads (input_ids, attention_mask, position_ids, past_key_values.N.key/value -> logits, present.N.key/value).
"""

from dataclasses import dataclass

import torch
from torch import nn


@dataclass
class Shape:
    vocab: int
    hidden: int
    layers: int
    heads: int
    kv_heads: int
    ff: int
    context: int

    @property
    def head_size(self):
        return self.hidden // self.heads


class RmsNorm(nn.Module):
    def __init__(self, width, eps=1e-5):
        super().__init__()
        self.weight = nn.Parameter(torch.ones(width))
        self.eps = eps

    def forward(self, x):
        return x * torch.rsqrt(x.pow(2).mean(-1, keepdim=True) + self.eps) * self.weight


def rotate_half(x):
    half = x.shape[-1] // 2
    return torch.cat([-x[..., half:], x[..., :half]], dim=-1)


def share_heads(x, group):
    """[b, kv_heads, t, d] -> [b, kv_heads * group, t, d], each key/value head serving `group` query heads."""
    b, kv, t, d = x.shape
    return x.unsqueeze(2).expand(b, kv, group, t, d).reshape(b, kv * group, t, d)


class Layer(nn.Module):
    def __init__(self, shape: Shape):
        super().__init__()
        self.shape = shape
        d = shape.head_size
        self.attn_norm = RmsNorm(shape.hidden)
        self.q = nn.Linear(shape.hidden, shape.heads * d, bias=False)
        self.k = nn.Linear(shape.hidden, shape.kv_heads * d, bias=False)
        self.v = nn.Linear(shape.hidden, shape.kv_heads * d, bias=False)
        self.o = nn.Linear(shape.heads * d, shape.hidden, bias=False)
        self.mlp_norm = RmsNorm(shape.hidden)
        self.gate = nn.Linear(shape.hidden, shape.ff, bias=False)
        self.up = nn.Linear(shape.hidden, shape.ff, bias=False)
        self.down = nn.Linear(shape.ff, shape.hidden, bias=False)

    def forward(self, x, cos, sin, allowed, past_k, past_v):
        b, s, _ = x.shape
        d = self.shape.head_size
        h = self.attn_norm(x)
        q = self.q(h).view(b, s, self.shape.heads, d).transpose(1, 2)
        k = self.k(h).view(b, s, self.shape.kv_heads, d).transpose(1, 2)
        v = self.v(h).view(b, s, self.shape.kv_heads, d).transpose(1, 2)
        q = q * cos + rotate_half(q) * sin
        k = k * cos + rotate_half(k) * sin
        k = torch.cat([past_k, k], dim=2)
        v = torch.cat([past_v, v], dim=2)
        group = self.shape.heads // self.shape.kv_heads
        keys = share_heads(k, group)
        values = share_heads(v, group)
        scores = torch.matmul(q, keys.transpose(2, 3)) / (d ** 0.5)
        # A large negative number rather than -inf, so a fully masked (padding) row stays finite.
        scores = scores.masked_fill(~allowed, -1e9)
        attended = torch.matmul(torch.softmax(scores, dim=-1), values)
        x = x + self.o(attended.transpose(1, 2).reshape(b, s, self.shape.heads * d))
        h = self.mlp_norm(x)
        x = x + self.down(nn.functional.silu(self.gate(h)) * self.up(h))
        return x, k, v


class Decoder(nn.Module):
    def __init__(self, shape: Shape):
        super().__init__()
        self.shape = shape
        self.embed = nn.Embedding(shape.vocab, shape.hidden)
        self.layers = nn.ModuleList(Layer(shape) for _ in range(shape.layers))
        self.norm = RmsNorm(shape.hidden)
        self.head = nn.Linear(shape.hidden, shape.vocab, bias=True)
        d = shape.head_size
        self.register_buffer("inv_freq", 1.0 / (10000 ** (torch.arange(0, d, 2).float() / d)), persistent=False)

    def forward(self, input_ids, attention_mask, position_ids, *past):
        b, s = input_ids.shape
        x = self.embed(input_ids)
        angles = position_ids.unsqueeze(-1).float() * self.inv_freq
        angles = torch.cat([angles, angles], dim=-1).unsqueeze(1)
        cos, sin = angles.cos(), angles.sin()
        total = attention_mask.shape[1]
        query_pos = torch.arange(s) + (total - s)
        key_pos = torch.arange(total)
        causal = key_pos.unsqueeze(0) <= query_pos.unsqueeze(1)
        allowed = causal.unsqueeze(0).unsqueeze(0) & attention_mask.bool().unsqueeze(1).unsqueeze(2)
        present = []
        for i, layer in enumerate(self.layers):
            x, k, v = layer(x, cos, sin, allowed, past[2 * i], past[2 * i + 1])
            present += [k, v]
        return (self.head(self.norm(x)),) + tuple(present)

    def empty_past(self, batch):
        z = torch.zeros(batch, self.shape.kv_heads, 0, self.shape.head_size)
        return [z] * (2 * self.shape.layers)

    def next_logits(self, ids):
        """Logits of the token after `ids`, recomputed from scratch (no cache)."""
        input_ids = torch.tensor([ids])
        mask = torch.ones_like(input_ids)
        positions = torch.arange(len(ids)).unsqueeze(0)
        return self(input_ids, mask, positions, *self.empty_past(1))[0][0, -1]


def input_names(layers):
    names = ["input_ids", "attention_mask", "position_ids"]
    for i in range(layers):
        names += [f"past_key_values.{i}.key", f"past_key_values.{i}.value"]
    return names


def output_names(layers):
    names = ["logits"]
    for i in range(layers):
        names += [f"present.{i}.key", f"present.{i}.value"]
    return names


def export(model: Decoder, path, external_data=False):
    shape = model.shape
    ids = torch.tensor([[1, 2, 3]])
    past = [torch.zeros(1, shape.kv_heads, 2, shape.head_size)] * (2 * shape.layers)
    mask = torch.ones(1, 5, dtype=torch.int64)
    positions = torch.tensor([[2, 3, 4]])
    axes = {"input_ids": {0: "batch", 1: "sequence"}, "attention_mask": {0: "batch", 1: "total"},
            "position_ids": {0: "batch", 1: "sequence"}, "logits": {0: "batch", 1: "sequence"}}
    for i in range(shape.layers):
        for kind in ("key", "value"):
            axes[f"past_key_values.{i}.{kind}"] = {0: "batch", 2: "past"}
            axes[f"present.{i}.{kind}"] = {0: "batch", 2: "total"}
    with torch.no_grad():
        torch.onnx.export(model, (ids, mask, positions, *past), path, opset_version=17,
                          input_names=input_names(shape.layers), output_names=output_names(shape.layers),
                          dynamic_axes=axes, do_constant_folding=True)
    if external_data:
        import onnx
        proto = onnx.load(path)
        onnx.save_model(proto, path, save_as_external_data=True, all_tensors_to_one_file=True,
                        location=path.split("/")[-1] + ".data", size_threshold=1024)


def genai_config(shape: Shape, eos, filename="model.onnx", threads=None):
    session = {"log_id": "plumbline-local"}
    if threads:
        session["intra_op_num_threads"] = threads
    return {
        "model": {
            "bos_token_id": eos,
            "context_length": shape.context,
            "decoder": {
                "session_options": session,
                "filename": filename,
                "head_size": shape.head_size,
                "hidden_size": shape.hidden,
                "inputs": {
                    "input_ids": "input_ids",
                    "attention_mask": "attention_mask",
                    "position_ids": "position_ids",
                    "past_key_names": "past_key_values.%d.key",
                    "past_value_names": "past_key_values.%d.value",
                },
                "outputs": {
                    "logits": "logits",
                    "present_key_names": "present.%d.key",
                    "present_value_names": "present.%d.value",
                },
                "num_attention_heads": shape.heads,
                "num_hidden_layers": shape.layers,
                "num_key_value_heads": shape.kv_heads,
            },
            "eos_token_id": eos,
            "pad_token_id": eos,
            "type": "llama",
            "vocab_size": shape.vocab,
        },
        "search": {
            "diversity_penalty": 0.0,
            "do_sample": False,
            "early_stopping": True,
            "length_penalty": 1.0,
            "max_length": shape.context,
            "min_length": 0,
            "no_repeat_ngram_size": 0,
            "num_beams": 1,
            "num_return_sequences": 1,
            "past_present_share_buffer": False,
            "repetition_penalty": 1.0,
            "temperature": 1.0,
            "top_k": 0,
            "top_p": 1.0,
        },
    }
