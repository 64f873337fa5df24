# Sourced by the benchmark and load scripts: a fresh stack for the current TEST_SLOT (database recreated,
# fakes emptied, migrations, a production build, the app served in the background). Sets APP_PID; the app and
# fakes stop when the calling script exits. Expects ROOT as the working directory and storage/profile.sh sourced.
bash db/postgres.sh up
bash db/postgres.sh recreatedb "$COUNTERSIGN_DB"
bash storage/fakes.sh down "$COUNTERSIGN_RUN" >/dev/null || true
rm -rf "storage/.data/$COUNTERSIGN_RUN"
bash storage/fakes.sh up "$COUNTERSIGN_RUN"
tsx db/migrate.ts up
mkdir -p ".run/$COUNTERSIGN_RUN"
react-router build >".run/build-$COUNTERSIGN_RUN.log" 2>&1 || { cat ".run/build-$COUNTERSIGN_RUN.log"; exit 1; }
HOST=127.0.0.1 PORT=$APP_PORT node storage/serve.mjs "$COUNTERSIGN_BUILD_DIR/server/index.js" >".run/$COUNTERSIGN_RUN/app.log" 2>&1 &
APP_PID=$!
trap 'kill $APP_PID 2>/dev/null || true; bash storage/fakes.sh down "$COUNTERSIGN_RUN" >/dev/null || true' EXIT
for _ in $(seq 1 150); do (exec 3<>"/dev/tcp/127.0.0.1/$APP_PORT") 2>/dev/null && break; sleep 0.1; done
