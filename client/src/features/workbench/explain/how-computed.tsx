import type { MethodId } from "@shared/schemas/analysis";
import { CAUTION, METHOD_TOPICS, TOPICS, type Topic, type TopicId } from "./topics";

function TopicBlock({ topic }: { topic: Topic }) {
  return (
    <div className="flex flex-col gap-1">
      <p className="font-semibold text-ink">{topic.title}</p>
      <div className="text-body text-ink">{topic.body}</div>
      <p className="text-note text-ink-soft">Source: {topic.source}.</p>
    </div>
  );
}

/** "How is this computed?" beside a figure: one click opens Ropewalk's explanation and the published source. */
export function HowComputed({ topics = [], methods = [] }: { topics?: TopicId[]; methods?: MethodId[] }) {
  const blocks = [...topics.map((t) => TOPICS[t]), ...[...new Set(methods)].map((m) => METHOD_TOPICS[m])];
  return (
    <details className="group rounded-md border border-rule bg-paper/60 text-body">
      <summary className="cursor-pointer list-none px-3 py-1.5 text-note font-medium text-seaglass select-none hover:text-seaglass-dark">
        <span aria-hidden className="mr-1 inline-block transition-transform group-open:rotate-90">
          ▸
        </span>
        How is this computed?
      </summary>
      <div className="flex flex-col gap-3 border-t border-rule px-3 py-3">
        {blocks.map((b) => (
          <TopicBlock key={b.title} topic={b} />
        ))}
        <p className="rounded border border-signal/30 bg-signal-pale/60 px-2 py-1 text-note text-signal-dark">
          {CAUTION}
        </p>
      </div>
    </details>
  );
}
