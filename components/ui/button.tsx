import type { ButtonHTMLAttributes } from "react";

type Variant = "primary" | "secondary" | "danger" | "ghost";

const STYLES: Record<Variant, string> = {
  primary: "bg-lagoon-600 text-white hover:bg-lagoon-700 disabled:bg-rule-strong",
  secondary: "bg-panel text-ink border border-rule-strong hover:bg-lagoon-50",
  danger: "bg-danger-ink text-white hover:opacity-90",
  ghost: "text-lagoon-700 hover:bg-lagoon-50",
};

/** Large enough for a gloved finger: at least 44 px high. */
export function Button({ variant = "primary", className = "", ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      {...props}
      className={`inline-flex min-h-11 items-center justify-center gap-2 rounded-md px-4 text-base font-semibold transition-colors disabled:cursor-not-allowed ${STYLES[variant]} ${className}`}
    />
  );
}
