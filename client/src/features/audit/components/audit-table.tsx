import type { AuditEvent } from "../../../../../shared/schemas/audit";
import { Button } from "../../../components/button";
import { formatDateTime } from "../../../lib/format";

/** One line per detail key; hashes and long values wrap instead of widening the table. */
function Detail({ detail }: { detail: Record<string, unknown> }) {
  const entries = Object.entries(detail);
  if (entries.length === 0) return <span className="text-ink-soft">—</span>;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-2 text-note">
      {entries.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd className="break-all">{typeof v === "object" ? JSON.stringify(v) : String(v)}</dd>
        </div>
      ))}
    </dl>
  );
}

type AuditTableProps = { events: AuditEvent[]; onActor: (actorId: number) => void; onSubject: (type: string, id: string) => void; busy?: boolean };

/** The trail as the server paged it, newest first; a name or subject narrows the trail to it. */
export function AuditTable({ events, onActor, onSubject, busy = false }: AuditTableProps) {
  return (
    <div className="overflow-x-auto rounded-md border border-rule" aria-busy={busy || undefined}>
      <table className={`w-full border-collapse text-left text-body ${busy ? "opacity-70" : ""}`}>
        <caption className="sr-only">Audit trail</caption>
        <thead className="bg-paper-deep text-note font-semibold tracking-wide text-ink-soft uppercase">
          <tr>
            <th scope="col" className="px-3 py-2">When</th>
            <th scope="col" className="px-3 py-2">Who</th>
            <th scope="col" className="px-3 py-2">Action</th>
            <th scope="col" className="px-3 py-2">Subject</th>
            <th scope="col" className="px-3 py-2">Detail</th>
          </tr>
        </thead>
        <tbody>
          {events.map((e) => (
            <tr key={e.id} className="border-t border-rule/70 align-top">
              <td className="px-3 py-2 whitespace-nowrap">{formatDateTime(e.at)}</td>
              <td className="px-3 py-2">
                {e.actor ? (
                  <Button variant="quiet" size="sm" className="justify-start text-left" onClick={() => onActor(e.actor!.id)} title="Only this person’s actions">
                    {e.actor.name}
                  </Button>
                ) : (
                  <span className="text-ink-soft">system</span>
                )}
              </td>
              <td className="px-3 py-2 font-mono text-note">{e.action}</td>
              <td className="px-3 py-2">
                {e.subjectId ? (
                  <Button variant="quiet" size="sm" className="whitespace-nowrap" onClick={() => onSubject(e.subjectType, e.subjectId!)} title="Only this subject">
                    {e.subjectType} {e.subjectId}
                  </Button>
                ) : (
                  e.subjectType
                )}
              </td>
              <td className="px-3 py-2"><Detail detail={e.detail} /></td>
            </tr>
          ))}
          {events.length === 0 && (
            <tr>
              <td colSpan={5} className="px-3 py-6 text-center text-ink-soft">No events match these filters.</td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
