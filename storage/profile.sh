# Sourced by the lifecycle scripts: the environment of each local profile. `dev` is what `npm start` serves;
# `test` is what `npm test` and CI use, on other ports and another database so both can run side by side.
# TEST_SLOT=N (1-9) gives a further, separate test stack, so parallel work on one machine never collides.
case "${1:-dev}" in
  dev)
    export COUNTERSIGN_DB=countersign APP_PORT=3000 S3_PORT=4569 SMTP_PORT=1025 MAIL_WEB_PORT=1080
    export S3_BUCKET=${S3_BUCKET:-countersign} COUNTERSIGN_RUN=dev ;;
  test)
    slot=${TEST_SLOT:-0}
    export COUNTERSIGN_DB=countersign_test${slot/#0/} APP_PORT=$((3100 + slot)) S3_PORT=$((4579 + slot * 10))
    export SMTP_PORT=$((1035 + slot * 10)) MAIL_WEB_PORT=$((1090 + slot * 10))
    export S3_BUCKET=countersign-test SESSION_SECRET=test-secret-rotated,test-secret-old
    export COUNTERSIGN_RUN=test${slot/#0/}
    if [ "$slot" != 0 ]; then export COUNTERSIGN_BUILD_DIR=build-slot$slot; fi ;;
esac
export DATABASE_URL=postgres://countersign@127.0.0.1:54329/$COUNTERSIGN_DB
export S3_ENDPOINT=http://127.0.0.1:$S3_PORT
export SMTP_URL=smtp://127.0.0.1:$SMTP_PORT
export MAIL_API_URL=http://127.0.0.1:$MAIL_WEB_PORT
export APP_URL=http://127.0.0.1:$APP_PORT
export COUNTERSIGN_BUILD_DIR=${COUNTERSIGN_BUILD_DIR:-build}
