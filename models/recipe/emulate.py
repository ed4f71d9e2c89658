"""PyTorch emulation of the int8 graph that quantize.py writes, for reference logits and accuracy.

DynamicQuantizeLinear per the ONNX operator definition: scale = (max(0, max x) - min(0, min x)) / 255,
zero = round(-min(0, min x) / scale) saturated to [0, 255], q = saturate(round(x / scale) + zero), with
round-half-to-even; the integer product is exact in float64."""
import numpy as np
import torch
from torch import nn

from quantize import quantize_columns, quantize_columns_symmetric, quantize_rows


def dynamic_quantize(x):
    lo = torch.clamp(x.min(), max=0.0)
    hi = torch.clamp(x.max(), min=0.0)
    scale = ((hi - lo) / 255.0).float()
    zero = torch.clamp(torch.round(-lo / scale), 0, 255)
    q = torch.clamp(torch.round(x / scale) + zero, 0, 255)
    return q, scale, zero


def row_quantize(x):
    """quantize.rows_matmul's activations: per-row absmax / 127, round half to even, zero point 128."""
    scale = torch.clamp(x.abs().amax(-1, keepdim=True), min=1e-12) / 127.0
    return torch.round(x / scale), scale


class EmulatedLinear(nn.Module):
    def __init__(self, linear, weights_only=True, rows=False):
        super().__init__()
        self.weights_only = weights_only
        self.rows = rows
        w = linear.weight.detach().numpy().T.astype(np.float32)  # [in, out] as exported
        q, scale, zero = quantize_columns_symmetric(w) if rows else quantize_columns(w)
        self.register_buffer("wq", torch.from_numpy(q.astype(np.float64) - zero.astype(np.float64)))
        self.register_buffer("wscale", torch.from_numpy(scale))
        self.register_buffer("bias", linear.bias.detach().clone())

    def forward(self, x):
        if self.weights_only:
            # DequantizeLinear then an fp32 MatMul, as in the shipped graph.
            w = (self.wq.float() * self.wscale).float()
            return x @ w + self.bias
        if self.rows:
            q, scale = row_quantize(x)
            acc = (q.double() @ self.wq).float()
            return acc * self.wscale * scale + self.bias
        q, scale, zero = dynamic_quantize(x)
        acc = ((q.double() - zero.double()) @ self.wq).float()
        return acc * (scale * self.wscale) + self.bias


def emulate_int8(model, weights_only=True, rows=False):
    """Return a copy of the fp32 PairClassifier whose encoder Linears and word embedding act as in the int8 graph."""
    import copy
    m = copy.deepcopy(model).eval()
    for layer in m.layers:
        for name in ("query", "key", "value", "attn_out", "ffn_in", "ffn_out"):
            setattr(layer, name, EmulatedLinear(getattr(layer, name), weights_only, rows))
    table = m.word.weight.detach().numpy()
    q, scale, zero = quantize_rows(table)
    deq = (q.astype(np.float32) - zero.astype(np.float32)[:, None]) * scale[:, None]
    with torch.no_grad():
        m.word.weight.copy_(torch.from_numpy(deq))
    return m
