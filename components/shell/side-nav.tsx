"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import type { NavItem } from "./nav-items";

/** A count shown on a nav entry, with the words a screen reader says for it. */
export type NavBadge = { count: number; label: string };

export function SideNav({ items, badges = {} }: Readonly<{ items: NavItem[]; badges?: Record<string, NavBadge> }>) {
  const pathname = usePathname();
  return (
    <nav aria-label="Console sections">
      <ul className="flex md:flex-col gap-1 overflow-x-auto">
        {items.map((item) => {
          const active = item.href === "/" ? pathname === "/" : pathname === item.href || pathname.startsWith(`${item.href}/`);
          return (
            <li key={item.href}>
              <Link
                href={item.href}
                aria-current={active ? "page" : undefined}
                className={`block whitespace-nowrap rounded-panel px-3 py-2 text-label ${
                  active ? "bg-weir-700 text-white" : "text-weir-100 hover:bg-white/10"
                }`}
              >
                {item.label}
                {badges[item.href] ? (
                  <>
                    <span aria-hidden className="ml-2 rounded-full bg-fault px-1.5 py-0.5 text-micro font-medium text-white" data-testid={`nav-badge-${item.href}`}>
                      {badges[item.href].count}
                    </span>
                    <span className="sr-only">, {badges[item.href].label}</span>
                  </>
                ) : null}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
