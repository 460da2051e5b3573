import { QueryTypes } from 'sequelize'
import type { Transaction } from 'sequelize'
import { sequelize } from '@server/db/sequelize'
import { AppError } from '@server/lib/app-error'
import type { CertificateUpload } from '@server/modules/shops/certificate-file'

/** Stores a checked certificate in `uploads` inside the caller's transaction; returns its id. */
export async function storeCertificate(file: CertificateUpload, uploadedBy: number | null, t: Transaction) {
  const [row] = await sequelize.query<{ id: number }>(
    `INSERT INTO uploads (purpose, filename, content_type, size_bytes, sha256, data, uploaded_by)
     VALUES ('resale_certificate', $1, $2, $3, $4, $5, $6) RETURNING id`,
    {
      bind: [file.filename, file.contentType, file.sizeBytes, file.sha256, file.data, uploadedBy],
      type: QueryTypes.SELECT,
      transaction: t,
    },
  )
  return row!.id
}

const SAFE_TYPES = new Set(['application/pdf', 'image/jpeg', 'image/png'])

/** A shop's current certificate file; 404 when the shop has none. */
export async function readCertificate(shopId: number) {
  const [row] = await sequelize.query<{
    filename: string
    content_type: string
    data: Buffer
    sha256: string
  }>(
    `SELECT u.filename, u.content_type, u.data, u.sha256
       FROM shops s JOIN uploads u ON u.id = s.certificate_upload_id
      WHERE s.id = $1`,
    { bind: [shopId], type: QueryTypes.SELECT },
  )
  if (!row) throw AppError.notFound('That resale certificate')
  return {
    filename: row.filename,
    // Only the types the upload check lets in are ever named; anything else downloads as bytes.
    contentType: SAFE_TYPES.has(row.content_type) ? row.content_type : 'application/octet-stream',
    data: row.data,
    sha256: row.sha256,
  }
}
