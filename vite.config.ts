import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";
import path from "node:path";
import { publicPageChunks } from "./scripts/chunk-groups";

export default defineConfig(({ isSsrBuild }) => {
  // The browser's chunks follow the public pages that load them (scripts/chunk-groups.ts).
  const chunks = publicPageChunks();
  return {
    plugins: [tailwindcss(), reactRouter(), chunks.plugin],
    resolve: {
      alias: {
        "~": path.resolve(import.meta.dirname, "app"),
        "@shared": path.resolve(import.meta.dirname, "shared"),
      },
    },
    server: { host: "127.0.0.1" },
    build: isSsrBuild ? {} : { rolldownOptions: { output: { codeSplitting: { groups: chunks.groups } } } },
  };
});
