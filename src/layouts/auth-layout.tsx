/** The frame for the signed-out pages (sign-in, forgot and reset password): the mark and one narrow card. */
import type { ReactNode } from "react";
import { Wordmark } from "@/components/brand/wordmark";
import { PublicDemoBanner } from "./public-demo-banner";

export function AuthLayout({ title, intro, children }: { title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <>
      <PublicDemoBanner />
      <div className="flex min-h-screen flex-col items-center bg-grey-50 px-4 pt-[12vh] pb-10">
        <title>{`${title} · Phasebook`}</title>
        <Wordmark className="mb-6 scale-110" />
        <main className="w-full max-w-sm rounded-lg border border-grey-200 bg-white p-6 shadow-sm">
          <h1 className="text-base font-semibold text-grey-900">{title}</h1>
          {intro && <p className="mt-1 text-grey-600">{intro}</p>}
          <div className="mt-4">{children}</div>
        </main>
        <p className="mt-6 max-w-sm text-center text-xs text-grey-500">
          Instruments, stock and recharge for the liquid|liquid electrochemistry facility.
        </p>
      </div>
    </>
  );
}
