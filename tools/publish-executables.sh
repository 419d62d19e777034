#!/usr/bin/env bash
# Builds self-contained single-file executables of itemreduce (no .NET needed to run them) into dist/RID/:
#   dist/linux-x64/itemreduce, dist/win-x64/itemreduce.exe, dist/osx-arm64/itemreduce
# Usage: tools/publish-executables.sh [RID ...]   (default: linux-x64 win-x64 osx-arm64)
# Needs the .NET 10 SDK and network access to NuGet for the runtime packs. The macOS file is not signed: on a Mac,
# clear the quarantine flag (xattr -d com.apple.quarantine itemreduce) or sign it before first use.
set -euo pipefail
cd "$(dirname "$0")/.."
export DOTNET_CLI_TELEMETRY_OPTOUT=1 DOTNET_NOLOGO=1
rids=("$@")
[ ${#rids[@]} -gt 0 ] || rids=(linux-x64 win-x64 osx-arm64)
for rid in "${rids[@]}"; do
  echo "publish-executables: $rid"
  dotnet publish src/ItemReduce.Cli/ItemReduce.Cli.csproj -c Release -r "$rid" --self-contained true \
    -p:PublishSingleFile=true -p:PublishReadyToRun=true -p:IncludeNativeLibrariesForSelfExtract=true -p:PackAsTool=false \
    -p:DebugType=none -p:GenerateDocumentationFile=false -o "dist/$rid"
done
ls -l dist/*/itemreduce*
