// Is a loopback port free, and if not, which process holds it (Linux: /proc/net/tcp* and /proc/*/fd). Node built-ins only.
import fs from 'node:fs';
import net from 'node:net';

/** True when nothing listens on host:port (tries to listen there for a moment). */
export function portFree(port, host = '127.0.0.1') {
	return new Promise((resolve) => {
		const probe = net.createServer();
		probe.once('error', () => resolve(false));
		probe.listen(port, host, () => probe.close(() => resolve(true)));
	});
}

/** The socket inodes listening on a TCP port (any address), from /proc/net/tcp and tcp6. */
function listeningInodes(port) {
	const hex = port.toString(16).toUpperCase().padStart(4, '0');
	const inodes = new Set();
	for (const file of ['/proc/net/tcp', '/proc/net/tcp6']) {
		let text = '';
		try {
			text = fs.readFileSync(file, 'utf8');
		} catch {
			continue;
		}
		for (const line of text.split('\n').slice(1)) {
			const cols = line.trim().split(/\s+/);
			// local address is col 1 (ADDR:PORT), state col 3 (0A = LISTEN), inode col 9
			if (cols.length > 9 && cols[1].endsWith(`:${hex}`) && cols[3] === '0A') inodes.add(cols[9]);
		}
	}
	return inodes;
}

/** The process listening on a port: { pid, command } or null when it cannot be found (another user's, or not Linux). */
export function portHolder(port) {
	const inodes = listeningInodes(port);
	if (inodes.size === 0) return null;
	let pids = [];
	try {
		pids = fs.readdirSync('/proc').filter((d) => /^\d+$/.test(d));
	} catch {
		return null;
	}
	for (const pid of pids) {
		let fds = [];
		try {
			fds = fs.readdirSync(`/proc/${pid}/fd`);
		} catch {
			continue;
		}
		for (const fd of fds) {
			let link = '';
			try {
				link = fs.readlinkSync(`/proc/${pid}/fd/${fd}`);
			} catch {
				continue;
			}
			const m = /^socket:\[(\d+)\]$/.exec(link);
			if (m && inodes.has(m[1])) {
				let command = '';
				try {
					command = fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').filter(Boolean).join(' ');
				} catch {
					// gone meanwhile
				}
				return { pid: Number(pid), command };
			}
		}
	}
	return null;
}

/** A plain sentence about a port in use: which port, which process, and what to do. */
export function portInUseMessage(port, what, variable) {
	const holder = portHolder(port);
	const who = holder ? `process ${holder.pid} (${holder.command || 'unknown command'})` : 'another process (not found: it may belong to another user)';
	const stop = holder ? `stop it (kill ${holder.pid})` : 'stop it';
	return `port ${port} on 127.0.0.1 (${what}) is in use by ${who}: ${stop}, or choose another port with ${variable}=...`;
}
