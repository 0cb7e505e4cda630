import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";
import path from "node:path";

export default defineConfig({
  plugins: [tailwindcss(), reactRouter()],
  resolve: {
    alias: {
      "~": path.resolve(import.meta.dirname, "app"),
      "@shared": path.resolve(import.meta.dirname, "shared"),
    },
  },
  server: { host: "127.0.0.1" },
});
