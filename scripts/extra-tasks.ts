// Tasks beyond start/test: fault injection, fuzzing and the benchmarks that need the running stack.
export const tasks: Record<string, (args: string[]) => Promise<number>> = {};
