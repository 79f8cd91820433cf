import { useId } from "react";
import type { ActivationCheckpointing } from "@shared/schemas/budget";
import type { SettingsDraft } from "../lib/sheet-draft";
import { Radio } from "./radio";
import { SheetInput } from "./sheet-input";

type Props = {
  settings: SettingsDraft;
  issues: Record<string, string>;
  disabled?: boolean;
  onSettings: (next: SettingsDraft) => void;
};

const CHECKPOINTING: { value: ActivationCheckpointing | ""; label: string }[] = [
  { value: "", label: "Default (full)" },
  { value: "none", label: "None: every activation kept" },
  { value: "selective", label: "Selective: attention recomputed" },
  { value: "full", label: "Full: layer inputs kept, each layer rebuilt" },
];
const FLASH: { value: SettingsDraft["flashAttention"]; label: string }[] = [
  { value: "", label: "Default (on)" },
  { value: "on", label: "On: attention scores never stored" },
  { value: "off", label: "Off" },
];

/** The memory model's settings: what is kept for backward, how each sequence is split, the loss, the cache. */
export function MemorySettings({ settings, issues, disabled, onSettings }: Props) {
  const uid = useId();
  const set = (field: keyof SettingsDraft) => (text: string) => onSettings({ ...settings, [field]: text });
  return (
    <fieldset className="flex flex-col gap-3" disabled={disabled}>
      <legend className="mb-2 text-body font-semibold">Memory model</legend>
      <div className="grid gap-4 sm:grid-cols-2">
        <div className="flex flex-col gap-1" role="radiogroup" aria-label="Activation checkpointing">
          <span className="text-note font-semibold">Activation checkpointing</span>
          {CHECKPOINTING.map((c) => (
            <Radio
              key={c.value || "default"}
              name={`${uid}-ckpt`}
              checked={settings.activationCheckpointing === c.value}
              onChange={() => onSettings({ ...settings, activationCheckpointing: c.value })}
              label={c.label}
            />
          ))}
        </div>
        <div className="flex flex-col gap-1" role="radiogroup" aria-label="Flash attention">
          <span className="text-note font-semibold">Fused (flash) attention</span>
          {FLASH.map((c) => (
            <Radio
              key={c.value || "default"}
              name={`${uid}-flash`}
              checked={settings.flashAttention === c.value}
              onChange={() => onSettings({ ...settings, flashAttention: c.value })}
              label={c.label}
            />
          ))}
        </div>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <SheetInput
          label="Context parallelism"
          value={settings.contextParallel}
          onChange={set("contextParallel")}
          error={issues.contextParallel ?? issues.sequenceSharding}
          placeholder="1"
          hint="Accelerators each sequence is split over; blank: 1"
        />
        <SheetInput
          label="Loss chunks"
          value={settings.lossChunks}
          onChange={set("lossChunks")}
          error={issues.lossChunks}
          placeholder="1"
          hint="Logits computed a chunk at a time; blank: 1"
        />
        <SheetInput
          label="Vocabulary size"
          value={settings.vocabSize}
          onChange={set("vocabSize")}
          error={issues.vocabSize}
          hint="Blank: the profile's config, if it says"
        />
        <SheetInput
          label="Sequences per micro-batch"
          value={settings.microBatchSequences}
          onChange={set("microBatchSequences")}
          error={issues.microBatchSequences}
          placeholder="1"
          hint="Per data-parallel rank; blank: 1"
        />
        <SheetInput
          label="Optimizer bytes per parameter"
          value={settings.optimizerBytesPerParameter}
          onChange={set("optimizerBytesPerParameter")}
          error={issues.optimizerBytesPerParameter}
          placeholder="16"
          hint="Blank: 16 (bf16 weights and grads, fp32 master and Adam states)"
        />
        <SheetInput
          label="KV cache bytes per element"
          value={settings.kvCacheBytesPerElement}
          onChange={set("kvCacheBytesPerElement")}
          error={issues.kvCacheBytesPerElement}
          hint="Serving; 1 for an 8-bit cache; blank: the model's"
        />
      </div>
    </fieldset>
  );
}
