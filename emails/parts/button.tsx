import { Button } from "@react-email/components";
import { colours } from "./layout";

export function EmailButton({ href, children }: { href: string; children: string }) {
  return (
    <Button href={href} style={{ backgroundColor: colours.accent, color: "#ffffff", borderRadius: 8, padding: "12px 20px", fontWeight: 600, textDecoration: "none" }}>
      {children}
    </Button>
  );
}
