// Multipart upload with progress (fetch cannot report upload progress; XMLHttpRequest can).
export function uploadWithProgress<T>(url: string, form: FormData, onProgress: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('POST', url)
    xhr.responseType = 'json'
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total)
    }
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) resolve(xhr.response as T)
      // Shaped like a fetch error so apiProblem() reads it the same way.
      else reject({ statusCode: xhr.status, data: xhr.response })
    }
    xhr.onerror = () => reject({ message: 'The upload failed: the connection was interrupted.' })
    xhr.send(form)
  })
}
