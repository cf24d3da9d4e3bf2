// What the sealed session cookie carries about the signed-in user (public fields only).
declare module '#auth-utils' {
  interface User {
    id: number
    email: string
    name: string
  }
}

export {}
