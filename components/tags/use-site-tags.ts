"use client";

import { useEffect, useRef } from "react";
import useSWRInfinite from "swr/infinite";
import { fetcher } from "@/lib/client/api";
import type { TagValues } from "@/schemas/tag";

export type TagRow = TagValues & { id: number };
type Page = { tags: TagRow[]; total: number; offset: number; limit: number };

const PAGE = 10_000;

/** The whole inventory of a site, loaded page by page from the route handler. */
export function useSiteTags(site: string) {
  const { data, error, isLoading, mutate, size, setSize } = useSWRInfinite<Page>(
    (index, previous: Page | null) => {
      if (previous && previous.offset + previous.tags.length >= previous.total) return null;
      return `/api/sites/${site}/tags?offset=${index * PAGE}&limit=${PAGE}`;
    },
    fetcher,
    { revalidateFirstPage: false, revalidateOnFocus: false },
  );
  const total = data?.[0]?.total ?? 0;
  // One array per set of pages, not per render: the table rebuilds all its rows when this
  // changes, so a new array must mean new content (a page loaded or revalidated).
  const cache = useRef<{ pages: TagRow[][]; tags: TagRow[] }>({ pages: [], tags: [] });
  const pages = data?.map((p) => p.tags) ?? [];
  const same = pages.length === cache.current.pages.length && pages.every((p, i) => p === cache.current.pages[i]);
  if (!same) cache.current = { pages, tags: pages.flat() };
  const tags = cache.current.tags;
  const complete = !!data && tags.length >= total;
  // Keep asking for the next page until the whole inventory is here.
  useEffect(() => {
    if (data && !complete && size === data.length && !error) void setSize(size + 1);
  }, [data, complete, size, error, setSize]);
  return { tags, total, complete, error, isLoading, mutate };
}
