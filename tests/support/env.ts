// Where the test profile's services are (exported by storage/profile.sh test; defaults match it).
export const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3100";
export const MAIL_API_URL = process.env.MAIL_API_URL ?? "http://127.0.0.1:1090";
export const DATABASE_URL = process.env.DATABASE_URL ?? "postgres://countersign@127.0.0.1:54329/countersign_test";
