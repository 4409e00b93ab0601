"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { signInSchema, type SignInInput } from "@/schemas/sign-in";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";

export function SignInForm({ next }: Readonly<{ next: string }>) {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    const res = await signIn("credentials", { ...values, redirect: false });
    if (!res || res.error) {
      setFailure(res?.error && res.error !== "CredentialsSignin" ? res.error : "Sign-in failed.");
      return;
    }
    router.replace(next);
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <Field label="E-mail" htmlFor="email" error={formState.errors.email?.message}>
        <input id="email" type="email" autoComplete="username" className={inputClass} aria-invalid={!!formState.errors.email} {...register("email")} />
      </Field>
      <Field label="Password" htmlFor="password" error={formState.errors.password?.message}>
        <input
          id="password"
          type="password"
          autoComplete="current-password"
          className={inputClass}
          aria-invalid={!!formState.errors.password}
          {...register("password")}
        />
      </Field>
      {failure ? (
        <p role="alert" className="rounded-panel bg-fault-soft px-3 py-2 text-label text-fault">
          {failure}
        </p>
      ) : null}
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Checking…" : "Sign in"}
      </Button>
    </form>
  );
}
