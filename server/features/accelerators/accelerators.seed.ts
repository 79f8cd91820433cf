import type { Db } from "../../db/client";
import { accelerators } from "../../db/schema";

/** Invented accelerator types of the demo lab: plausible dense bf16 peaks, memory and hourly prices, not real products. */
export const DEMO_ACCELERATORS = [
  {
    name: "Kittiwake K80",
    memoryBytes: 80e9,
    peakFlops: 9.9e14,
    pricePerHour: 2.4,
    notes: "Demo lab's main training pool (invented figures).",
  },
  {
    name: "Fulmar F141",
    memoryBytes: 141e9,
    peakFlops: 9.9e14,
    pricePerHour: 3.6,
    notes: "Large-memory nodes for long sequences (invented figures).",
  },
  {
    name: "Petrel P48",
    memoryBytes: 48e9,
    peakFlops: 3.6e14,
    pricePerHour: 0.95,
    notes: "Serving and small ablations (invented figures).",
  },
];

export async function seedAccelerators(db: Db, people: Map<string, number>) {
  const createdBy = people.get("infra@ropewalk.test") ?? null;
  for (const a of DEMO_ACCELERATORS) {
    await db
      .insert(accelerators)
      .values({ ...a, createdBy })
      .onConflictDoNothing({ target: accelerators.name });
  }
}
