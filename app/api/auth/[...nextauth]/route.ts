// Auth.js's own endpoints (sign-in, sign-out, session, CSRF). They sit before the gate by nature.
export { GET, POST } from "@/lib/auth/handlers";
