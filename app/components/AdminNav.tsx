import { NavLink } from "react-router";
import { cx } from "./cx";

/** The admin area's sections; the header's "Admin" link opens the first. */
const SECTIONS = [
  { to: "/admin/users", label: "Accounts" },
  { to: "/admin/rates", label: "Exchange rates" },
  { to: "/admin/settings", label: "Marketplace settings" },
];

export function AdminNav() {
  return (
    <nav aria-label="Admin" className="flex flex-wrap gap-1 text-sm">
      {SECTIONS.map((s) => (
        <NavLink
          key={s.to}
          to={s.to}
          className={({ isActive }) =>
            cx(
              "rounded-md px-3 py-1.5 font-medium no-underline",
              isActive ? "bg-walnut-wash text-walnut-deep" : "text-ink-soft hover:bg-sunk hover:text-ink",
            )
          }
        >
          {s.label}
        </NavLink>
      ))}
    </nav>
  );
}
