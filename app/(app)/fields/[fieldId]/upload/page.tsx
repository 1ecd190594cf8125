import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { listMachines } from "@/db/queries/machines";
import { listControlMarks, listSurveyPlans } from "@/db/queries/survey-plans";
import { CAN_PREPARE } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import { FieldSafetyNote, PageTitle } from "@/app/_components/ui";
import { UploadFlow } from "@/app/_components/upload/upload-flow";

export const metadata: Metadata = { title: "Upload a file" };

const KindParam = z.object({ kind: z.enum(["planted", "survey"]).catch("planted") });

const TITLE = { planted: "As-planted records", survey: "Survey checkpoints" } as const;

export default async function UploadPage({
  params,
  searchParams,
}: {
  params: Promise<{ fieldId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const viewer = await requirePageViewer(CAN_PREPARE);
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const field = await getFieldById(await getDb(), { id: fieldId, orgId: viewer.orgId });
  if (!field) notFound();
  const { kind } = KindParam.parse(await searchParams);
  const machines = kind === "planted" ? await listMachines(await getDb(), { orgId: viewer.orgId }) : undefined;
  const fieldwork =
    kind === "survey"
      ? await Promise.all([
          listSurveyPlans(await getDb(), { orgId: viewer.orgId, fieldId: field.id }),
          listControlMarks(await getDb(), { orgId: viewer.orgId, fieldId: field.id }),
        ]).then(([plans, marks]) => ({
          plans: plans.map((p) => ({ id: p.id, name: p.name, checkpoints: p.checkpoints })),
          marks,
        }))
      : undefined;
  return (
    <>
      <PageTitle
        sub={
          <>
            <Link href={`/fields/${field.id}`} className="text-leaf hover:underline">
              {field.name}
            </Link>{" "}
            · {field.farm} · {field.crs}
          </>
        }
      >
        Upload {TITLE[kind].toLowerCase()}
      </PageTitle>
      <nav aria-label="Kind of file" className="mb-6 flex gap-2 text-sm">
        {(["planted", "survey"] as const).map((k) => (
          <Link
            key={k}
            href={`/fields/${field.id}/upload?kind=${k}`}
            aria-current={k === kind ? "page" : undefined}
            className={`rounded-plot border px-3 py-1.5 font-medium ${k === kind ? "border-leaf bg-leaf text-white" : "border-chalk-line bg-white text-ink hover:border-leaf"}`}
          >
            {TITLE[k]}
          </Link>
        ))}
      </nav>
      {kind === "survey" ? (
        <div className="mb-6">
          <FieldSafetyNote />
        </div>
      ) : null}
      <UploadFlow
        key={kind}
        field={{ id: field.id, name: field.name, crs: field.crs }}
        kind={kind}
        machines={machines?.map((m) => ({ id: m.id, name: m.name, toolArms: m.toolArms }))}
        fieldwork={fieldwork}
      />
    </>
  );
}
