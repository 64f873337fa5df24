import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // A separate folder per parallel test stack (storage/profile.sh); `build` otherwise.
  buildDirectory: process.env.COUNTERSIGN_BUILD_DIR ?? "build",
  future: { v8_middleware: true },
} satisfies Config;
