import { zodResolver } from '@hookform/resolvers/zod'
import { useEffect, useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { lotUnitCostCents } from '@shared/domain/costing/costing'
import { isoToday } from '@shared/domain/dates/dates'
import { parseMoneyToCents } from '@shared/domain/money/money'
import { toBaseQuantity } from '@shared/domain/units/units'
import {
  INGREDIENT_KIND_LABELS,
  PURCHASE_UNIT_LABELS,
  PurchaseFormSchema,
  baseUnitFor,
  formatBaseQuantity,
  formatUnitCost,
  unitsFor,
} from '@shared/schemas/ingredients'
import type { IngredientKind, PurchaseRow, PurchaseUnit } from '@shared/schemas/ingredients'
import { Button } from '@/components/ui/button'
import { Dialog } from '@/components/ui/dialog'
import { Field, Input, Select, Textarea } from '@/components/ui/field'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useRecordPurchase, useUpdatePurchase } from '@/features/purchases/api/purchases'
import { ApiError } from '@/lib/api-client'
import { applyApiErrors } from '@/lib/form-errors'

type FormIn = z.input<typeof PurchaseFormSchema>
type FormOut = z.output<typeof PurchaseFormSchema>

export type IngredientOption = { id: number; name: string; kind: IngredientKind }

const FIELDS = [
  'ingredientId',
  'supplier',
  'supplierLotCode',
  'receivedOn',
  'quantity',
  'unit',
  'cost',
  'freight',
  'notes',
]
// The API names money in cents; the form types it as money.
const FORM_FIELD: Record<string, string> = { costCents: 'cost', freightCents: 'freight' }

const browserToday = () => isoToday(new Date(), Intl.DateTimeFormat().resolvedOptions().timeZone)
const money = (cents: number) => (cents / 100).toFixed(2)

function defaults(
  purchase: PurchaseRow | null | undefined,
  ingredient: IngredientOption | undefined,
): FormIn {
  if (purchase) {
    return {
      ingredientId: String(purchase.ingredientId),
      supplier: purchase.supplier,
      supplierLotCode: purchase.supplierLotCode ?? '',
      receivedOn: purchase.receivedOn,
      quantity: String(purchase.enteredQuantity),
      unit: purchase.enteredUnit,
      cost: money(purchase.costCents),
      freight: purchase.freightCents ? money(purchase.freightCents) : '',
      notes: purchase.notes ?? '',
    }
  }
  return {
    ingredientId: ingredient ? String(ingredient.id) : '',
    supplier: '',
    supplierLotCode: '',
    receivedOn: browserToday(),
    quantity: '',
    unit: ingredient?.kind === 'packaging' ? 'each' : 'kg',
    cost: '',
    freight: '',
    notes: '',
  }
}

function numberOf(v: unknown): number | null {
  const n = typeof v === 'number' ? v : typeof v === 'string' && v.trim() !== '' ? Number(v) : NaN
  return Number.isFinite(n) ? n : null
}

type Props = {
  open: boolean
  onClose: () => void
  /** The ingredients a purchase may be for (active ones). */
  ingredients: IngredientOption[]
  /** Known suppliers, offered as suggestions. */
  suppliers?: string[]
  /** Editing this purchase; a new one when absent. */
  purchase?: PurchaseRow | null
  /** Preselects the ingredient of a new purchase. */
  ingredientId?: number
  currency: string
  onSaved?: (purchase: PurchaseRow) => void
}

