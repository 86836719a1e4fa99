// The sealed session cookie carries only the user id and session version;
// role and disabled state are re-read from the database on every request.
declare module '#auth-utils' {
  interface User {
    id: number
    sv: number
  }
}

export {}
