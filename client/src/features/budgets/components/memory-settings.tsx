import { useId } from "react";
import type { ActivationCheckpointing } from "@shared/schemas/budget";
import type { SettingsDraft } from "../lib/sheet-draft";
import { RadioColumn } from "@/components/radio";
import { SheetFieldRow, type SheetField } from "./sheet-input";

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

const FIGURES: SheetField<SettingsDraft>[] = [
  {
    field: "contextParallel",
    label: "Context parallelism",
    issueKeys: ["contextParallel", "sequenceSharding"],
    placeholder: "1",
    hint: "Accelerators each sequence is split over; blank: 1",
  },
  { field: "lossChunks", label: "Loss chunks", placeholder: "1", hint: "Logits computed a chunk at a time; blank: 1" },
  { field: "vocabSize", label: "Vocabulary size", hint: "Blank: the profile's config, if it says" },
  {
    field: "microBatchSequences",
    label: "Sequences per micro-batch",
    placeholder: "1",
    hint: "Per data-parallel rank; blank: 1",
  },
  {
    field: "optimizerBytesPerParameter",
    label: "Optimizer bytes per parameter",
    placeholder: "16",
    hint: "Blank: 16 (bf16 weights and grads, fp32 master and Adam states)",
  },
  {
    field: "kvCacheBytesPerElement",
    label: "KV cache bytes per element",
    hint: "Serving; 1 for an 8-bit cache; blank: the model's",
  },
];

/** The memory model's settings: what is kept for backward, how each sequence is split, the loss, the cache. */
export function MemorySettings({ settings, issues, disabled, onSettings }: Props) {
  const uid = useId();
  return (
    <fieldset className="flex flex-col gap-3" disabled={disabled}>
      <legend className="mb-2 text-body font-semibold">Memory model</legend>
      <div className="grid gap-4 sm:grid-cols-2">
        <RadioColumn
          name={`${uid}-ckpt`}
          title="Activation checkpointing"
          options={CHECKPOINTING}
          value={settings.activationCheckpointing}
          onChange={(activationCheckpointing) => onSettings({ ...settings, activationCheckpointing })}
        />
        <RadioColumn
          name={`${uid}-flash`}
          title="Fused (flash) attention"
          ariaLabel="Flash attention"
          options={FLASH}
          value={settings.flashAttention}
          onChange={(flashAttention) => onSettings({ ...settings, flashAttention })}
        />
      </div>
      <SheetFieldRow
        className="grid gap-3 sm:grid-cols-3"
        fields={FIGURES}
        draft={settings}
        onChange={onSettings}
        issues={issues}
      />
    </fieldset>
  );
}
