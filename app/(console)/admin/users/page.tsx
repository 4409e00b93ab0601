import { UserCreateForm } from "@/components/admin/user-create-form";
import { UserRowControls } from "@/components/admin/user-row-controls";
import { Forbidden } from "@/components/shell/forbidden";
import { PageHeader } from "@/components/shell/page-header";
import { currentActor } from "@/lib/auth/guard";
import { listUsers } from "@/lib/data/users";
import { can } from "@/lib/permissions";

export const metadata = { title: "Users" };

export default async function UsersPage() {
  const actor = await currentActor();
  if (!actor || !can(actor.role, "fleet.admin")) return <Forbidden what="user accounts" />;
  const users = await listUsers(actor);
  return (
    <>
      <PageHeader
        title="Users"
        crumbs={[{ href: "/", label: "Overview" }, { label: "Users" }]}
        lead="Viewers read; engineers edit tags, groups, profiles and drafts; reviewers approve, release and roll back; admins also manage accounts, sites and gateways. At least one active admin always remains."
      />
      <div className="flex flex-col gap-6">
        <UserCreateForm />
        <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
          <table aria-label="Accounts">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">E-mail</th>
                <th scope="col">Status</th>
                <th scope="col">Role and access</th>
              </tr>
            </thead>
            <tbody>
              {users.map((u) => (
                <tr key={u.id} data-testid={`user-${u.email}`}>
                  <td className="font-medium">{u.name}</td>
                  <td>{u.email}</td>
                  <td>
                    <span className={u.active ? "text-ok" : "text-ink-faint"}>{u.active ? "active" : "deactivated"}</span>
                  </td>
                  <td>
                    <UserRowControls user={u} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
    </>
  );
}
