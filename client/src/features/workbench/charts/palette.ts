import type { Band } from "@shared/schemas/analysis";

/**
 * Ropewalk's chart colours, drawn from the workshop palette (index.css): ink for the original frequencies,
 * one rope colour per method row, pale washes for the three bands, signal red only for flags that warn.
 */
export const INK = "#1f2633";
export const INK_SOFT = "#4d5566";
export const RULE = "#d9cfbd";
export const TRAINED_LINE = "#1f2633";
export const TARGET_LINE = "#9a5b1f";

const METHOD_COLOURS = ["#9a5b1f", "#2d7a74", "#6a4c93", "#3b6ea8", "#8c7a1e", "#a3476f", "#4f7d3a", "#7a4614"];
export const methodColour = (index: number) => METHOD_COLOURS[index % METHOD_COLOURS.length];

export const BAND_STYLE: Record<Band, { wash: string; text: string; label: string; plain: string }> = {
  spinning: { wash: "#dcebe7", text: "#1f5c57", label: "Spinning", plain: "many turns in training (high frequency)" },
  turning: { wash: "#f1e2cd", text: "#7a4614", label: "Turning", plain: "a few turns in training" },
  drifting: {
    wash: "#e4e1ee",
    text: "#4a4373",
    label: "Drifting",
    plain: "under one turn in training (low frequency)",
  },
};

export type FlagId = "exceedsTrainedWindow" | "unseenAngles" | "compressedResolution";
export const FLAG_IDS: FlagId[] = ["exceedsTrainedWindow", "unseenAngles", "compressedResolution"];

export const FLAG_STYLE: Record<FlagId, { colour: string; label: string; marker: "ring" | "triangle" | "diamond" }> = {
  exceedsTrainedWindow: { colour: INK_SOFT, label: "Longer than the trained window", marker: "ring" },
  unseenAngles: { colour: "#b23a2e", label: "Reaches unseen angles", marker: "triangle" },
  compressedResolution: { colour: "#7a4614", label: "Local resolution compressed", marker: "diamond" },
};
