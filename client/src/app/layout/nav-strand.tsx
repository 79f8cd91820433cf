import { NavLink } from "react-router-dom";
import type { NavEntry } from "../nav";

/** Navigation as a strand of pills: a rule line runs behind them like the rope being laid. */
export function NavStrand({ entries }: { entries: NavEntry[] }) {
  return (
    <nav aria-label="Main" className="relative">
      <span aria-hidden className="absolute inset-x-0 top-1/2 h-px bg-rule-strong" />
      <ul className="relative flex flex-wrap gap-2">
        {entries.map((entry) => (
          <li key={entry.id}>
            <NavLink
              to={entry.to}
              end={entry.to === "/"}
              className={({ isActive }) =>
                `inline-block rounded-full border px-4 py-1 text-body font-medium transition-colors ${
                  isActive
                    ? "border-hemp bg-hemp text-paper"
                    : "border-rule-strong bg-paper text-ink hover:border-hemp hover:text-hemp-dark"
                }`
              }
            >
              {entry.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
