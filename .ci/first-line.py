#!/usr/bin/env python3
"""Time from a command's start to its first output on a terminal (run under `script` for a tty).

Usage: .ci/first-line.py 'java -jar sim/target/hammerstep-sim.jar demo --fast --parts 1' [runs]
Prints, per run: the first byte, the first text, the live view's first frame (its clear-screen
code), the exit code and time, and the 1-minute load average at the start (the machine may be shared).
"""
import subprocess, sys, time, os, select, re
cmd = sys.argv[1]
n = int(sys.argv[2]) if len(sys.argv) > 2 else 3
for i in range(n):
    load = os.getloadavg()[0]
    t0 = time.monotonic()
    p = subprocess.Popen(['script', '-qfec', cmd, '/dev/null'], stdout=subprocess.PIPE, stderr=subprocess.STDOUT,
                         env=dict(os.environ, COLUMNS='80', LINES='24'))
    first_byte = first_text = first_frame = None
    first_snip = b""
    buf = b''
    while True:
        r, _, _ = select.select([p.stdout], [], [], 60)
        if not r:
            break
        chunk = os.read(p.stdout.fileno(), 65536)
        if not chunk:
            break
        now = time.monotonic() - t0
        if first_byte is None:
            first_byte = round(now, 2)
        buf += chunk
        if first_frame is None and b'\x1b[2J' in buf:
            first_frame = now
        if first_text is None and re.search(rb'[A-Za-z]{3,}', re.sub(rb'\x1b\[[0-9;?]*[A-Za-z]', b'', buf)):
            first_text = round(now, 2)
            first_snip = re.sub(rb'\x1b\[[0-9;?]*[A-Za-z]', b' ', buf)[:100]
    p.wait()
    end = time.monotonic() - t0
    print(f"run {i+1}: first byte {first_byte} s, first text {first_text} s, live view's first frame {first_frame if first_frame is None else round(first_frame,2)} s, exit {p.returncode} after {end:.1f} s, load {load:.1f}; first: {first_snip!r}", flush=True)
