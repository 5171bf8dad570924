import { type ColumnDef, type SortingState, flexRender, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { Link, useLoaderData, useNavigate, useSearchParams } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/revision";
import { loadRevisionPage } from "~/.server/datasets/dataset-access.server";
import { revisionRowsPage } from "~/.server/datasets/dataset-repository.server";
import { ROW_SORTS } from "~/revision-row-sorts";
import { db } from "~/.server/platform/db.server";
import { Fingerprint } from "~/components/fingerprint";
import { Shape } from "~/components/ui/shape";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { QuickLook } from "~/components/figure-editor/quick-look";
import { loadDatasetInputs } from "~/.server/figures/figure-inputs.server";
import type { QuantityDescription } from "~/datasets";
import { quickLookModel } from "~/figures/starter-model";
import { describeQuantity, displayScale, formatValue } from "~/components/quantity-labels";

const PAGE_SIZE = 50;
const QUICK_LOOK_MAX_ROWS = 5000;
const Query = z.object({
  page: z.coerce.number().int().min(1).catch(1),
  sort: z.enum(ROW_SORTS).catch("idx"),
  dir: z.enum(["asc", "desc"]).catch("asc"),
});

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadRevisionPage(request, params);
  const { dataset, revision } = page;
  const q = Query.parse(Object.fromEntries(new URL(request.url).searchParams));
  const pages = Math.max(1, Math.ceil(revision.row_count / PAGE_SIZE));
  const current = Math.min(q.page, pages);
  const rows = await revisionRowsPage(db, revision.id, { offset: (current - 1) * PAGE_SIZE, limit: PAGE_SIZE, sort: q.sort, dir: q.dir });
  const look = quickLookModel({ id: dataset.id, name: dataset.name, quantity: revision.quantity as unknown as QuantityDescription, revisionNumber: revision.number }, "log");
  // The quick look draws every point in the browser; beyond a few thousand it would only slow the page.
  const lookInputs = revision.row_count <= QUICK_LOOK_MAX_ROWS ? await loadDatasetInputs(db, dataset.manuscript_id, look) : null;
  return { look, lookInputs, ...page, dataset: { id: dataset.id, name: dataset.name, quantity: dataset.quantity, retiredAt: dataset.retired_at }, revision, rows, query: { ...q, page: current }, pages };
}

type Row = Awaited<ReturnType<typeof loader>>["rows"][number];

const fmt = formatValue;

