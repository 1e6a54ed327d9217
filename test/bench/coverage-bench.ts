// Placeholder replaced by the coverage benchmark (issue: stopping rules).
process.stderr.write('coverage benchmark not built yet\n');
process.exitCode = 1;
