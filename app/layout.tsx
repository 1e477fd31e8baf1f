import type { Metadata } from "next";
import type { ReactNode } from "react";
import { plexMono, plexSans } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Stokeline", template: "%s · Stokeline" },
  description: "Check a chip layout's channel hydraulics and flow regime, review it and clear it for tape-out.",
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen font-sans">{children}</body>
    </html>
  );
}
