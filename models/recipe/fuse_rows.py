"""Rewrites a rows-form int8 graph of the earlier, unfused layout (Div, Round, Add and Cast to quantise each
activation row, MatMulInteger, then Cast and two Muls) into the layout quantize.rows_matmul writes now. The
weights, scales and every other node stay as they are, so the rewritten model computes the same numbers; it
is how the shipped model moved to the fused form without retraining or re-exporting.

    /usr/bin/python3 fuse_rows.py OLD.onnx NEW.onnx
"""
import sys

import onnx

from quantize import rows_constants, rows_matmul, use_rows_domain

# The outputs the unfused layout gave each quantised MatMul, by suffix of the MatMul's own output name.
UNFUSED = ["_abs", "_absmax", "_absmax_safe", "_xscale", "_xs", "_xr", "_xshift", "_xq", "_int", "_float", "_colscaled", ""]
UNFUSED_CONSTANTS = {"_rows_eps", "_rows_127", "_rows_128", "_rows_zero"}


def fuse(model):
    graph = model.graph
    weights = {i.name: i for i in graph.initializer}
    producers = {n.output[0]: n for n in graph.node}
    nodes, inner_sizes, skipped = [], set(), set()
    for node in graph.node:
        if node.op_type == "MatMulInteger":
            base = node.output[0][: -len("_int")]
            k = weights[base + "_Wq"].dims[0]
            inner_sizes.add(k)
            x = producers[base + "_abs"].input[0]
            # Put the fused nodes where the MatMul was: everything they read is computed by then.
            nodes = [n for n in nodes if n.output[0] not in {base + s for s in UNFUSED}]
            nodes += rows_matmul(x, base, k)
            skipped.update(base + s for s in UNFUSED)
            continue
        if node.output[0] in skipped:
            continue
        nodes.append(node)
    leftover = [n.output[0] for n in nodes if n.op_type in ("MatMulInteger", "Round")]
    if leftover:
        raise ValueError(f"not rewritten: {leftover}")
    # The symmetric weights' zero points (all zeros) are read by no fused node.
    kept = [i for i in graph.initializer if i.name not in UNFUSED_CONSTANTS and not i.name.endswith("_Wzero")]
    del graph.node[:]
    graph.node.extend(nodes)
    del graph.initializer[:]
    graph.initializer.extend(kept + rows_constants(inner_sizes))
    use_rows_domain(model)
    return model


def main():
    source, target = sys.argv[1:3]
    model = onnx.load(source)
    onnx.save(fuse(model), target)


if __name__ == "__main__":
    main()
