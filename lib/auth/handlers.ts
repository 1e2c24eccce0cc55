/** Auth.js route handlers, re-exported for app/api/auth/[...nextauth]/route.ts. */
import { handlers } from "./index";

export const { GET, POST } = handlers;
