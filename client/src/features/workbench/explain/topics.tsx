import type { ReactNode } from "react";
import type { MethodId } from "../../../../../shared/schemas/analysis";

export type Topic = { title: string; body: ReactNode; source: string };

const F = ({ children }: { children: ReactNode }) => <code className="rounded bg-paper-deep px-1 text-[0.95em]">{children}</code>;

/**
 * Ropewalk's own plain-words account of every figure on the workbench. The rules are the engine's
 * (shared/design DOMAIN notes); each names the published work it follows.
 */
export const TOPICS = {
  wavelength: {
    title: "Wavelength of a pair",
    body: (
      <>
        A head's rotary part has <F>d</F> dimensions, turned in <F>d/2</F> pairs. At position <F>m</F> pair <F>i</F> is turned by the angle{" "}
        <F>m·θᵢ</F>, with <F>θᵢ = b^(−2i/d)</F> radians per token and <F>b</F> the base (rope_theta). Its wavelength <F>λᵢ = 2π/θᵢ</F> is the
        number of tokens for one full turn: pair 0 turns every 2π ≈ 6.3 tokens, the last pair almost <F>b</F> times slower. A scaling method
        replaces <F>θᵢ</F> by <F>θ′ᵢ</F>, so the new wavelength is <F>λ′ᵢ = 2π/θ′ᵢ</F>.
      </>
    ),
    source: "RoFormer, Su et al. 2021",
  },
  rotations: {
    title: "Rotations in the trained window",
    body: (
      <>
        <F>rᵢ = L/λᵢ</F>: how many full turns pair <F>i</F> made across the trained context <F>L</F>. A pair with <F>r ≥ 1</F> went all the way
        round during training; a pair with <F>r &lt; 1</F> only ever saw part of its circle.
      </>
    ),
    source: "RoFormer, Su et al. 2021; the use of r to sort pairs follows YaRN, Peng et al. 2023",
  },
  bands: {
    title: "The three bands",
    body: (
      <>
        Pairs are sorted by <F>r</F> with two thresholds, <F>α</F> and <F>β</F> (default 1 and 32): <strong>spinning</strong> when{" "}
        <F>r ≥ β</F> (many turns, high frequency), <strong>turning</strong> when <F>α ≤ r &lt; β</F>, <strong>drifting</strong> when{" "}
        <F>r &lt; α</F> (less than a turn, low frequency). The bands are judged on the original frequencies.
      </>
    ),
    source: "YaRN, Peng et al. 2023 (α = 1, β = 32)",
  },
  flags: {
    title: "The three flags",
    body: (
      <ul className="list-disc pl-5">
        <li>
          <strong>Longer than the trained window</strong>: <F>λᵢ &gt; L</F>. The pair never completed one turn in training.
        </li>
        <li>
          <strong>Reaches unseen angles</strong>: the pair is longer than the trained window and <F>L′·θ′ᵢ &gt; L·θᵢ</F> (with a relative slack of
          10⁻⁹). At the target length it turns farther than it ever did in training, so the model meets angles it never saw. Position interpolation
          never sets this; the NTK-aware base change sets it on some drifting pairs.
        </li>
        <li>
          <strong>Local resolution compressed</strong>: a spinning pair (<F>r ≥ β</F>) whose step per token shrank, <F>θ′ᵢ &lt; θᵢ</F> (slack
          10⁻⁹). Neighbouring tokens look closer together than in training: the blur that position interpolation causes.
        </li>
      </ul>
    ),
    source: "Flags as defined by Ropewalk after Peng et al. 2023 (YaRN) §3.1-3.2",
  },
  ratio: {
    title: "Scale ratio θ′/θ",
    body: (
      <>
        How much a method slowed each pair: <F>1</F> means the pair runs as trained, <F>1/s</F> means it was divided by the whole factor{" "}
        <F>s = L′/L</F>. Above 1 the pair turns faster than in training (a smaller base).
      </>
    ),
    source: "Ratio of the method's frequencies to RoFormer's (Su et al. 2021)",
  },
  decay: {
    title: "Long-term decay curve",
    body: (
      <>
        <F>R(m) = (1/(d/2))·Σⱼ |Sⱼ(m)|</F> with <F>Sⱼ(m) = Σ_(i&lt;j) e^(i·m·θᵢ)</F>: an upper bound, relative, on how strongly two tokens{" "}
        <F>m</F> apart can attend to each other through the rotary part. It falls as <F>m</F> grows. Slowing the frequencies stretches the curve to
        the right: distant tokens keep more of their pull. Position 0 is left off the log axis (there <F>R = (d/2 + 1)/2</F>).
      </>
    ),
    source: "RoFormer, Su et al. 2021, §3.4.3",
  },
  criticalDimension: {
    title: "Critical dimension",
    body: (
      <>
        <F>d_extra = 2·⌈(d/2)·log_b(L/2π)⌉</F>: the dimensions whose period fits inside the trained window. Those beyond it never saw a full period
        in training, and extrapolation fails on them first.
      </>
    ),
    source: "Liu et al. 2023, Scaling Laws of RoPE-based Extrapolation, Lemma 1",
  },
  extrapolationBound: {
    title: "Critical base and extrapolation bound",
    body: (
      <>
        Tuning at <F>T_tune</F> (here the target length) with base <F>β</F>: the critical base is <F>β₀ = b^(log_(L/2π)(T_tune/2π))</F>. If{" "}
        <F>β &gt; β₀</F> the model is expected to extrapolate up to <F>T_extra = 2π·β^(d_extra/d)</F>; otherwise the bound is <F>T_tune</F> itself.
      </>
    ),
    source: "Liu et al. 2023, Theorem 3",
  },
  baseBound: {
    title: "Base lower bound",
    body: (
      <>
        <F>B(m) = Σᵢ cos(m·θᵢ)</F>. A base supports a length <F>L</F> when <F>B(m) ≥ 0</F> for every <F>m &lt; L</F>; its supported length is the
        first <F>m</F> where <F>B(m)</F> turns negative. The bases that work are not a simple "bigger is fine" range, so the smallest base is found
        by trying every base on a stated grid from the bottom up (10³ to 10¹⁰, 100 per decade), not by halving an interval.
      </>
    ),
    source: "Men et al. 2024, Base of RoPE Bounds Context Length",
  },
} satisfies Record<string, Topic>;