/** Record (or correct) a purchase: the quantity converts to grams and the unit cost shows as you type. */
export function PurchaseDialog({
  open,
  onClose,
  ingredients,
  suppliers = [],
  purchase,
  ingredientId,
  currency,
  onSaved,
}: Props) {
  const record = useRecordPurchase()
  const update = useUpdatePurchase()
  const saving = record.isPending || update.isPending
  const [formError, setFormError] = useState<string | null>(null)
  const preselected = ingredients.find((i) => i.id === ingredientId)
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(PurchaseFormSchema),
    defaultValues: defaults(purchase, preselected),
  })
  const { errors } = form.formState

  useEffect(() => {
    if (open) {
      form.reset(
        defaults(
          purchase,
          ingredients.find((i) => i.id === ingredientId),
        ),
      )
      setFormError(null)
    }
    // Reset only when the dialog opens.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [open])

  const chosenId = numberOf(form.watch('ingredientId'))
  const chosen = ingredients.find((i) => i.id === chosenId)
  const units = chosen ? unitsFor(chosen.kind) : (['g', 'kg', 'oz', 'lb', 'each'] as const)
  const unit = form.watch('unit') as PurchaseUnit
  const quantity = numberOf(form.watch('quantity'))
  const costCents = parseMoneyToCents(form.watch('cost') ?? '')
  const freightText = form.watch('freight') ?? ''
  const freightCents = freightText.trim() === '' ? 0 : parseMoneyToCents(freightText)

  // A unit the chosen ingredient cannot be bought in moves to one it can.
  useEffect(() => {
    if (chosen && !unitsFor(chosen.kind).includes(unit)) {
      form.setValue('unit', chosen.kind === 'packaging' ? 'each' : 'kg')
    }
  }, [chosen, unit, form])

  const unitFits = units.includes(unit)
  const base = quantity !== null && quantity > 0 && unitFits ? toBaseQuantity(quantity, unit) : null
  const baseUnit = chosen ? baseUnitFor(chosen.kind) : base?.baseUnit
  const unitCost =
    base && base.quantity > 0 && costCents !== null && freightCents !== null
      ? lotUnitCostCents({ quantity: base.quantity, costCents: costCents + freightCents })
      : null

  const close = () => {
    if (!saving) onClose()
  }

  const submit = form.handleSubmit(async (values) => {
    setFormError(null)
    try {
      const { purchase: saved } = purchase
        ? await update.mutateAsync({ id: purchase.id, ...values })
        : await record.mutateAsync(values)
      toast.success(purchase ? 'Purchase saved.' : `Purchase of ${saved.ingredientName} recorded.`)
      onSaved?.(saved)
      onClose()
    } catch (err) {
      const renamed =
        err instanceof ApiError
          ? new ApiError(
              err.status,
              err.code,
              err.message,
              err.fieldErrors.map((d) => ({ ...d, field: FORM_FIELD[d.field] ?? d.field })),
            )
          : err
      setFormError(applyApiErrors(renamed, form.setError, FIELDS))
    }
  })

  return (
    <Dialog
      open={open}
      onClose={close}
      title={purchase ? 'Correct this purchase' : 'Record a purchase'}
      description="Enter it as the supplier’s invoice shows it; stock is kept in grams (or items for packaging)."
      size="lg"
      dismissible={!saving}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={saving}>
            Cancel
          </Button>
          <Button type="submit" form="purchase-form" loading={saving}>
            {purchase ? 'Save changes' : 'Record purchase'}
          </Button>
        </>
      }
    >
      <form id="purchase-form" onSubmit={submit} noValidate className="grid gap-4 sm:grid-cols-2">
        {formError ? <FormError message={formError} className="sm:col-span-2" /> : null}
        <Field label="Ingredient" error={errors.ingredientId?.message} className="sm:col-span-2">
          <Select {...form.register('ingredientId')}>
            <option value="">Choose an ingredient…</option>
            {ingredients.map((i) => (
              <option key={i.id} value={i.id}>
                {i.name} ({INGREDIENT_KIND_LABELS[i.kind].toLowerCase()})
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Supplier" error={errors.supplier?.message}>
          <Input autoComplete="off" list="purchase-suppliers" {...form.register('supplier')} />
        </Field>
        <datalist id="purchase-suppliers">
          {suppliers.map((s) => (
            <option key={s} value={s} />
          ))}
        </datalist>
        <Field label="Supplier lot code" optional error={errors.supplierLotCode?.message}>
          <Input autoComplete="off" {...form.register('supplierLotCode')} />
        </Field>
        <Field label="Received on" error={errors.receivedOn?.message}>
          <Input type="date" max={browserToday()} {...form.register('receivedOn')} />
        </Field>
        <div className="grid grid-cols-[1fr_auto] gap-3 sm:col-span-2 sm:max-w-md">
          <Field label="Quantity" error={errors.quantity?.message}>
            <Input inputMode="decimal" autoComplete="off" {...form.register('quantity')} />
          </Field>
          <Field label="Unit" error={errors.unit?.message} className="w-44">
            <Select {...form.register('unit')}>
              {units.map((u) => (
                <option key={u} value={u}>
                  {PURCHASE_UNIT_LABELS[u]}
                </option>
              ))}
            </Select>
          </Field>
        </div>
        <p
          className="-mt-2 text-sm text-ink-700 sm:col-span-2"
          aria-live="polite"
          data-testid="purchase-conversion"
        >
          {base
            ? base.baseUnit === 'each'
              ? `${formatBaseQuantity(base.quantity, 'each')} go into stock.`
              : `= ${base.quantity.toLocaleString('en-US', { maximumFractionDigits: 2 })} g (${formatBaseQuantity(base.quantity, 'g')}) into stock.`
            : 'The quantity converts to grams as you type (1 lb = 453.59237 g, 1 oz = 28.349523125 g).'}
        </p>
        <Field
          label="Cost"
          hint="The invoice total for this item, such as 168.00."
          error={errors.cost?.message}
        >
          <Input inputMode="decimal" autoComplete="off" {...form.register('cost')} />
        </Field>
        <Field
          label="Freight"
          optional
          hint="Shipping charged for it; part of its cost."
          error={errors.freight?.message}
        >
          <Input inputMode="decimal" autoComplete="off" {...form.register('freight')} />
        </Field>
        <p
          className="-mt-1 rounded-md bg-cream-100 px-3 py-2 text-sm text-ink-800 sm:col-span-2"
          aria-live="polite"
          data-testid="purchase-unit-cost"
        >
          {unitCost !== null && baseUnit
            ? `Unit cost: ${formatUnitCost(unitCost, baseUnit, currency)}, freight included.`
            : 'Unit cost appears here: (cost + freight) ÷ quantity.'}
        </p>
        <Field label="Notes" optional error={errors.notes?.message} className="sm:col-span-2">
          <Textarea rows={2} {...form.register('notes')} />
        </Field>
      </form>
    </Dialog>
  )
}
