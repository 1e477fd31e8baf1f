import type { ReactNode } from "react";
import { QueryProvider } from "@/components/query-provider";

export default function SettingsLayout({ children }: { children: ReactNode }) {
  return <QueryProvider>{children}</QueryProvider>;
}
