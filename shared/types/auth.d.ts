// The session carries who the person is, never what they may do: roles are per studio
// and looked up on the server for every request.
declare module '#auth-utils' {
  interface User {
    id: number
    email: string
    name: string
  }
  interface UserSession {
    // The session's id, checked against `user_sessions` on every request (server/utils/sessions.ts).
    sid?: string
    loggedInAt?: number
  }
}
export {}
