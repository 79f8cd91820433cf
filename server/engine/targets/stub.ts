import type { ArtifactKind, ConsumerReading, ExportTarget, TargetArtifact, TargetId } from "./types";

/**
 * A target whose compiler and reader are not written yet: it compiles to "unsupported" and reads nothing.
 * Only a placeholder while an engine's target is being written; a finished target never uses it.
 */
export function pendingTarget(id: TargetId, label: string, consumer: string, artifactKind: ArtifactKind): ExportTarget {
  return {
    id,
    label,
    consumer,
    versions: [],
    artifactKind,
    compile: () => ({ ok: false, cause: "not yet", workaround: "" }),
    read(_config: Record<string, unknown>, _artifact: TargetArtifact): ConsumerReading {
      throw new Error(`${id}: no reader yet`);
    },
  };
}
