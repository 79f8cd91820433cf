import { servedContextOf } from "../../../shared/lineage";
import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { AppError, Conflict, Invalid, NotFound } from "../../platform/errors";
import { parseOr400 } from "../../platform/validate";
import { findHostile, MAX_JSON_DEPTH } from "../../platform/hostile";
import { recordAudit } from "../../platform/audit";
import {
  modelProfileInputSchema,
  rotaryDimOf,
  type ImportWarning,
  type ModelProfile,
  type ModelProfileInput,
  type ModelProfileValues,
  type SessionUser,
} from "../../../shared/schemas";
import { ConfigImportError, parseModelConfig } from "./config-import";
import * as repo from "./models.repo";
import { rotaryShapeOf } from "../../../shared/profile-shapes";
import { layerGroupsOf } from "../../../shared/layer-groups";
import { isUniqueViolation } from "../../db/errors";
import { pageWindow } from "../../platform/paging";
import type { ModelsListQuery } from "../../../shared/schemas/models";

/**
 * A profile stored before the nesting limit existed may hold a scaling block too deep to serialise, which broke
 * every reader of the list; such a block reads as none, with a warning saying so.
 */
const UNREADABLE_SCALING: ImportWarning = {
  code: "scaling_unreadable",
  message: `The stored rope_scaling block is nested deeper than ${MAX_JSON_DEPTH} levels and cannot be shown.`,
  fix: "Import the config again, or enter the current scaling by hand.",
};

