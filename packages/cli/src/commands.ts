// Registers the subcommands beyond `compute`. One import per subcommand module; each module calls registerCommand.
import './kernel';
import './lab';
import './run';
export {};