export default function RevisionPage() {
  const { manuscript, role, can, dataset, revision, rows, query, pages, look, lookInputs } = useLoaderData<typeof loader>();
  const [, setParams] = useSearchParams();
  const navigate = useNavigate();
  const has = (k: keyof Row) => rows.some((r) => r[k] != null);
  const scale = displayScale(revision.quantity);
  const fy = (v: number | null) => fmt(v == null ? null : v * scale.yFactor);
  const xu = scale.xUnit ? ` [${scale.xUnit}]` : "";
  // A file with bin edges and no x column: x is each bin's centre (docs/decisions/0013-bins-without-a-centre.md).
  const binCentres = revision.mapping !== null && typeof revision.mapping === "object" && !("x" in revision.mapping);
  const columns: ColumnDef<Row>[] = [
    { id: "idx", accessorKey: "idx", header: "#", cell: (c) => (c.getValue() as number) + 1 },
    { id: "x", accessorKey: "x", header: binCentres ? `x, bin centre${xu}` : `x${xu}`, cell: (c) => fmt(c.getValue() as number) },
    ...(has("x_low") ? [{ id: "x_low", accessorKey: "x_low", header: `bin low${xu}`, enableSorting: false, cell: (c) => fmt(c.getValue() as number) } as ColumnDef<Row>, { id: "x_high", accessorKey: "x_high", header: `bin high${xu}`, enableSorting: false, cell: (c) => fmt(c.getValue() as number) } as ColumnDef<Row>] : []),
    { id: "y", accessorKey: "y", header: `y [${scale.yUnit}]`, cell: (c) => fy(c.getValue() as number) },
    ...(["stat_minus", "stat_plus", "syst_minus", "syst_plus"] as const).filter(has).map((k) => ({ id: k, accessorKey: k, header: k.replace("_", " ").replace("minus", "−").replace("plus", "+"), enableSorting: false, cell: (c) => fy(c.getValue() as number) }) as ColumnDef<Row>),
  ];
  const sorting: SortingState = [{ id: query.sort, desc: query.dir === "desc" }];
  const table = useReactTable({
    data: rows, columns, state: { sorting, pagination: { pageIndex: query.page - 1, pageSize: PAGE_SIZE } },
    manualSorting: true, manualPagination: true, pageCount: pages, getCoreRowModel: getCoreRowModel(),
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const s = next[0] ?? { id: "idx", desc: false };
      setParams({ sort: s.id, dir: s.desc ? "desc" : "asc", page: "1" });
    },
  });
  const goto = (p: number) => navigate(`?sort=${query.sort}&dir=${query.dir}&page=${p}`);
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <p className="text-sm"><Link className="text-ink-soft underline underline-offset-4" to={`/manuscripts/${manuscript.id}/datasets/${dataset.id}`}>{dataset.name}</Link> /</p>
      <h2 className="mt-1 text-2xl">Revision <span className="font-mono">r{revision.number}</span></h2>
      {dataset.retiredAt ? <p className="mt-2 text-sm" data-testid="retired-notice">The dataset “{dataset.name}” is retired: it no longer appears in the dataset lists, but this revision stays readable for the figures that cite it.</p> : null}
      <dl className="mt-2 grid grid-cols-[12rem_1fr] gap-y-1 text-sm">
        <dt className="text-ink-soft">quantity</dt><dd>{describeQuantity(revision.quantity)}</dd>
        {binCentres ? <><dt className="text-ink-soft">x</dt><dd data-testid="bin-centre-note">the centre of each bin: the file gives only the bin edges, and the comparison with a prediction uses the whole bin</dd></> : null}
        <dt className="text-ink-soft">rows</dt><dd className="num">{revision.row_count.toLocaleString("en")}</dd>
        <dt className="text-ink-soft">content fingerprint</dt><dd><Fingerprint value={revision.content_hash} groups={4} /></dd>
        <dt className="text-ink-soft">original file</dt><dd>{revision.raw_filename} · <span className="num">{Number(revision.raw_bytes).toLocaleString("en")}</span> bytes · <Fingerprint value={revision.raw_sha256} /></dd>
      </dl>
      <p className="mt-3 text-xs text-ink-faint">Shown in the dataset's units (8 significant digits); errors are in the unit of y. The revision's fingerprint is taken over its normal form: angles in degrees, t in GeV², energies in GeV, cross sections in GeV⁻² (per sr, per GeV² where they apply), 12 significant digits.</p>
      <div className="mt-4">
        {lookInputs ? <QuickLook model={look} inputs={lookInputs} title={`${dataset.name} r${revision.number}`} />
          : <p className="text-sm text-ink-soft">No quick look: this revision has more than {QUICK_LOOK_MAX_ROWS.toLocaleString("en")} rows. Put it in a figure to draw it.</p>}
      </div>
      <table className="mt-4 w-full text-sm" aria-label={`Rows of r${revision.number}`}>
        <thead className="border-b border-rule text-left">
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id}>
              {g.headers.map((h) => (
                <th key={h.id} className="py-2 pr-4 text-right font-medium" aria-sort={h.column.getIsSorted() ? (h.column.getIsSorted() === "desc" ? "descending" : "ascending") : undefined}>
                  {h.column.getCanSort() ? (
                    <button type="button" onClick={h.column.getToggleSortingHandler()} className="hover:text-madder">
                      {flexRender(h.column.columnDef.header, h.getContext())} <Shape name={h.column.getIsSorted() === "asc" ? "up" : h.column.getIsSorted() === "desc" ? "down" : "up-down"} />
                    </button>
                  ) : flexRender(h.column.columnDef.header, h.getContext())}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody className="num divide-y divide-rule font-mono text-xs">
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id}>{r.getVisibleCells().map((c) => <td key={c.id} className="py-1 pr-4 text-right">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}</tr>
          ))}
        </tbody>
      </table>
      <nav aria-label="Pages" className="mt-4 flex items-center gap-3 text-sm">
        <button type="button" disabled={query.page <= 1} onClick={() => goto(query.page - 1)} className="underline disabled:opacity-40">Previous</button>
        <span>page <span className="num">{query.page}</span> of <span className="num">{pages}</span></span>
        <button type="button" disabled={query.page >= pages} onClick={() => goto(query.page + 1)} className="underline disabled:opacity-40">Next</button>
      </nav>
    </>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `r${data?.revision.number ?? ""} · ${data?.dataset.name ?? ""} · Steradian` }];
