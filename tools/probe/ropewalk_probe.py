#!/usr/bin/env python3
"""Ropewalk conformance probe.

Run it in the environment that trains or serves the model, against the config.json you will actually use. It asks the
installed `transformers` library to build the rotary frequencies for that config, the way the library's own attention
layers do at start-up, and writes one JSON document that Ropewalk records as a conformance check on a plan revision.

Only the Python standard library is imported here; `transformers` (and whatever it imports, e.g. torch) comes from the
user's environment. Nothing is sent anywhere: the JSON goes to stdout or --out.

    python3 ropewalk_probe.py --config path/to/config.json --length 32768 --fingerprint <plan fingerprint> --out probe.json
"""

import argparse
import hashlib
import importlib
import json
import os
import platform
import struct
import sys

PROBE_FORMAT = "ropewalk-probe/1"
# Byte layout of docs/fingerprint.md (version 1): the tag and one zero byte, then per layer group (in the order of each
# group's first layer) rotaryDim as uint32 LE, the attention factor as float64 LE and each θ′ as float64 LE.
FINGERPRINT_TAG = b"ropewalk-rotary/1"


class ProbeError(Exception):
    """A problem the user can fix (missing library, unreadable config, rope type the library does not know)."""


def fingerprint(readings):
    """SHA-256 hex over the tag and one record per reading; one reading hashes exactly as before groups existed."""
    data = bytearray(FINGERPRINT_TAG + b"\x00")
    for r in readings:
        data += struct.pack("<I", r["rotaryDim"])
        data += struct.pack("<d", float(r["attentionFactor"]))
        for f in r["invFreq"]:
            data += struct.pack("<d", float(f))
    return hashlib.sha256(bytes(data)).hexdigest()


def as_floats(values):
    """A tensor (torch, numpy) or a plain sequence, as Python floats (float32 values widen exactly to float64)."""
    if hasattr(values, "detach"):
        values = values.detach()
    if hasattr(values, "cpu"):
        values = values.cpu()
    if hasattr(values, "tolist"):
        values = values.tolist()
    return [float(v) for v in values]


def rope_block(config, layer_type):
    """The rope block the library reads, and where it found it.

    Newer releases keep it in `rope_parameters` (with `rope_theta` inside, nested per layer type for models that have
    layer types); older ones in `rope_scaling`, whose method key was `type` before it became `rope_type`.
    """
    params = getattr(config, "rope_parameters", None)
    if isinstance(params, dict) and params:
        if layer_type is not None:
            if layer_type not in params:
                raise ProbeError("rope_parameters has no entry for layer type %r (it has %s)" % (layer_type, sorted(params)))
            return params[layer_type], "rope_parameters.%s" % layer_type
        nested = [k for k, v in params.items() if isinstance(v, dict)]
        if nested and "rope_type" not in params:
            raise ProbeError(
                "rope_parameters is nested (%s) but not by the config's layer_types: pass --layer-type"
                % ", ".join(sorted(nested))
            )
        return params, "rope_parameters"
    scaling = getattr(config, "rope_scaling", None)
    if isinstance(scaling, dict) and scaling:
        return scaling, "rope_scaling"
    return {}, "none"


def rope_type_of(block):
    return block.get("rope_type") or block.get("type") or "default"


def layer_type_groups(config):
    """[(layer type, [layer indices])] in first-layer order when rope_parameters is nested by layer type, else None.

    transformers 5.x treats rope_parameters as nested when its keys are a subset of config.layer_types
    (modeling_rope_utils.py, RotaryEmbeddingConfigMixin.standardize_rope_params, "Case 2"); the model's rotary module
    then builds one inv_freq and attention scaling per layer type, calling the init function with layer_type=..., and
    skips a type whose entry is None; layer i rotates with config.layer_types[i]'s (huggingface/transformers
    src/transformers/models/gemma3/modeling_gemma3.py at 0018aa647bb1, Gemma3RotaryEmbedding.__init__ and
    Gemma3Attention; a 5.x-line commit, release number not confirmed). A flat block is one setting for every layer.
    """
    params = getattr(config, "rope_parameters", None)
    layer_types = getattr(config, "layer_types", None)
    if not isinstance(params, dict) or not params or not isinstance(layer_types, (list, tuple)) or not layer_types:
        return None
    if not set(params).issubset(set(layer_types)):
        return None
    layers = {}
    for i, t in enumerate(layer_types):
        layers.setdefault(t, []).append(i)  # dicts keep insertion order: first-layer order
    missing = sorted(t for t in layers if t not in params)
    if missing:
        raise ProbeError("rope_parameters is nested by layer type but has no entry for %s" % ", ".join(missing))
    return [(t, idx) for t, idx in layers.items() if params[t] is not None]


def default_init_from_model(transformers, config):
    """Newer releases dropped "default" from ROPE_INIT_FUNCTIONS: each model's rotary class computes it instead."""
    model_type = getattr(config, "model_type", None)
    if not model_type:
        return None
    try:
        module = importlib.import_module("transformers.models.%s.modeling_%s" % (model_type, model_type))
    except ImportError:
        return None
    for name in dir(module):
        cls = getattr(module, name)
        if name.endswith("RotaryEmbedding") and hasattr(cls, "compute_default_rope_parameters"):
            return cls.compute_default_rope_parameters
    return None


