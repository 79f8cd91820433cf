import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

/**
 * Runs tools/probe/ropewalk_probe.py with Debian's python3 against a stand-in `transformers` package written here.
 * The stand-in is not the library: it is the smallest module with the same import surface (AutoConfig.from_pretrained,
 * modeling_rope_utils.ROPE_INIT_FUNCTIONS, a model module's RotaryEmbedding.compute_default_rope_parameters) so the
 * probe's own logic (which block, which rope type, which running length, the JSON and its fingerprint) can be tested
 * without torch. Its frequencies are the textbook ones: θ_i = b^(−2i/d) (Su et al. 2021, RoFormer, eq. 15), linear
 * θ_i/s (Chen et al. 2023, position interpolation), dynamic NTK b·((s·L/L0) − (s − 1))^(d/(d−2)) (common practice,
 * emozilla 2023, no paper).
 */
export const PYTHON = process.env.PYTHON ?? (existsSync("/usr/bin/python3") ? "/usr/bin/python3" : "python3");
export const PROBE_SCRIPT = path.resolve("tools/probe/ropewalk_probe.py");

/** v4-like keeps `rope_scaling` and "default" in the registry; v5-like moves to `rope_parameters` and drops it. */
export type StandInFlavour = "v4" | "v5";

const ROPE_UTILS = `
import math

def _dim(config):
    head = getattr(config, "head_dim", None) or config.hidden_size // config.num_attention_heads
    return int(head * getattr(config, "partial_rotary_factor", 1.0))

def _block(config, layer_type=None):
    p = getattr(config, "rope_parameters", None)
    if isinstance(p, dict):
        return p[layer_type] if layer_type else p
    return getattr(config, "rope_scaling", None) or {}

def _base(config, layer_type=None):
    return _block(config, layer_type).get("rope_theta", getattr(config, "rope_theta", 10000.0))

def _default(config, device=None, seq_len=None, layer_type=None):
    d, b = _dim(config), _base(config, layer_type)
    return [1.0 / b ** (i / d) for i in range(0, d, 2)], 1.0

def _linear(config, device=None, seq_len=None, layer_type=None):
    inv, a = _default(config, device, seq_len, layer_type)
    s = _block(config, layer_type)["factor"]
    return [x / s for x in inv], a

def _dynamic(config, device=None, seq_len=None, layer_type=None):
    d, b, s = _dim(config), _base(config, layer_type), _block(config, layer_type)["factor"]
    l0 = config.max_position_embeddings
    l = seq_len if seq_len is not None and seq_len > l0 else l0
    b = b * ((s * l / l0) - (s - 1)) ** (d / (d - 2))
    return [1.0 / b ** (i / d) for i in range(0, d, 2)], 1.0

ROPE_INIT_FUNCTIONS = {"linear": _linear, "dynamic": _dynamic}
`;

const INIT = (flavour: StandInFlavour) => `
import json, os
__version__ = "${flavour === "v4" ? "4.46.3" : "5.0.0"}+stand-in"

class _Config:
    def __init__(self, values):
        self.__dict__.update(values)

class AutoConfig:
    @staticmethod
    def from_pretrained(directory):
        with open(os.path.join(directory, "config.json"), encoding="utf-8") as f:
            values = json.load(f)
        ${
          flavour === "v5"
            ? `# the newer layout: rope_scaling and the top-level rope_theta fold into rope_parameters
        if "rope_parameters" not in values:
            block = dict(values.pop("rope_scaling", None) or {"rope_type": "default"})
            block.setdefault("rope_theta", values.pop("rope_theta", 10000.0))
            values["rope_parameters"] = block`
            : "pass"
        }
        return _Config(values)
`;

/** A model module whose rotary class computes plain RoPE, as each model file does in the newer releases. */
const modeling = (className: string) => `
from transformers.modeling_rope_utils import _default

class ${className}RotaryEmbedding:
    compute_default_rope_parameters = staticmethod(_default)
`;

/** "windowed_test" → "WindowedTest", the class-name prefix a model file uses. */
const classPrefix = (modelType: string) =>
  modelType
    .split("_")
    .map((w) => w.charAt(0).toUpperCase() + w.slice(1))
    .join("");

/**
 * Writes the stand-in package into a fresh folder and returns the folder to put on PYTHONPATH. `modelTypes` are the
 * model modules it carries (`transformers.models.<type>.modeling_<type>`), each with its rotary class.
 */
export function writeStandIn(flavour: StandInFlavour, modelTypes: readonly string[] = ["llama"]): string {
  const root = mkdtempSync(path.join(tmpdir(), `rw-probe-${flavour}-`));
  const pkg = path.join(root, "transformers");
  mkdirSync(path.join(pkg, "models"), { recursive: true });
  writeFileSync(path.join(pkg, "__init__.py"), INIT(flavour));
  const utils = flavour === "v4" ? `${ROPE_UTILS}\nROPE_INIT_FUNCTIONS["default"] = _default\n` : ROPE_UTILS;
  writeFileSync(path.join(pkg, "modeling_rope_utils.py"), utils);
  writeFileSync(path.join(pkg, "models", "__init__.py"), "");
  for (const type of modelTypes) {
    mkdirSync(path.join(pkg, "models", type));
    writeFileSync(path.join(pkg, "models", type, "__init__.py"), "");
    writeFileSync(path.join(pkg, "models", type, `modeling_${type}.py`), modeling(classPrefix(type)));
  }
  return root;
}

/** A folder holding config.json with the given values. */
export function writeConfig(values: Record<string, unknown>): string {
  const dir = mkdtempSync(path.join(tmpdir(), "rw-probe-config-"));
  writeFileSync(path.join(dir, "config.json"), JSON.stringify(values));
  return dir;
}

export interface ProbeRun {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** Spawns the probe without site-packages (-S), so only the stand-in can answer `import transformers`; `pythonPath` null runs it with no stand-in on the path (as if transformers were missing). */
export function runProbe(args: string[], pythonPath: string | null): ProbeRun {
  const env = { ...process.env, PYTHONPATH: pythonPath ?? "", PYTHONNOUSERSITE: "1", PYTHONDONTWRITEBYTECODE: "1" };
  const r = spawnSync(PYTHON, ["-S", PROBE_SCRIPT, ...args], { env, encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** A probe document as the probe writes it, for θ_i = b^(−2i/d) divided by `divide` (bodies for route tests). */
export function probeDocument(rotaryDim = 128, base = 10000, divide = 1) {
  const invFreq = Array.from({ length: rotaryDim / 2 }, (_, i) => base ** ((-2 * i) / rotaryDim) / divide);
  return {
    probe: "ropewalk-probe/1",
    library: "transformers",
    libraryVersion: "4.46.3+stand-in",
    ropeType: divide === 1 ? "default" : "linear",
    runningLength: 32768,
    rotaryDim,
    attentionFactor: 1,
    invFreq,
    planFingerprint: null,
    readFingerprint: "0".repeat(64),
  };
}
