import { formatBytes, formatMoney, sig3, TFLOPS } from "@/lib/format";

type Spec = { peakFlops: number; memoryBytes: number; pricePerHour: number };

/** "Forge-9 (400 TFLOP/s, 80 GiB, 2.50 per hour)"; custom figures are named as such. */
export function clusterLabel(name: string | null, spec: Spec): string {
  const figures = `${sig3(spec.peakFlops / TFLOPS)} TFLOP/s dense peak, ${formatBytes(spec.memoryBytes)}, ${formatMoney(spec.pricePerHour)} per hour`;
  return `${name ?? "custom accelerator"} (${figures})`;
}
