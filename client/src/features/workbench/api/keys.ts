/** Query keys of the workbench, general to specific. */
export const workbenchKeys = {
  all: ["workbench"] as const,
  supportedLengths: (rotaryDim: number, bases: number[]) =>
    [...workbenchKeys.all, "supported-length", rotaryDim, bases] as const,
  smallestBase: (rotaryDim: number, targetContext: number) =>
    [...workbenchKeys.all, "smallest-base", rotaryDim, targetContext] as const,
};
