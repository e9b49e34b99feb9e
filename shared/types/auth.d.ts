// The sealed session cookie holds ids only; profiles and roles are read from the database per request.
declare module '#auth-utils' {
  interface User {
    id: string
    name: string
    email: string
  }

  interface UserSession {
    /** The practice the person is working in now (one of their memberships). */
    practiceId?: string | null
    loggedInAt?: string
  }

  interface SecureSessionData {
    /** Must equal users.session_version; bumping it ends every other session of that person. */
    version?: number
  }
}

export {}
