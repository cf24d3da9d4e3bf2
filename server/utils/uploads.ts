import type { H3Event } from 'h3'

export interface Upload { filename: string, type?: string, data: Buffer, fields: Record<string, string> }

/**
 * Reads a multipart upload with one file field and plain text fields. The declared length is
 * checked before anything is read, and again after, so an oversized body is refused early.
 */
export async function readUpload(event: H3Event, fileField = 'file'): Promise<Upload> {
  const max = Number(useRuntimeConfig(event).uploadMaxBytes)
  const declared = Number(getRequestHeader(event, 'content-length') ?? 0)
  const tooBig = () => createError({ statusCode: 413, message: `file: the upload is larger than ${(max / 1048576).toFixed(0)} MB`, data: { field: fileField } })
  if (declared > max) throw tooBig()
  if (!(getRequestHeader(event, 'content-type') ?? '').startsWith('multipart/form-data')) {
    throw createError({ statusCode: 400, message: `${fileField}: send the scan as multipart/form-data`, data: { field: fileField } })
  }
  const parts = await readMultipartFormData(event)
  const fields: Record<string, string> = {}
  let file: Upload | undefined
  for (const part of parts ?? []) {
    if (!part.name) continue
    if (part.name === fileField && part.filename !== undefined) {
      file = { filename: part.filename, type: part.type, data: part.data, fields }
    }
    else {
      fields[part.name] = part.data.toString('utf8')
    }
  }
  if (!file) throw createError({ statusCode: 400, message: `${fileField}: no file was uploaded`, data: { field: fileField } })
  if (file.data.length > max) throw tooBig()
  if (file.data.length === 0) throw createError({ statusCode: 400, message: `${fileField}: ${file.filename || 'the upload'} is empty (0 bytes)`, data: { field: fileField } })
  return file
}
