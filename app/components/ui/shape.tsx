/**
 * Small drawn shapes that go with a word (role, state, tone), so that nothing is told by colour
 * alone and nothing depends on a system font having the glyph.
 */
export type ShapeName = "square" | "disc" | "triangle" | "ring" | "diamond" | "check" | "cross" | "dotted-ring" | "up" | "down" | "up-down";

const PATHS: Record<ShapeName, React.ReactNode> = {
  square: <rect x="2" y="2" width="8" height="8" />,
  disc: <circle cx="6" cy="6" r="4.5" />,
  triangle: <path d="M6 1.5 L10.8 10 L1.2 10 Z" />,
  ring: <circle cx="6" cy="6" r="4" fill="none" stroke="currentColor" strokeWidth="1.2" />,
  "dotted-ring": <circle cx="6" cy="6" r="4" fill="none" stroke="currentColor" strokeWidth="1.2" strokeDasharray="1.6 1.6" />,
  diamond: <path d="M6 1 L11 6 L6 11 L1 6 Z" fill="none" stroke="currentColor" strokeWidth="1.1" />,
  check: <path d="M2 6.5 L5 9.5 L10.5 2.5" fill="none" stroke="currentColor" strokeWidth="1.6" />,
  cross: <path d="M2.5 2.5 L9.5 9.5 M9.5 2.5 L2.5 9.5" fill="none" stroke="currentColor" strokeWidth="1.5" />,
  up: <path d="M6 2.5 L10 9 L2 9 Z" />,
  down: <path d="M6 9.5 L10 3 L2 3 Z" />,
  "up-down": <path d="M6 1 L9 5 L3 5 Z M6 11 L9 7 L3 7 Z" opacity="0.45" />,
};

export function Shape({ name, className }: { name: ShapeName; className?: string }) {
  return (
    <svg viewBox="0 0 12 12" width="0.75em" height="0.75em" fill="currentColor" aria-hidden="true" className={`inline-block shrink-0 ${className ?? ""}`}>
      {PATHS[name]}
    </svg>
  );
}
