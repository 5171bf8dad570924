type Props = { kind?: "primary" | "plain" | "danger" } & React.ButtonHTMLAttributes<HTMLButtonElement>;

/** The accent is kept for the one primary action of a page. */
export function Button({ kind = "plain", className, ...rest }: Props) {
  const look = {
    primary: "bg-madder text-sheet hover:bg-madder-dark border border-madder",
    plain: "bg-sheet text-ink border border-rule-strong hover:border-ink",
    danger: "bg-sheet text-madder border border-rule-strong hover:border-madder",
  }[kind];
  return <button className={`px-3.5 py-1.5 text-sm font-medium disabled:opacity-50 ${look} ${className ?? ""}`} {...rest} />;
}
