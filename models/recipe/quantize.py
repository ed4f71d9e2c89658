"""Int8 quantisation of the exported fp32 graph, written as a plain ONNX rewrite.

Three forms, chosen by export.py --quantization:
- "rows" (the default): every MatMul whose right operand is a constant [in, out] weight becomes an integer
  product (ONNX Runtime's MatMulIntegerToFloat) of uint8 activations, quantised per token row (absmax / 127
  around zero point 128), and
  symmetric 7-bit int8 weights with one scale per output column (quantize_columns_symmetric says why 7
  bits). A row's scale depends only on that row, so a pair scores the same alone or in any batch, and the
  u8 x s8 kernels make it several times faster than fp32 on CPUs with int8 dot products.
- "weights": uint8 weights per output column dequantised (DequantizeLinear) in front of an fp32 MatMul;
  activations stay fp32. Batch-invariant too, but no faster than fp32.
- "dynamic" (not used): DynamicQuantizeLinear takes one scale over the whole batch tensor, so scores shift
  with the batch companions (measured up to 0.48 in a logit), which a scorer that batches and caches cannot
  accept. Weights uint8, asymmetric, per output column.
In every form the word-embedding Gather reads a uint8 table and dequantises only the gathered rows (one
scale and zero point per row), which keeps the 30,522 x 384 table at a quarter of its size. The same
arithmetic is emulated in PyTorch (emulate.py) to produce the int8 model's reference logits.
"""
import numpy as np
import onnx
from onnx import TensorProto, helper, numpy_helper


def quantize_columns(w):
    """w [in, out] float32 -> (q uint8 [in, out], scale float32 [out], zero uint8 [out])."""
    lo = np.minimum(w.min(axis=0), 0.0)
    hi = np.maximum(w.max(axis=0), 0.0)
    scale = ((hi - lo) / 255.0).astype(np.float32)
    scale[scale == 0] = 1.0
    zero = np.clip(np.round(-lo / scale), 0, 255).astype(np.uint8)
    q = np.clip(np.round(w / scale) + zero, 0, 255).astype(np.uint8)
    return q, scale, zero


WEIGHT_LEVELS = 63


def quantize_columns_symmetric(w):
    """w [in, out] float32 -> (q int8 [in, out], scale float32 [out], zero int8 [out] of zeros).

    Symmetric, one scale per output column, 7-bit range (-63..63): with uint8 activations the u8 x s8 integer
    kernels of CPUs without VNNI add pairs of products in int16, and 2 x 255 x 63 stays below 32,767, so no
    CPU saturates and every machine computes the same integers (the reduced-range rule of common practice)."""
    scale = (np.abs(w).max(axis=0) / WEIGHT_LEVELS).astype(np.float32)
    scale[scale == 0] = 1.0
    q = np.clip(np.round(w / scale), -WEIGHT_LEVELS, WEIGHT_LEVELS).astype(np.int8)
    return q, scale, np.zeros(w.shape[1], dtype=np.int8)


def quantize_rows(table):
    q, scale, zero = quantize_columns(table.T)
    return q.T.copy(), scale, zero


def rows_matmul(x, base, k):
    """x [..., K] @ W [K, N] with int8 arithmetic and one activation scale per token row: absmax / 127, stored
    around zero point 128 in uint8, against symmetric int8 weights (the u8 x s8 kernels, the fast ones). Each row's
    scale depends only on that row, so a pair scores the same alone or beside any other pairs.

    The rows are quantised by one per-axis QuantizeLinear over x seen as [rows, K] (round half to even, plus 128,
    exactly what Div, Round, Add and Cast computed one pass each), and the integer product comes out as float with
    the column scale applied by ONNX Runtime's MatMulIntegerToFloat (com.microsoft; activation scale 1, so its
    multiplier is the column scale itself, as the Cast and Mul it replaces computed); then the row scale. The
    separate element-wise passes took about 30% of a batch's time in ONNX Runtime's profile."""
    return [
        helper.make_node("Abs", [x], [base + "_abs"]),
        helper.make_node("ReduceMax", [base + "_abs"], [base + "_absmax"], axes=[-1], keepdims=1),
        helper.make_node("Max", [base + "_absmax", "_rows_eps"], [base + "_absmax_safe"]),
        helper.make_node("Div", [base + "_absmax_safe", "_rows_127"], [base + "_xscale"]),
        helper.make_node("Reshape", [x, rows_shape(k)], [base + "_x2"]),
        helper.make_node("Reshape", [base + "_xscale", "_rows_flat"], [base + "_xscale1"]),
        helper.make_node("Shape", [base + "_xscale1"], [base + "_rows"]),
        helper.make_node("Expand", ["_rows_zero", base + "_rows"], [base + "_xzero"]),
        helper.make_node("QuantizeLinear", [base + "_x2", base + "_xscale1", base + "_xzero"], [base + "_xq2"], axis=0),
        helper.make_node("Shape", [x], [base + "_xshape"]),
        helper.make_node("Reshape", [base + "_xq2", base + "_xshape"], [base + "_xq"]),
        helper.make_node("MatMulIntegerToFloat", [base + "_xq", base + "_Wq", "_rows_one", base + "_Wscale", "_rows_zero"],
                         [base + "_colscaled"], domain="com.microsoft"),
        helper.make_node("Mul", [base + "_colscaled", base + "_xscale"], [base]),
    ]


