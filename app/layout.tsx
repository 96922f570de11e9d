import type { Metadata } from "next";
import "@fontsource/nunito/400.css";
import "@fontsource/nunito/600.css";
import "@fontsource/nunito/700.css";
import "@fontsource/nunito/800.css";
import "./globals.css";
import { Providers } from "@/components/providers";

export const metadata: Metadata = {
  title: { default: "Joulepath", template: "%s · Joulepath" },
  description: "Design, test and watch the rules that tie battery-free switches and sensors to a building's lights, fans and notices.",
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en">
      <body className="min-h-screen bg-fog font-sans text-ink antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
