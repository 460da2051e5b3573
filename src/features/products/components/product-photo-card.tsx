import { useEffect, useId, useRef, useState } from 'react'
import { PHOTO_MAX_BYTES } from '@shared/schemas/products'
import type { ProductRow } from '@shared/schemas/products'
import { Button, buttonClasses } from '@/components/ui/button'
import { Card, CardBody, CardHeader } from '@/components/ui/card'
import { FormError } from '@/components/ui/form-error'
import { toast } from '@/components/ui/toast'
import { useRemoveProductPhoto, useUploadProductPhoto } from '@/features/products/api/product-photo'
import { ProductTile } from '@/features/products/components/product-tile'
import { ApiError } from '@/lib/api-client'

const ACCEPT = 'image/jpeg,image/png,image/webp'

function kb(bytes: number) {
  return bytes >= 1024 * 1024
    ? `${(bytes / 1024 / 1024).toFixed(1)} MB`
    : `${Math.max(1, Math.round(bytes / 1024))} KB`
}

/** The product photo: the current one (or the SKU tile), a chosen file's preview, upload and removal. */
export function ProductPhotoCard({ product }: { product: ProductRow }) {
  const upload = useUploadProductPhoto(product.id)
  const remove = useRemoveProductPhoto(product.id)
  const inputId = useId()
  const inputRef = useRef<HTMLInputElement>(null)
  const [file, setFile] = useState<File | null>(null)
  const [preview, setPreview] = useState<string | null>(null)
  const [error, setError] = useState<string | null>(null)

  useEffect(() => {
    if (!file) return setPreview(null)
    const url = URL.createObjectURL(file)
    setPreview(url)
    return () => URL.revokeObjectURL(url)
  }, [file])

  const clear = () => {
    setFile(null)
    if (inputRef.current) inputRef.current.value = ''
  }

  const choose = (chosen: File | null) => {
    setError(null)
    if (chosen && chosen.size > PHOTO_MAX_BYTES) {
      setError(`That file is ${kb(chosen.size)}; a photo may be at most 2 MB.`)
      clear()
      return
    }
    setFile(chosen)
  }

  const send = async () => {
    if (!file) return
    setError(null)
    try {
      await upload.mutateAsync(file)
      toast.success('Photo saved.')
      clear()
    } catch (err) {
      setError(err instanceof ApiError ? (err.fieldErrors[0]?.message ?? err.message) : 'The upload failed.')
    }
  }

  return (
    <Card>
      <CardHeader
        title="Photo"
        description="JPEG, PNG or WebP, up to 2 MB. Shops see it in the catalogue."
        as="h2"
      />
      <CardBody className="flex flex-col gap-4">
        <div className="flex justify-center">
          {preview ? (
            <img
              src={preview}
              alt={`Preview of the new photo for ${product.name}`}
              className="aspect-square w-full max-w-56 rounded-card object-cover ring-2 ring-olive-300"
            />
          ) : (
            <ProductTile sku={product.sku} name={product.name} photoUrl={product.photo?.url} size="lg" />
          )}
        </div>
        {preview ? <p className="text-center text-sm text-ink-700">Preview: not saved yet.</p> : null}
        {error ? <FormError message={error} /> : null}
        <div className="flex flex-col gap-2">
          <label
            htmlFor={inputId}
            className={buttonClasses(
              'secondary',
              'md',
              'cursor-pointer focus-within:outline-2 focus-within:outline-offset-2 focus-within:outline-olive-600',
            )}
          >
            {product.photo ? 'Choose a new photo' : 'Choose a photo'}
            <input
              ref={inputRef}
              id={inputId}
              type="file"
              accept={ACCEPT}
              className="sr-only"
              onChange={(e) => choose(e.target.files?.[0] ?? null)}
            />
          </label>
          {file ? (
            <div className="flex gap-2">
              <Button className="flex-1" onClick={send} loading={upload.isPending}>
                Upload photo
              </Button>
              <Button
                variant="ghost"
                onClick={() => {
                  setError(null)
                  clear()
                }}
                disabled={upload.isPending}
              >
                Cancel
              </Button>
            </div>
          ) : product.photo ? (
            <Button
              variant="ghost"
              onClick={() => remove.mutate(undefined, { onSuccess: () => toast.success('Photo removed.') })}
              loading={remove.isPending}
            >
              Remove photo
            </Button>
          ) : null}
        </div>
      </CardBody>
    </Card>
  )
}