export function toModelProfile(row: repo.ModelListRow | repo.ModelRow): ModelProfile {
  const { sourceConfig: _omit, ...rest } = row as repo.ModelRow;
  const d = rotaryDimOf(row);
  const unreadable = row.currentScaling != null && findHostile(row.currentScaling) !== undefined;
  const warnings = (row.importWarnings as ImportWarning[]) ?? [];
  return {
    ...rest,
    currentScaling: unreadable ? null : ((row.currentScaling as ModelProfile["currentScaling"]) ?? null),
    layerGroups: layerGroupsOf({
      ...row,
      currentScaling: unreadable ? null : (row.currentScaling as ModelProfile["currentScaling"]),
      layerGroups: row.layerGroups as ModelProfile["layerGroups"] | null,
    }),
    mropeSection: (row.mropeSection as number[] | null) ?? null,
    importWarnings: unreadable ? [...warnings, UNREADABLE_SCALING] : warnings,
    retiredAt: row.retiredAt?.toISOString() ?? null,
    rotaryDim: d,
    pairs: d / 2,
    pretrainedContext: row.trainedContext,
    servedContext: servedContextOf(row),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** The layout columns as stored: the scaled group follows the top-level fields the author edits (layerGroupsOf). */
const layoutColumns = (input: ModelProfileValues) => ({
  currentScaling: input.currentScaling ?? null,
  layerGroups: input.layerGroups?.length ? layerGroupsOf(input) : null,
  mropeSection: input.mropeSection ?? null,
  mropeInterleaved: input.mropeInterleaved ?? false,
  kvLatentDim: input.kvLatentDim ?? null,
});

const nameTaken = () => new Conflict("a profile with this name already exists", { name: "already taken" });

/** One page of profiles by name (optionally those whose name contains `q`, optionally without retired ones). */
export async function listModels(deps: AppDeps, q: ModelsListQuery) {
  const query = { q: q.q, retired: q.retired, ...pageWindow(q.page, q.pageSize) };
  const [rows, count] = await Promise.all([repo.listModelPage(deps.db, query), repo.countModels(deps.db, query)]);
  return { models: rows.map(toModelProfile), ...count, page: q.page, pageSize: q.pageSize };
}

async function mustFind(deps: AppDeps, id: number) {
  const row = await repo.findModelRow(deps.db, id);
  if (!row) throw new NotFound("no such model profile");
  return row;
}
export const getModel = async (deps: AppDeps, id: number) => toModelProfile(await mustFind(deps, id));

/** What the engine needs of a saved profile. */
export async function getModelShape(deps: AppDeps, id: number) {
  const m = await mustFind(deps, id);
  return { ...rotaryShapeOf(m), parameters: m.parameters, bytesPerElement: m.bytesPerElement, name: m.name };
}

export async function getModelSource(deps: AppDeps, id: number) {
  const m = await mustFind(deps, id);
  if (!m.sourceConfig) throw new NotFound("this profile was not imported from a file");
  return { fileName: m.sourceFileName ?? "config.json", text: m.sourceConfig };
}

export async function createModel(
  deps: AppDeps,
  actor: SessionUser,
  input: ModelProfileValues,
  source?: { fileName: string; text: string; warnings: ImportWarning[] },
) {
  try {
    return await deps.db.transaction(async (tx) => {
      const row = await repo.insertModelRow(tx, {
        ...input,
        ...layoutColumns(input),
        createdBy: actor.id,
        sourceFileName: source?.fileName ?? null,
        sourceConfig: source?.text ?? null,
        importWarnings: source?.warnings ?? [],
      });
      await recordAudit(tx, {
        actorId: actor.id,
        action: source ? "model.imported" : "model.created",
        subjectType: "model",
        subjectId: row.id,
        detail: { name: row.name },
      });
      return toModelProfile(row);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken();
    throw e;
  }
}

export async function updateModel(deps: AppDeps, actor: SessionUser, id: number, input: ModelProfileValues) {
  await mustFind(deps, id);
  try {
    return await deps.db.transaction(async (tx) => {
      const row = await repo.updateModelRow(tx, id, { ...input, ...layoutColumns(input) });
      await recordAudit(tx, {
        actorId: actor.id,
        action: "model.updated",
        subjectType: "model",
        subjectId: id,
        detail: { name: row.name },
      });
      return toModelProfile(row);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken();
    throw e;
  }
}

async function setRetired(
  tx: Executor,
  actor: SessionUser,
  id: number,
  retired: boolean,
  usedBy: { id: number }[] = [],
) {
  const row = await repo.updateModelRow(tx, id, { retiredAt: retired ? new Date() : null });
  await recordAudit(tx, {
    actorId: actor.id,
    action: retired ? "model.retired" : "model.restored",
    subjectType: "model",
    subjectId: id,
    detail: { name: row.name, ...(retired ? { usedBy: usedBy.map((p) => p.id) } : {}) },
  });
  return toModelProfile(row);
}

async function mustLock(tx: Executor, id: number) {
  const row = await repo.lockModelRow(tx, id);
  if (!row) throw new NotFound("no such model profile");
  return row;
}

/** Deletes a profile no plan uses; one that plans use is retired instead (hidden from pickers, the plans keep working). */
export type { ModelUsage } from "./models.repo";

export async function deleteModel(deps: AppDeps, usage: repo.ModelUsage, actor: SessionUser, id: number) {
  return deps.db.transaction(async (tx) => {
    const row = await mustLock(tx, id);
    const usedBy = await usage(tx, id);
    if (usedBy.length) {
      const model = row.retiredAt ? toModelProfile(row) : await setRetired(tx, actor, id, true, usedBy);
      return { deleted: false as const, model, usedBy };
    }
    await repo.deleteModelRow(tx, id);
    await recordAudit(tx, {
      actorId: actor.id,
      action: "model.deleted",
      subjectType: "model",
      subjectId: id,
      detail: { name: row.name },
    });
    return { deleted: true as const };
  });
}

export async function retireModel(deps: AppDeps, usage: repo.ModelUsage, actor: SessionUser, id: number) {
  return deps.db.transaction(async (tx) => {
    const row = await mustLock(tx, id);
    if (row.retiredAt) throw new Conflict(`${row.name} is already retired`, { id: "already retired" });
    return setRetired(tx, actor, id, true, await usage(tx, id));
  });
}

export async function restoreModel(deps: AppDeps, actor: SessionUser, id: number) {
  return deps.db.transaction(async (tx) => {
    const row = await mustLock(tx, id);
    if (!row.retiredAt) throw new Conflict(`${row.name} is not retired`, { id: "not retired" });
    return setRetired(tx, actor, id, false);
  });
}

/** Parses an uploaded config; saves it (with the file) only when asked, applying the user's edits on top. */
export async function importConfig(
  deps: AppDeps,
  actor: SessionUser,
  file: { originalname: string; buffer: Buffer } | undefined,
  save: boolean,
  overrides: Partial<ModelProfileInput>,
) {
  if (!file) throw new Invalid("attach a config.json as the multipart field 'file'", { file: "missing" });
  const text = file.buffer.toString("utf8");
  let parsed;
  try {
    parsed = parseModelConfig(text, file.originalname);
  } catch (e) {
    if (e instanceof ConfigImportError) throw new AppError("invalid", e.code, e.message, e.fields);
    throw e;
  }
  const profile = { ...parsed.profile, ...overrides };
  if (!save) return { profile, warnings: parsed.warnings, saved: null };
  const values = parseOr400(modelProfileInputSchema, profile, "profile");
  const saved = await createModel(deps, actor, values, {
    fileName: file.originalname,
    text,
    warnings: parsed.warnings,
  });
  return { profile, warnings: parsed.warnings, saved };
}