def load_config(transformers, path):
    directory = path if os.path.isdir(path) else os.path.dirname(os.path.abspath(path))
    if not os.path.isfile(os.path.join(directory, "config.json")):
        raise ProbeError("no config.json at %s" % directory)
    # AutoConfig applies the library's own loading rules (key renames, layout changes), which is the point of probing.
    return transformers.AutoConfig.from_pretrained(directory)


def read_block(transformers, rope_utils, config, block, source, length, layer_type):
    """What the library's init function builds for one rope block: its type, θ′ and attention factor."""
    rope_type = rope_type_of(block)
    init_functions = getattr(rope_utils, "ROPE_INIT_FUNCTIONS", {})
    init = init_functions.get(rope_type)
    if init is None and rope_type == "default":
        init = default_init_from_model(transformers, config)
    if init is None:
        raise ProbeError("transformers %s has no rope init function for %r" % (transformers.__version__, rope_type))
    kwargs = {"seq_len": length}
    if layer_type is not None:
        kwargs["layer_type"] = layer_type
    # Same call the rotary module makes at start-up (device first); seq_len only matters to dynamic scaling.
    inv_freq, attention_factor = init(config, "cpu", **kwargs)
    inv_freq = as_floats(inv_freq)
    return {
        "ropeType": rope_type,
        "readFrom": source,
        "rotaryDim": 2 * len(inv_freq),
        "attentionFactor": float(attention_factor),
        "invFreq": inv_freq,
    }


def read_groups(transformers, rope_utils, config, length):
    """Every layer type's reading, or None when the config carries one setting for every layer."""
    order = layer_type_groups(config)
    if order is None:
        return None
    groups = []
    for t, layers in order:
        block = config.rope_parameters[t]
        reading = read_block(transformers, rope_utils, config, block, "rope_parameters.%s" % t, length, t)
        groups.append(dict({"layerType": t, "layers": layers}, **reading))
    if not groups:
        raise ProbeError("rope_parameters gives no layer type a rotary setting")
    return groups


def probe(config_path, length, plan_fingerprint, layer_type):
    try:
        transformers = importlib.import_module("transformers")
        rope_utils = importlib.import_module("transformers.modeling_rope_utils")
    except ImportError as e:
        raise ProbeError("cannot import transformers (%s): run the probe where the model is trained or served" % e)
    config = load_config(transformers, config_path)
    groups = None if layer_type is not None else read_groups(transformers, rope_utils, config, length)
    if groups is None:
        block, source = rope_block(config, layer_type)
        top = read_block(transformers, rope_utils, config, block, source, length, layer_type)
        readings = [top]
    else:
        # The top-level fields carry the group a plan scales (full attention when the model has it, as Ropewalk's
        # shared/layer-groups.ts scaledGroupIndex), so a reader of the one-group format still sees the plan's block.
        top = next((g for g in groups if g["layerType"] == "full_attention"), groups[0])
        layer_type = top["layerType"]
        readings = groups
    result = {
        "probe": PROBE_FORMAT,
        "library": "transformers",
        "libraryVersion": str(transformers.__version__),
        "python": platform.python_version(),
        "ropeType": top["ropeType"],
        "readFrom": top["readFrom"],
        "layerType": layer_type,
        "runningLength": length,
        "rotaryDim": top["rotaryDim"],
        "attentionFactor": top["attentionFactor"],
        "invFreq": top["invFreq"],
        "planFingerprint": plan_fingerprint,
        "readFingerprint": fingerprint(readings),
    }
    if groups is not None:
        result["layerGroups"] = groups
    return result


def main(argv=None):
    parser = argparse.ArgumentParser(description="Read the rotary frequencies your transformers install builds.")
    parser.add_argument("--config", required=True, help="config.json, or the folder that holds it")
    parser.add_argument("--length", required=True, type=int, help="running length (tokens) to build for")
    parser.add_argument("--fingerprint", default=None, help="the plan revision's rotary fingerprint to check")
    parser.add_argument(
        "--layer-type", default=None, help="read only this layer type's entry of a nested rope_parameters"
    )
    parser.add_argument("--out", default=None, help="write the JSON here instead of stdout")
    args = parser.parse_args(argv)
    if args.length < 1:
        parser.error("--length must be a positive whole number")
    if args.fingerprint is not None and (len(args.fingerprint) != 64 or any(c not in "0123456789abcdef" for c in args.fingerprint)):
        parser.error("--fingerprint must be 64 lower-case hex digits, as the plan page shows it")
    try:
        result = probe(args.config, args.length, args.fingerprint, args.layer_type)
    except ProbeError as e:
        print("ropewalk probe: %s" % e, file=sys.stderr)
        return 2
    text = json.dumps(result, indent=2) + "\n"
    if args.out:
        with open(args.out, "w", encoding="utf-8") as f:
            f.write(text)
        # The fingerprints match only when the library computes in float64; Ropewalk compares the numbers themselves.
        print("wrote %s: upload it to the plan revision" % args.out, file=sys.stderr)
    else:
        sys.stdout.write(text)
    return 0


if __name__ == "__main__":
    sys.exit(main())
