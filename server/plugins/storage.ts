import fsDriver from 'unstorage/drivers/fs'
import s3Driver from 'unstorage/drivers/s3'

// Uploaded scans and the fake outbox live in Nitro storage. Locally both are folders under the
// configured storage directory; with NUXT_STORAGE_DRIVER=s3 the scans go to an object store
// (any S3-compatible service) and nothing else in the app changes.
export default defineNitroPlugin(() => {
  const { storageDir, storageDriver, s3 } = useRuntimeConfig()
  const storage = useStorage()
  if (storageDriver === 's3') {
    storage.mount('scans', s3Driver({ accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey, endpoint: s3.endpoint, bucket: s3.bucket, region: s3.region }))
  }
  else {
    storage.mount('scans', fsDriver({ base: `${storageDir}/scans` }))
  }
  storage.mount('outbox', fsDriver({ base: `${storageDir}/outbox` }))
})