def rows_shape(k):
    return f"_rows_2d_{k}"


def rows_constants(ks):
    """The constants rows_matmul reads, with one [-1, K] shape per inner size K in ks."""
    return [
        numpy_helper.from_array(np.array(1e-12, dtype=np.float32), "_rows_eps"),
        numpy_helper.from_array(np.array(127.0, dtype=np.float32), "_rows_127"),
        numpy_helper.from_array(np.array(1.0, dtype=np.float32), "_rows_one"),
        numpy_helper.from_array(np.array(128, dtype=np.uint8), "_rows_zero"),
        numpy_helper.from_array(np.array([-1], dtype=np.int64), "_rows_flat"),
    ] + [numpy_helper.from_array(np.array([-1, k], dtype=np.int64), rows_shape(k)) for k in sorted(ks)]


def use_rows_domain(model):
    """Declares ONNX Runtime's com.microsoft domain (version 1), where MatMulIntegerToFloat lives. onnx's checker
    does not know that domain, so rows-form graphs are not put through it; ONNX Runtime checks them as it loads
    them, and the C# tests load the shipped model."""
    if not any(o.domain == "com.microsoft" for o in model.opset_import):
        model.opset_import.append(helper.make_opsetid("com.microsoft", 1))


def quantize(fp32_path, int8_path, embedding_name, mode="weights"):
    model = onnx.load(fp32_path)
    graph = model.graph
    inits = {i.name: i for i in graph.initializer}
    nodes = []
    new_inits = []
    dropped = set()
    inner_sizes = set()
    for node in graph.node:
        weight = inits.get(node.input[1]) if node.op_type == "MatMul" else None
        if weight is not None and len(weight.dims) == 2:
            w = numpy_helper.to_array(weight)
            q, scale, zero = quantize_columns_symmetric(w) if mode == "rows" else quantize_columns(w)
            base = node.output[0]
            new_inits += [numpy_helper.from_array(q, base + "_Wq"), numpy_helper.from_array(scale, base + "_Wscale")]
            if mode != "rows":  # symmetric weights: the rows form needs no zero point
                new_inits.append(numpy_helper.from_array(zero, base + "_Wzero"))
            dropped.add(weight.name)
            x = node.input[0]
            if mode == "weights":
                nodes += [
                    helper.make_node("DequantizeLinear", [base + "_Wq", base + "_Wscale", base + "_Wzero"],
                                     [base + "_W"], axis=1),
                    helper.make_node("MatMul", [x, base + "_W"], [base]),
                ]
                continue
            if mode == "rows":
                nodes += rows_matmul(x, base, w.shape[0])
                inner_sizes.add(w.shape[0])
                continue
            nodes += [
                helper.make_node("DynamicQuantizeLinear", [x], [base + "_xq", base + "_xscale", base + "_xzero"]),
                helper.make_node("MatMulInteger", [base + "_xq", base + "_Wq", base + "_xzero", base + "_Wzero"],
                                 [base + "_int"]),
                helper.make_node("Cast", [base + "_int"], [base + "_float"], to=TensorProto.FLOAT),
                helper.make_node("Mul", [base + "_xscale", base + "_Wscale"], [base + "_scale"]),
                helper.make_node("Mul", [base + "_float", base + "_scale"], [base]),
            ]
            continue
        if node.op_type == "Gather" and node.input[0] == embedding_name:
            table = numpy_helper.to_array(inits[embedding_name])
            q, scale, zero = quantize_rows(table)
            base = node.output[0]
            new_inits += [numpy_helper.from_array(q, embedding_name + "_q"),
                          numpy_helper.from_array(scale, embedding_name + "_scale"),
                          numpy_helper.from_array(zero.astype(np.float32), embedding_name + "_zero")]
            dropped.add(embedding_name)
            ids = node.input[1]
            nodes += [
                helper.make_node("Gather", [embedding_name + "_q", ids], [base + "_q"], axis=0),
                helper.make_node("Cast", [base + "_q"], [base + "_qf"], to=TensorProto.FLOAT),
                helper.make_node("Gather", [embedding_name + "_zero", ids], [base + "_z"], axis=0),
                helper.make_node("Gather", [embedding_name + "_scale", ids], [base + "_s"], axis=0),
                helper.make_node("Unsqueeze", [base + "_z", "_axis_last"], [base + "_z3"]),
                helper.make_node("Unsqueeze", [base + "_s", "_axis_last"], [base + "_s3"]),
                helper.make_node("Sub", [base + "_qf", base + "_z3"], [base + "_centred"]),
                helper.make_node("Mul", [base + "_centred", base + "_s3"], [base]),
            ]
            new_inits.append(numpy_helper.from_array(np.array([-1], dtype=np.int64), "_axis_last"))
            continue
        nodes.append(node)
    if mode == "rows":
        new_inits += rows_constants(inner_sizes)
    kept = [i for i in graph.initializer if i.name not in dropped]
    del graph.node[:]
    graph.node.extend(nodes)
    del graph.initializer[:]
    graph.initializer.extend(kept + new_inits)
    if mode == "rows":
        use_rows_domain(model)
    else:
        onnx.checker.check_model(model)
    onnx.save(model, int8_path)
