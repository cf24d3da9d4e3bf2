// Saves a file from the browser: a Blob or a data: URL through a temporary link.
export function downloadFile(name: string, content: Blob | string) {
  const url = typeof content === 'string' ? content : URL.createObjectURL(content)
  const a = document.createElement('a')
  a.href = url
  a.download = name
  document.body.appendChild(a)
  a.click()
  a.remove()
  if (typeof content !== 'string') setTimeout(() => URL.revokeObjectURL(url), 10_000)
}
