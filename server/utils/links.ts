import type { H3Event } from 'h3'

/** Absolute base URL for links in e-mails: configured, else the address the request came in on. */
export function baseUrl(event: H3Event): string {
  const configured = useRuntimeConfig(event).publicBaseUrl
  if (configured) return configured.replace(/\/$/, '')
  return getRequestURL(event).origin
}
