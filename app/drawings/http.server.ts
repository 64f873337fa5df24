// Drawing-register routes leave through the shared failure handling (app/platform/failures.server.ts).
export { describeFailure, forApi, forPage, STORAGE_DOWN } from "../platform/failures.server";
