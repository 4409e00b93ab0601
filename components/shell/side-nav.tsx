"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import type { NavItem } from "./nav-items";

export function SideNav({ items }: Readonly<{ items: NavItem[] }>) {
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
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
