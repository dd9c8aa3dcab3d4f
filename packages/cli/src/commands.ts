// Registers the subcommands beyond `compute`. One import per subcommand module; each module calls registerCommand.
export {};
