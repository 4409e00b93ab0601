"use client";

import { useEffect, useRef } from "react";
import useSWRInfinite from "swr/infinite";
import { fetcher } from "@/lib/client/api";
import { joinStores, toStore, type TagRow, type TagStore } from "./tag-store";

export type { TagRow } from "./tag-store";
type Page = { tags: TagRow[]; total: number; offset: number; limit: number };
type StoredPage = { store: TagStore; total: number; offset: number };

const PAGE = 10_000;

// Each page becomes columns as it arrives: the per-tag objects of the JSON are then garbage
// at once, instead of living on in the SWR cache next to the columns.
const fetchPage = async (url: string): Promise<StoredPage> => {
  const page = await fetcher<Page>(url);
  return { store: toStore(page.tags), total: page.total, offset: page.offset };
};

/** The whole inventory of a site as columns, loaded page by page from the route handler. */
export function useSiteTags(site: string) {
  const { data, error, isLoading, mutate, size, setSize } = useSWRInfinite<StoredPage>(
    (index, previous: StoredPage | null) => {
      if (previous && previous.offset + previous.store.length >= previous.total) return null;
      return `/api/sites/${site}/tags?offset=${index * PAGE}&limit=${PAGE}`;
    },
    fetchPage,
    { revalidateFirstPage: false, revalidateOnFocus: false },
  );
  const total = data?.[0]?.total ?? 0;
  // One store per set of pages, not per render: the table sorts and filters again when this
  // changes, so a new store must mean new content (a page loaded or revalidated).
  const cache = useRef<{ pages: TagStore[]; store: TagStore }>({ pages: [], store: joinStores([]) });
  const pages = data?.map((p) => p.store) ?? [];
  const same = pages.length === cache.current.pages.length && pages.every((p, i) => p === cache.current.pages[i]);
  if (!same) cache.current = { pages, store: joinStores(pages) };
  const store = cache.current.store;
  const complete = !!data && store.length >= total;
  // Keep asking for the next page until the whole inventory is here.
  useEffect(() => {
    if (data && !complete && size === data.length && !error) void setSize(size + 1);
  }, [data, complete, size, error, setSize]);
  return { store, total, complete, error, isLoading, mutate };
}
