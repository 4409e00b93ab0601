import "server-only";
import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/guard";
import { changeApprovedMail, changeRejectedMail, releasedMail, reviewRequestedMail, rolledBackMail, type BuiltMail } from "@/lib/mail/messages";
import { sendMail } from "@/lib/mail/send";
import { Change, ChangeAuthor, Site, User } from "@/models";

export type ChangeEvent = "review-requested" | "approved" | "rejected" | "released" | "rolled-back";

async function reviewers(): Promise<string[]> {
  return (await User.findAll({ where: { role: { [Op.in]: ["reviewer", "admin"] }, active: true }, attributes: ["email"] })).map((u) => u.email);
}

async function authors(changeId: number): Promise<string[]> {
  const rows = await ChangeAuthor.findAll({ where: { changeId }, include: [{ model: User, as: "user", attributes: ["email", "active"] }] });
  return rows.flatMap((a) => {
    const u = (a as ChangeAuthor & { user?: User }).user;
    return u?.active ? [u.email] : [];
  });
}

/**
 * E-mails the people a review event concerns, after the transaction committed:
 * reviewers when review is requested and on any rollback, authors on approval and
 * rejection, both on release. Mail trouble is logged by sendMail, never thrown.
 */
export async function notifyChange(event: ChangeEvent, site: Site, changeId: number, actor: Actor, comment?: string, release?: number, urgent = false): Promise<void> {
  const common = { site: { name: site.name, slug: site.slug }, by: actor.name };
  const change = await Change.findByPk(changeId, { attributes: ["note", "rollbackOf"] });
  let to: string[];
  let mail: BuiltMail;
  switch (event) {
    case "review-requested":
      to = await reviewers();
      mail = reviewRequestedMail({ ...common, changeId, note: change?.note });
      break;
    case "approved":
      to = await authors(changeId);
      mail = changeApprovedMail({ ...common, changeId, comment });
      break;
    case "rejected":
      to = await authors(changeId);
      mail = changeRejectedMail({ ...common, changeId, comment });
      break;
    case "released":
      to = [...(await authors(changeId)), ...(await reviewers())];
      mail = releasedMail({ ...common, release: release!, changeId });
      break;
    case "rolled-back": {
      to = [...(await reviewers()), ...(await authors(changeId))];
      const restores = change?.rollbackOf ?? 0;
      mail = urgent ? rolledBackMail({ ...common, release: release!, restores, urgent: true, reason: comment ?? "" }) : rolledBackMail({ ...common, release: release!, restores });
      break;
    }
  }
  const recipients = [...new Set(to)].filter((e) => e !== actor.email || event === "rolled-back");
  if (recipients.length) await sendMail({ to: recipients, ...mail });
}
