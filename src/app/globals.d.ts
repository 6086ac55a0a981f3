/// <reference types="vite-plugin-pwa/vanillajs" />

/** package.json's version, put in by Vite (vite.config.ts `define`). */
declare const __APP_VERSION__: string;
