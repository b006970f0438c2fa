import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { formatDay } from "@/lib/format/dates";
import { db } from "@/db/setup/client";
import { templatesWithVersions } from "@/db/templates/documents";
import { TemplateImport } from "./_components/template-import";

export const metadata: Metadata = { title: "Procedure templates" };

export default async function TemplatesPage() {
  const user = await requirePageArea("templates");
  const templates = await templatesWithVersions(db(), user.shopId);
  return (
    <AppFrame user={user} current="/office/templates">
      <div className="flex flex-wrap items-center gap-4">
        <h1 className="text-3xl font-bold">Procedure templates</h1>
        <Link
          href="/office/templates/edit"
          className="ml-auto flex min-h-12 items-center rounded-lg bg-steel-900 px-5 text-lg font-bold text-white"
        >
          + New template
        </Link>
      </div>
      <p className="mt-2 max-w-3xl text-lg">
        Saving a template always writes a new version. A job keeps the version it was pinned with when it went in build.
      </p>
      <ul className="mt-6 grid gap-4">
        {templates.map((t) => {
          const latest = t.versions[0];
          return (
            <li key={t.key} className="rounded-xl border-2 border-steel-700 bg-white p-4" data-testid="template">
              <div className="flex flex-wrap items-center gap-3">
                <h2 className="text-2xl font-bold">{latest.name}</h2>
                {latest.exampleOnly && (
                  <span className="rounded border-2 border-warn px-2 font-bold text-warn">
                    ⚠ Example figures — replace with the maker&apos;s data
                  </span>
                )}
              </div>
              <p className="font-mono text-steel-700">{t.key}</p>
              <div className="mt-2 flex flex-wrap gap-3">
                <Link
                  href={`/office/templates/edit?key=${encodeURIComponent(t.key)}`}
                  className="flex min-h-12 items-center rounded-lg border-2 border-steel-700 px-4 font-bold"
                >
                  Edit (new version)
                </Link>
                <a
                  href={`/api/office/templates/${encodeURIComponent(t.key)}?download=1`}
                  className="flex min-h-12 items-center rounded-lg border-2 border-steel-700 px-4 font-bold"
                >
                  Export latest
                </a>
              </div>
              <details className="mt-2">
                <summary className="cursor-pointer font-bold">
                  {t.versions.length} version{t.versions.length === 1 ? "" : "s"}
                </summary>
                <ul className="mt-1">
                  {t.versions.map((v) => (
                    <li key={v.versionId} className="flex flex-wrap items-center gap-3">
                      Version {v.version} · {formatDay(v.createdAt)} · {v.createdByName ?? "—"}
                      <a className="underline" href={`/api/office/templates/${encodeURIComponent(t.key)}?version=${v.version}&download=1`}>
                        export
                      </a>
                    </li>
                  ))}
                </ul>
              </details>
            </li>
          );
        })}
      </ul>
      <section className="mt-8 max-w-3xl rounded-xl border-2 border-steel-300 bg-white p-4">
        <h2 className="text-2xl font-bold">Import templates</h2>
        <p className="mt-1">
          A file of one template or a bundle of several, in Benchtag&apos;s template format (see the README). Nothing is written unless the
          whole file is valid.
        </p>
        <div className="mt-3">
          <TemplateImport />
        </div>
      </section>
    </AppFrame>
  );
}
