import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { currentActor } from "@/lib/auth/guard";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

type Props = { searchParams: Promise<{ next?: string }> };

export default async function SignInPage({ searchParams }: Readonly<Props>) {
  const { next } = await searchParams;
  const target = next && next.startsWith("/") && !next.startsWith("//") ? next : "/";
  if (await currentActor().catch(() => null)) redirect(target);
  return (
    <main className="min-h-screen grid place-items-center bg-panel-deep px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 text-white">
          <p className="text-micro uppercase tracking-widest text-weir-300">Edge data reduction registry</p>
          <p className="text-display font-bold">Sluice</p>
        </div>
        <section className="rounded-panel bg-panel p-6 shadow-lg" aria-labelledby="sign-in-heading">
          <h1 id="sign-in-heading" className="text-title mb-4">
            Sign in to the console
          </h1>
          <SignInForm next={target} />
        </section>
        <p className="mt-4 text-micro text-weir-100/70">
          Accounts are issued by your Sluice administrator. Gateways authenticate with their own tokens, not here.
        </p>
      </div>
    </main>
  );
}
