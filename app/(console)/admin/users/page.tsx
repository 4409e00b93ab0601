import { PageHeader } from "@/components/shell/page-header";
import { Forbidden } from "@/components/shell/forbidden";
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
      <PageHeader title="Users" crumbs={[{ href: "/", label: "Overview" }, { label: "Users" }]} />
      <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
        <table>
          <thead>
            <tr>
              <th scope="col">Name</th>
              <th scope="col">E-mail</th>
              <th scope="col">Role</th>
              <th scope="col">Status</th>
            </tr>
          </thead>
          <tbody>
            {users.map((u) => (
              <tr key={u.id}>
                <td className="font-medium">{u.name}</td>
                <td>{u.email}</td>
                <td className="capitalize">{u.role}</td>
                <td>{u.active ? "active" : "deactivated"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
