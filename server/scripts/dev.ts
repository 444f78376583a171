// npm run dev: the database and API as `npm start`, the client from Vite's dev server (hot reload, /api proxied).
process.env.GAPSIGHT_DEV = '1';
await import('./start.js');