export type TopicId = keyof typeof TOPICS;

export const METHOD_TOPICS: Record<MethodId, Topic> = {
  default: { title: "Plain RoPE", body: <><F>θᵢ = b^(−2i/d)</F>, attention factor 1: no scaling at all, the baseline.</>, source: "RoFormer, Su et al. 2021" },
  linear: {
    title: "Position interpolation",
    body: <>Every pair is divided by the factor: <F>θ′ᵢ = θᵢ/s</F>, attention factor 1. Positions are squeezed into the trained range.</>,
    source: "Position Interpolation, Chen et al. 2023",
  },
  ntk: {
    title: "NTK-aware base change",
    body: <>A new base <F>b′ = b·s^(d/(d−2))</F>, then plain RoPE with it. Fast pairs barely change; the slowest pair ends up divided by exactly <F>s</F>.</>,
    source: "As defined in YaRN, Peng et al. 2023, §3.1, Eq. 16",
  },
  dynamic: {
    title: "Dynamic NTK",
    body: (
      <>
        The base grows with the running length <F>l</F>: <F>l* = max(l, L)</F>, <F>b′ = b·(f·l*/L − (f − 1))^(d/(d−2))</F>. Keys already in a cache
        were turned with an older base.
      </>
    ),
    source: "YaRN, Peng et al. 2023, §3.3, in the form open model libraries run",
  },
  yarn: {
    title: "YaRN",
    body: (
      <>
        Pairs with more than <F>β_fast</F> turns in the window are kept, pairs with fewer than <F>β_slow</F> are divided by <F>s</F>, and a ramp
        in the pair index blends between (the form implementations run, linear in the index rather than in <F>r</F> as the paper writes it). The
        attention factor is <F>0.1·ln s + 1</F> unless set.
      </>
    ),
    source: "YaRN, Peng et al. 2023, Eqs. 17-22",
  },
  llama3: {
    title: "Band-smoothed (Llama 3.1 rule)",
    body: (
      <>
        With <F>λ_low = L/lowFreqFactor</F> and <F>λ_high = L/highFreqFactor</F>: pairs shorter than <F>λ_high</F> are kept, pairs longer than{" "}
        <F>λ_low</F> are divided by <F>f</F>, and in between <F>θ′ = (1−σ)·θ/f + σ·θ</F> with <F>σ = (L/λ − low)/(high − low)</F>.
      </>
    ),
    source: "The rule published with the Llama 3.1 models, Meta 2024",
  },
  longrope: {
    title: "Per-pair factors (LongRoPE)",
    body: (
      <>
        Each pair has its own divisor: <F>θ′ᵢ = θᵢ/eᵢ</F>, with the long factors when <F>L′ &gt; L</F>, else the short ones; attention factor{" "}
        <F>√(1 + ln s / ln L)</F>.
      </>
    ),
    source: "LongRoPE, Ding et al. 2024",
  },
  base: {
    title: "Adjusted base",
    body: <>Plain RoPE with a new base <F>b′</F> chosen by hand (for example 10 000 → 500 000).</>,
    source: "Xiong et al. 2023 (adjusted base frequency); Rozière et al. 2023 (base 1 000 000)",
  },
};

export const CAUTION =
  "These figures are estimates from the rotary frequencies alone. Whether a scaled model really works at the target length is confirmed only by long-context evaluations of the tuned model.";
