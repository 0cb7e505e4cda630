import { Form, Link, NavLink } from "react-router";
import { holdsRole, type Role } from "~/auth/roles";
import { buttonClass } from "./Button";
import { CurrencyPicker } from "./CurrencyPicker";
import { Wordmark } from "./Wordmark";
import { cx } from "./cx";

export interface HeaderUser {
  displayName: string;
  roles: Role[];
  /** Conversations with something unread (the Messages badge). */
  unread?: number;
}

interface NavItem {
  to: string;
  label: string;
  show: (user: HeaderUser | null) => boolean;
}

// Only pages that exist and that this visitor may open; selling appears once its flow is in place.
const NAV: NavItem[] = [
  { to: "/market", label: "Market", show: () => true },
  { to: "/compare", label: "Compare", show: () => true },
  { to: "/watching", label: "Watching", show: (u) => !!u },
  { to: "/messages", label: "Messages", show: (u) => !!u },
  { to: "/purchases", label: "Purchases", show: (u) => !!u },
  { to: "/sell", label: "Sell", show: (u) => !!u },
  { to: "/sales", label: "Sales", show: (u) => !!u && holdsRole(u.roles, "seller") },
  { to: "/desk", label: "Review desk", show: (u) => !!u && holdsRole(u.roles, "moderator") },
  { to: "/admin/users", label: "Admin", show: (u) => !!u && holdsRole(u.roles, "admin") },
];

const navLink = ({ isActive }: { isActive: boolean }) =>
  cx(
    "relative inline-flex h-10 items-center rounded-md px-3 text-[0.9375rem] font-medium no-underline transition-colors",
    isActive
      ? "text-walnut-deep after:absolute after:inset-x-3 after:-bottom-px after:h-0.5 after:bg-walnut"
      : "text-ink-soft hover:bg-sunk hover:text-ink",
  );

export function SiteHeader({ user, compareCount = 0 }: { user: HeaderUser | null; compareCount?: number }) {
  const items = NAV.filter((n) => n.show(user));
  const unread = user?.unread ?? 0;
  const label = (n: NavItem) =>
    n.to === "/messages" && unread ? (
      <>
        {n.label}
        <span className="figures ml-1.5 rounded-full bg-walnut px-1.5 text-xs text-card" data-testid="unread-count">
          {unread}
          <span className="sr-only"> unread</span>
        </span>
      </>
    ) : n.to === "/compare" && compareCount ? (
      <>
        {n.label}
        <span className="figures ml-1.5 rounded-full bg-walnut-wash px-1.5 text-xs text-walnut-deep">
          {compareCount}
          <span className="sr-only"> chosen</span>
        </span>
      </>
    ) : (
      n.label
    );
  return (
    <header className="border-b border-rule bg-paper/95 backdrop-blur-sm">
      <div className="h-[3px] bg-walnut" aria-hidden="true" />
      <div className="mx-auto flex max-w-6xl items-center gap-4 px-4 py-3 sm:px-6">
        <Link to="/" className="shrink-0 rounded-md no-underline" aria-label="Loadline, home">
          <Wordmark />
        </Link>
        <nav aria-label="Main" className="hidden flex-1 items-center gap-1 md:flex">
          {items.map((n) => (
            <NavLink key={n.to} to={n.to} className={navLink}>
              {label(n)}
            </NavLink>
          ))}
        </nav>
        <div className="ml-auto flex items-center gap-2">{user ? <AccountMenu user={user} /> : <SignedOut />}</div>
      </div>
      {/* On a phone the sections get their own row under the wordmark. */}
      <nav aria-label="Main" className="border-t border-rule md:hidden">
        <div className="mx-auto flex max-w-6xl gap-1 overflow-x-auto px-2 py-1">
          {items.map((n) => (
            <NavLink key={n.to} to={n.to} className={navLink}>
              {label(n)}
            </NavLink>
          ))}
        </div>
      </nav>
    </header>
  );
}

function SignedOut() {
  return (
    <>
      <Link to="/sign-in" className={buttonClass("quiet", "sm")}>
        Sign in
      </Link>
      <Link to="/sign-up" className={buttonClass("secondary", "sm", "max-sm:hidden")}>
        Create account
      </Link>
    </>
  );
}

function AccountMenu({ user }: { user: HeaderUser }) {
  const initials = user.displayName
    .split(/\s+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((w) => w[0].toUpperCase())
    .join("");
  return (
    <>
      <Link
        to="/account"
        className="inline-flex h-9 items-center gap-2 rounded-md px-1.5 text-sm font-medium text-ink no-underline hover:bg-sunk sm:px-2"
        title="Your account"
      >
        <span
          aria-hidden="true"
          className="inline-flex size-7 items-center justify-center rounded-full bg-walnut-wash text-xs font-semibold text-walnut-deep ring-1 ring-walnut/20"
        >
          {initials || "·"}
        </span>
        <span className="hidden max-w-40 truncate sm:inline">{user.displayName}</span>
        <span className="sr-only sm:hidden">Your account</span>
      </Link>
      <Form method="post" action="/sign-out">
        <button type="submit" className={buttonClass("quiet", "sm")}>
          Sign out
        </button>
      </Form>
    </>
  );
}

export function SiteFooter({ display = null }: { display?: string | null }) {
  return (
    <footer className="mt-16 border-t border-rule bg-sunk/60">
      <div className="mx-auto grid max-w-6xl gap-6 px-4 py-8 text-sm text-ink-soft sm:grid-cols-[1.2fr_1fr] sm:px-6">
        <div className="space-y-2">
          <Wordmark className="scale-90 origin-left" />
          <p className="max-w-md">
            Used and vintage hi-fi with its measurements checked: every bench-verified unit's figures passed the bench's checks against
            physics and the trade's standards.
          </p>
        </div>
        <div className="space-y-2 sm:text-right">
          <p className="max-w-md sm:ml-auto">
            <strong className="font-semibold text-ink">Mains-powered gear can kill.</strong> Capacitors stay charged after unplugging and
            valve amplifiers run at hundreds of volts: leave opening and measuring to a qualified technician and follow your local
            electrical-safety rules.
          </p>
          <p className="text-ink-faint">
            <Link to="/market" className="underline decoration-rule-strong underline-offset-2 hover:text-ink">
              Browse the market
            </Link>
          </p>
          {display ? <CurrencyPicker display={display} /> : null}
        </div>
      </div>
    </footer>
  );
}
