#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Tries both README commands as a newcomer would: in a fresh Debian root made with
# debootstrap, on a fresh clone of the committed HEAD. Needs root and the debootstrap
# package. Usage: scripts/check-fresh-debian.sh [ROOT_DIR] (default /srv/quietrail-fresh).
# An existing ROOT_DIR is reused as the base system; the clone inside it is always fresh.
set -euo pipefail
repo=$(cd "$(dirname "$0")/.." && pwd)
root=${1:-/srv/quietrail-fresh}
suite=bookworm
mirror=${DEBIAN_MIRROR:-http://deb.debian.org/debian}

if [ ! -x "${root}/bin/bash" ]; then
  debootstrap --variant=minbase --include=git,ca-certificates "${suite}" "${root}" "${mirror}"
fi
cp /etc/resolv.conf "${root}/etc/resolv.conf"

mounts=(proc sys dev)
cleanup() { for m in "${mounts[@]}"; do umount -l "${root}/${m}" 2>/dev/null || true; done; }
trap cleanup EXIT
mount -t proc proc "${root}/proc"
mount --rbind /sys "${root}/sys"
mount --rbind /dev "${root}/dev"

rm -rf "${root}/work/quietrail"
mkdir -p "${root}/work"
git clone --quiet "${repo}" "${root}/work/quietrail"
chroot "${root}" /usr/bin/env -i HOME=/root PATH=/usr/sbin:/usr/bin:/sbin:/bin LANG=C.UTF-8 \
  bash -c 'cd /work/quietrail && bash scripts/quickstart.sh && bash scripts/run-tests.sh'
echo "check-fresh-debian: both README commands passed in ${root}"
