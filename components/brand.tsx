import Link from "next/link";

/** The Cuspal word mark: a small cusp shape drawn in our accent colour, and the name. */
export function Brand({ href = "/" }: { href?: string }) {
  return (
    <Link href={href} className="inline-flex items-center gap-2 text-lg font-bold text-ink no-underline hover:no-underline">
      <svg aria-hidden="true" width="26" height="26" viewBox="0 0 26 26">
        <path d="M3 20 C5 8, 9 6, 13 12 C17 6, 21 8, 23 20 Z" fill="#0d6e6e" />
        <path d="M7 20 C8 14, 10 13, 13 16 C16 13, 18 14, 19 20 Z" fill="#f7f5f0" />
      </svg>
      Cuspal
    </Link>
  );
}
