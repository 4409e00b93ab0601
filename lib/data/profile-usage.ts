import "server-only";
import { Assignment, ProfileRevision, Site, TagGroup } from "@/models";

export type ProfileUsage = { site: string; siteName: string; group: string; groupId: number; revision: number };

/** Where each profile is assigned (any revision), by profile id. */
export async function profileUsage(profileIds: number[]): Promise<Map<number, ProfileUsage[]>> {
  const result = new Map<number, ProfileUsage[]>();
  if (profileIds.length === 0) return result;
  const rows = await Assignment.findAll({
    attributes: ["id"],
    include: [
      { model: ProfileRevision, as: "revision", attributes: ["profileId", "number"], where: { profileId: profileIds } },
      { model: TagGroup, as: "group", attributes: ["id", "name"], include: [{ model: Site, as: "site", attributes: ["slug", "name"] }] },
    ],
  });
  for (const a of rows) {
    const g = (a as Assignment & { group?: TagGroup & { site?: Site } }).group;
    const entry = { site: g?.site?.slug ?? "", siteName: g?.site?.name ?? "", group: g?.name ?? "", groupId: g?.id ?? 0, revision: a.revision!.number };
    const list = result.get(a.revision!.profileId) ?? [];
    list.push(entry);
    result.set(a.revision!.profileId, list);
  }
  for (const list of result.values()) list.sort((x, y) => x.site.localeCompare(y.site) || x.group.localeCompare(y.group));
  return result;
}
