import type { ReactNode } from "react";
import { METHOD_CATALOG, METHOD_IDS, type MethodId } from "@shared/methods";

export type Topic = { title: string; body: ReactNode; source: string };

const F = ({ children }: { children: ReactNode }) => (
  <code className="rounded bg-paper-deep px-1 text-[0.95em]">{children}</code>
);

/**
 * Ropewalk's own plain-words account of every figure on the workbench. The rules are the engine's
 * (shared/design DOMAIN notes); each names the published work it follows.
 */
export const TOPICS = {
  wavelength: {
    title: "Wavelength of a pair",
    body: (
      <>
        A head's rotary part has <F>d</F> dimensions, turned in <F>d/2</F> pairs. At position <F>m</F> pair <F>i</F> is
        turned by the angle <F>m·θᵢ</F>, with <F>θᵢ = b^(−2i/d)</F> radians per token and <F>b</F> the base
        (rope_theta). Its wavelength <F>λᵢ = 2π/θᵢ</F> is the number of tokens for one full turn: pair 0 turns every 2π
        ≈ 6.3 tokens, the last pair almost <F>b</F> times slower. A scaling method replaces <F>θᵢ</F> by <F>θ′ᵢ</F>, so
        the new wavelength is <F>λ′ᵢ = 2π/θ′ᵢ</F>.
      </>
    ),
    source: "RoFormer, Su et al. 2021",
  },
  rotations: {
    title: "Rotations in the trained window",
    body: (
      <>
        <F>rᵢ = L/λᵢ</F>: how many full turns pair <F>i</F> made across the trained context <F>L</F>. A pair with{" "}
        <F>r ≥ 1</F> went all the way round during training; a pair with <F>r &lt; 1</F> only ever saw part of its
        circle.
      </>
    ),
    source: "RoFormer, Su et al. 2021; the use of r to sort pairs follows YaRN, Peng et al. 2023",
  },
  bands: {
    title: "The three bands",
    body: (
      <>
        Pairs are sorted by <F>r</F> with two thresholds, <F>α</F> and <F>β</F> (default 1 and 32):{" "}
        <strong>spinning</strong> when <F>r ≥ β</F> (many turns, high frequency), <strong>turning</strong> when{" "}
        <F>α ≤ r &lt; β</F>, <strong>drifting</strong> when <F>r &lt; α</F> (less than a turn, low frequency). The bands
        are judged on the original frequencies.
      </>
    ),
    source: "YaRN, Peng et al. 2023 (α = 1, β = 32)",
  },
  flags: {
    title: "The three flags",
    body: (
      <ul className="list-disc pl-5">
        <li>
          <strong>Longer than the trained window</strong>: <F>λᵢ &gt; L</F>. The pair never completed one turn in
          training.
        </li>
        <li>
          <strong>Reaches unseen angles</strong>: the pair is longer than the trained window and <F>L′·θ′ᵢ &gt; L·θᵢ</F>{" "}
          (with a relative slack of 10⁻⁹). At the target length it turns farther than it ever did in training, so the
          model meets angles it never saw. Position interpolation never sets this; the NTK-aware base change sets it on
          some drifting pairs.
        </li>
        <li>
          <strong>Local resolution compressed</strong>: a spinning pair (<F>r ≥ β</F>) whose step per token shrank,{" "}
          <F>θ′ᵢ &lt; θᵢ</F> (slack 10⁻⁹). Neighbouring tokens look closer together than in training: the blur that
          position interpolation causes.
        </li>
      </ul>
    ),
    source: "Flags as defined by Ropewalk after Peng et al. 2023 (YaRN) §3.1-3.2",
  },
  ratio: {
    title: "Scale ratio θ′/θ",
    body: (
      <>
        How much a method slowed each pair: <F>1</F> means the pair runs as trained, <F>1/s</F> means it was divided by
        the whole factor <F>s = L′/L</F>. Above 1 the pair turns faster than in training (a smaller base).
      </>
    ),
    source: "Ratio of the method's frequencies to RoFormer's (Su et al. 2021)",
  },
  decay: {
    title: "Long-term decay curve",
    body: (
      <>
        <F>R(m) = (1/(d/2))·Σⱼ |Sⱼ(m)|</F> with <F>Sⱼ(m) = Σ_(i&lt;j) e^(i·m·θᵢ)</F>: an upper bound, relative, on how
        strongly two tokens <F>m</F> apart can attend to each other through the rotary part. It falls as <F>m</F> grows.
        Slowing the frequencies stretches the curve to the right: distant tokens keep more of their pull. Position 0 is
        left off the log axis (there <F>R = (d/2 + 1)/2</F>).
      </>
    ),
    source: "RoFormer, Su et al. 2021, §3.4.3",
  },
  criticalDimension: {
    title: "Critical dimension",
    body: (
      <>
        <F>d_extra = 2·⌈(d/2)·log_b(L/2π)⌉</F>: the dimensions whose period fits inside the trained window. Those beyond
        it never saw a full period in training, and extrapolation fails on them first.
      </>
    ),
    source: "Liu et al. 2023, Scaling Laws of RoPE-based Extrapolation, Lemma 1",
  },
  extrapolationBound: {
    title: "Critical base and extrapolation bound",
    body: (
      <>
        Tuning at <F>T_tune</F> (here the target length) with base <F>β</F>: the critical base is{" "}
        <F>β₀ = b^(log_(L/2π)(T_tune/2π))</F>. If <F>β &gt; β₀</F> the model is expected to extrapolate up to{" "}
        <F>T_extra = 2π·β^(d_extra/d)</F>; otherwise the bound is <F>T_tune</F> itself.
      </>
    ),
    source: "Liu et al. 2023, Theorem 3",
  },
  baseBound: {
    title: "Base lower bound",
    body: (
      <>
        <F>B(m) = Σᵢ cos(m·θᵢ)</F>. A base supports a length <F>L</F> when <F>B(m) ≥ 0</F> for every <F>m &lt; L</F>;
        its supported length is the first <F>m</F> where <F>B(m)</F> turns negative. The bases that work are not a
        simple "bigger is fine" range, so the smallest base is found by trying every base on a stated grid from the
        bottom up (10³ to 10¹⁰, 100 per decade), not by halving an interval.
      </>
    ),
    source: "Men et al. 2024, Base of RoPE Bounds Context Length",
  },
} satisfies Record<string, Topic>;

export type TopicId = keyof typeof TOPICS;

/** "text `formula` text" from the catalog, with each formula set like the topics above. */
function withFormulas(text: string): ReactNode {
  return text.split("`").map((part, i) => (i % 2 === 1 ? <F key={i}>{part}</F> : part));
}

/** How each method computes, from its catalog entry; the title is the name the pickers show. */
export const METHOD_TOPICS = Object.fromEntries(
  METHOD_IDS.map((id) => {
    const { label, explanation } = METHOD_CATALOG[id];
    return [id, { title: label, body: <>{withFormulas(explanation.text)}</>, source: explanation.source }];
  }),
) as Record<MethodId, Topic>;

export const CAUTION =
  "These figures are estimates from the rotary frequencies alone. Whether a scaled model really works at the target length is confirmed only by long-context evaluations of the tuned model.";
