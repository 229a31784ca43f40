# Mullion in production: the API and the built client, served by server/serve.ts.
# Build: docker build -t mullion .    Run with docker compose (see docker-compose.yml).

# --- build: install everything, build the client, keep only runtime dependencies ---
FROM node:20-bookworm-slim AS build
# sqlite3 compiles from source against this image's Node headers (the project's .npmrc
# points at /usr, the machine layout; the official image keeps them under /usr/local).
ENV npm_config_nodedir=/usr/local
RUN apt-get update \
 && apt-get install -y --no-install-recommends python3 make g++ \
 && rm -rf /var/lib/apt/lists/*
# The lockfile and the install-script approvals in package.json are npm 11's; the image ships npm 10.
RUN npm install -g npm@11.19.1
WORKDIR /app
COPY package.json package-lock.json .npmrc ./
RUN npm ci
COPY . .
RUN npm run build \
 && npm prune --omit=dev

# --- runtime ---
FROM node:20-bookworm-slim
ENV NODE_ENV=production \
    PORT=3000 \
    DATABASE_URL=sqlite:/app/data/mullion.sqlite \
    TENANTS_DIR=/app/tenants
WORKDIR /app
COPY --from=build /app/package.json /app/tsconfig.json ./
COPY --from=build /app/node_modules ./node_modules
COPY --from=build /app/dist ./dist
COPY --from=build /app/server ./server
# The server imports the shared domain rules (validation schemas, abilities) from here.
COPY --from=build /app/src/domain ./src/domain
RUN mkdir -p /app/data /app/tenants && chown node:node /app/data /app/tenants
USER node
EXPOSE 3000
VOLUME ["/app/data", "/app/tenants"]
HEALTHCHECK --interval=30s --timeout=5s --start-period=20s \
  CMD node -e "fetch('http://127.0.0.1:' + (process.env.PORT || 3000) + '/api/health').then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))"
# tsx runs the TypeScript server directly (no separate compile step), as `npm start` does.
CMD ["node_modules/.bin/tsx", "server/serve.ts"]
