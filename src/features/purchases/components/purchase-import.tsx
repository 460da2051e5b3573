import { useId, useMemo, useRef, useState } from 'react'
import { Link } from 'react-router-dom'
import { toCsv } from '@shared/domain/csv/csv'
import { formatDate } from '@shared/domain/dates/dates'
import { IMPORT_COLUMNS, IMPORT_MAX_ROWS, REQUIRED_IMPORT_COLUMNS } from '@shared/schemas/ingredients'
import type { ImportColumn, ImportPreview, ImportResult, ImportRow } from '@shared/schemas/ingredients'
import { Badge } from '@/components/ui/badge'
import { Button, LinkButton } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { DataTable, dataTableColumnHelper } from '@/components/ui/data-table'
import { Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { paths } from '@/config/paths'
import { useConfirmImport, usePreviewImport } from '@/features/purchases/api/purchases'
import type { ImportSource } from '@/features/purchases/api/purchases'
import { ApiError } from '@/lib/api-client'
import { cn } from '@/lib/cn'

/** A sample in the demo studio's own terms: a quoted amount with a comma, an empty freight, items for packaging. */
export const SAMPLE_CSV = toCsv([
  [...IMPORT_COLUMNS],
  ['Olive oil', 'Greenfield Oil Traders', 'GOT-2611-310', '2026-11-16', '20', 'kg', '171.00', '14.50'],
  ['Shea butter', 'Northway Soap Supply', 'NSS-SB-1118', '2026-11-18', '11', 'lb', '64.50', ''],
  ['Coconut oil', 'Greenfield Oil Traders', 'GOT-2611-322', '2026-11-16', '150', 'kg', '$1,050.00', '60.00'],
  ['Paper label', 'Foldline Packaging', 'FP-LB-26-11', '2026-11-20', '2000', 'each', '60.00', ''],
])

const COLUMN_LABELS: Record<ImportColumn, string> = {
  ingredient: 'Ingredient',
  supplier: 'Supplier',
  lot_code: 'Lot code',
  received_on: 'Received on',
  quantity: 'Quantity',
  unit: 'Unit',
  cost: 'Cost',
  freight: 'Freight',
}

const col = dataTableColumnHelper<ImportRow>()

function keyOf(source: ImportSource | null): string {
  if (!source) return ''
  return 'text' in source
    ? `text:${source.text}`
    : `file:${source.file.name}:${source.file.size}:${source.file.lastModified}`
}

/** Paste or upload a CSV of purchases, check every row, and import them all at once. */
export function PurchaseImport({ onImported }: { onImported?: (result: ImportResult) => void }) {
  const fileId = useId()
  const textId = useId()
  const fileInput = useRef<HTMLInputElement>(null)
  const [text, setText] = useState('')
  const [file, setFile] = useState<File | null>(null)
  const [preview, setPreview] = useState<ImportPreview | null>(null)
  const [previewedKey, setPreviewedKey] = useState('')
  const [problem, setProblem] = useState<string | null>(null)
  const [result, setResult] = useState<ImportResult | null>(null)
  const check = usePreviewImport()
  const confirm = useConfirmImport()

  const source: ImportSource | null = file ? { file } : text.trim() ? { text } : null
  const stale = preview !== null && previewedKey !== keyOf(source)
  const canConfirm = preview !== null && !stale && preview.errorCount === 0 && preview.validCount > 0

  const columns = useMemo(
    () =>
      col.columns([
        col.accessor('line', { header: 'Line', meta: { align: 'end' } }),
        // Right after the line number, so a problem is seen without scrolling sideways.
        col.accessor((r) => r.errors.map((e) => e.message).join(' '), {
          id: 'problems',
          header: 'Check',
          meta: { wrap: true, className: 'min-w-64' },
          cell: (cell) => {
            const errors = cell.row.original.errors
            if (errors.length === 0) return <Badge tone="green">Ready</Badge>
            return (
              <ul className="flex flex-col gap-1 text-clay-700">
                {errors.map((e) => (
                  <li key={e.field}>
                    <span className="font-medium">
                      {e.field === 'line' ? 'Line' : COLUMN_LABELS[e.field]}:
                    </span>{' '}
                    {e.message}
                  </li>
                ))}
              </ul>
            )
          },
        }),
        ...IMPORT_COLUMNS.map((c) =>
          col.accessor((r) => r.values[c], {
            id: c,
            header: COLUMN_LABELS[c],
            cell: (cell) => {
              const bad = cell.row.original.errors.some((e) => e.field === c)
              const value = cell.getValue()
              return (
                <span
                  className={cn(
                    'rounded px-1.5 py-0.5',
                    bad && 'bg-clay-100 font-medium text-clay-700 ring-1 ring-clay-300',
                  )}
                >
                  {value === '' ? <span className="text-ink-500">{bad ? '(empty)' : '—'}</span> : value}
                  {bad ? <span className="sr-only"> (needs attention)</span> : null}
                </span>
              )
            },
          }),
        ),
      ]),
    [],
  )

  function reset() {
    setPreview(null)
    setProblem(null)
    setResult(null)
  }

  async function runCheck() {
    if (!source) {
      setProblem('Choose a CSV file, or paste the CSV text, first.')
      return
    }
    reset()
    try {
      const p = await check.mutateAsync(source)
      setPreview(p)
      setPreviewedKey(keyOf(source))
    } catch (err) {
      setProblem(messageOf(err))
    }
  }

  async function runImport() {
    if (!source || !canConfirm) return
    setProblem(null)
    try {
      const r = await confirm.mutateAsync(source)
      toast.success(`${r.count} ${r.count === 1 ? 'purchase' : 'purchases'} imported.`)
      setResult(r)
      setPreview(null)
      setText('')
      setFile(null)
      if (fileInput.current) fileInput.current.value = ''
      onImported?.(r)
    } catch (err) {
      if (err instanceof ApiError && err.code === 'import_invalid') {
        // Something changed since the check (a name, an archive): check again to show where.
        await runCheck()
        setProblem(err.message)
      } else setProblem(messageOf(err))
    }
  }

  return (
    <div className="flex flex-col gap-6">
      <Card>
        <CardHeader
          title="Your CSV"
          description={`Upload a file or paste the text. Up to ${IMPORT_MAX_ROWS} purchases and 1 MB; nothing is saved until you confirm.`}
        />
        <CardBody className="flex flex-col gap-4">
          <div className="flex flex-col gap-1.5">
            <label htmlFor={fileId} className="text-sm font-medium text-ink-800">
              CSV file
            </label>
            <input
              ref={fileInput}
              id={fileId}
              type="file"
              accept=".csv,text/csv,text/plain"
              onChange={(e) => {
                const f = e.target.files?.[0] ?? null
                setFile(f)
                if (f) setText('')
                reset()
              }}
              className="block w-full text-sm text-ink-800 file:mr-3 file:rounded-md file:border file:border-ink-300 file:bg-white file:px-3 file:py-2 file:text-sm file:font-medium file:text-ink-800 hover:file:bg-cream-50"
            />
          </div>
          <div className="flex flex-col gap-1.5">
            <label htmlFor={textId} className="text-sm font-medium text-ink-800">
              Or paste the CSV
            </label>
            <Textarea
              id={textId}
              rows={8}
              spellCheck={false}
              className="font-mono text-sm"
              value={text}
              placeholder={IMPORT_COLUMNS.join(',')}
              onChange={(e) => {
                setText(e.target.value)
                if (file) {
                  setFile(null)
                  if (fileInput.current) fileInput.current.value = ''
                }
              }}
            />
          </div>
          {problem ? <FormError title="The CSV cannot be imported yet" message={problem} /> : null}
          <div className="flex flex-wrap gap-2">
            <Button onClick={runCheck} loading={check.isPending}>
              Check the CSV
            </Button>
            <Button
              variant="secondary"
              onClick={() => {
                setFile(null)
                if (fileInput.current) fileInput.current.value = ''
                setText(SAMPLE_CSV)
                reset()
              }}
            >
              Paste the sample
            </Button>
          </div>
        </CardBody>
      </Card>

      {preview ? (
        <section aria-labelledby="import-preview" className="flex flex-col gap-3">
          <div className="flex flex-col gap-3 sm:flex-row sm:items-center sm:justify-between">
            <div>
              <h2 id="import-preview" className="text-lg font-medium text-ink-900">
                Check before importing
              </h2>
              <p className="text-sm text-ink-700" role="status">
                {preview.validCount} {preview.validCount === 1 ? 'row is' : 'rows are'} ready
                {preview.errorCount > 0
                  ? `; ${preview.errorCount} ${preview.errorCount === 1 ? 'needs' : 'need'} attention. Fix them in the CSV and check again.`
                  : '.'}
                {stale ? ' The CSV changed since this check: check it again.' : ''}
              </p>
            </div>
            <Button onClick={runImport} disabled={!canConfirm} loading={confirm.isPending}>
              Confirm import
            </Button>
          </div>
          <DataTable
            label="Rows of the CSV"
            columns={columns}
            data={preview.rows}
            getRowId={(r) => String(r.line)}
          />
        </section>
      ) : null}

      {result ? (
        <Card>
          <CardHeader
            title={`${result.count} ${result.count === 1 ? 'purchase' : 'purchases'} imported`}
            actions={
              <LinkButton variant="secondary" size="sm" to={paths.owner.purchases}>
                See all purchases
              </LinkButton>
            }
          />
          <CardBody>
            <ul className="flex flex-col gap-1 text-sm">
              {result.purchases.map((p) => (
                <li key={p.id}>
                  <Link
                    to={paths.owner.purchase(p.id)}
                    className="font-medium text-olive-800 hover:underline"
                  >
                    {p.ingredientName}, {p.supplierLotCode ?? `purchase #${p.id}`}
                  </Link>{' '}
                  · {p.supplier} · received {formatDate(p.receivedOn)}
                </li>
              ))}
            </ul>
          </CardBody>
        </Card>
      ) : null}

      <Card>
        <CardHeader title="The columns" description="A header row first; names in any case and order." />
        <CardBody className="flex flex-col gap-4 text-sm text-ink-800">
          <ul className="grid gap-1 sm:grid-cols-2">
            <li>
              <b>ingredient</b> — an ingredient’s name as on the Ingredients page
            </li>
            <li>
              <b>supplier</b> — who sold it
            </li>
            <li>
              <b>lot_code</b> — the supplier’s lot code (may be empty)
            </li>
            <li>
              <b>received_on</b> — the date, as YYYY-MM-DD; not in the future
            </li>
            <li>
              <b>quantity</b> and <b>unit</b> — g, kg, oz or lb; each for packaging
            </li>
            <li>
              <b>cost</b> and <b>freight</b> — amounts like 168.00 (freight may be empty)
            </li>
          </ul>
          <p className="text-ink-700">
            Required: {REQUIRED_IMPORT_COLUMNS.join(', ')}. A value with a comma goes in double quotes, as
            spreadsheets write it.
          </p>
          <div>
            <p className="mb-1 font-medium">Sample</p>
            <pre
              className="overflow-x-auto rounded-md bg-cream-100 p-3 font-mono text-xs text-ink-900"
              aria-label="Sample CSV"
            >
              {SAMPLE_CSV}
            </pre>
          </div>
        </CardBody>
      </Card>
    </div>
  )
}

function messageOf(err: unknown): string {
  if (err instanceof ApiError) {
    const details = err.fieldErrors
    return details.length > 0 ? details.map((d) => d.message).join(' ') : err.message
  }
  return err instanceof Error ? err.message : 'Something went wrong.'
}
