import type { ButtonHTMLAttributes } from "react";

type Props = ButtonHTMLAttributes<HTMLButtonElement> & { tone?: "primary" | "quiet" | "danger" };

const tones = {
  primary: "bg-weir-600 text-white hover:bg-weir-700 disabled:bg-weir-300",
  quiet: "bg-panel text-ink border border-panel-line hover:bg-panel-sunk disabled:text-ink-faint",
  danger: "bg-fault text-white hover:brightness-95 disabled:opacity-60",
};

export function Button({ tone = "primary", className = "", type = "button", ...rest }: Readonly<Props>) {
  return (
    <button
      type={type}
      className={`inline-flex items-center justify-center gap-1.5 rounded-panel px-3 py-1.5 text-label font-medium min-h-9 transition-colors ${tones[tone]} ${className}`}
      {...rest}
    />
  );
}
