#!/usr/bin/env bash
# Drives the bash completion of heatchain-cli as bash would on <Tab>:
# verbs, a verb's options, *.hchain files, substance ids, and the step ids
# of the project named on the line. heatchain-cli must be on PATH.
# usage: completion_test.sh COMPLETION_FILE SAMPLE.hchain
set -uo pipefail
completion="$1" sample="$2"
source /usr/share/bash-completion/bash_completion
source "$completion"
failed=0

# complete WORD... : the candidates for the last word.
complete_line() {
  COMP_WORDS=("$@")
  COMP_CWORD=$((${#COMP_WORDS[@]} - 1))
  COMP_LINE="${COMP_WORDS[*]}"
  COMP_POINT=${#COMP_LINE}
  COMPREPLY=()
  _heatchain_cli heatchain-cli "${COMP_WORDS[COMP_CWORD]}" "${COMP_WORDS[COMP_CWORD - 1]}"
  printf '%s\n' "${COMPREPLY[@]}" | LC_ALL=C sort
}
expect() {
  local what="$1" want="$2"; shift 2
  local got
  got="$(complete_line "$@" | tr '\n' ' ' | sed 's/ $//')"
  if [ "$got" != "$want" ]; then
    echo "completion of '$*' ($what): got '$got', want '$want'"
    failed=1
  fi
}

expect "verbs" "chart check compute" heatchain-cli c
expect "sweep options" "--step" heatchain-cli sweep x.hchain --st
expect "models" "real-fluid reference" heatchain-cli state water --model re
expect "substance ids" "water" heatchain-cli state wat

dir="$(mktemp -d)"
trap 'rm -rf "$dir"' EXIT
cp "$sample" "$dir/plant.hchain"
touch "$dir/notes.txt"
cd "$dir"
expect "project files" "plant.hchain" heatchain-cli compute ""
# Step ids of the named project, read from the installed program.
want="$(heatchain-cli sweep plant.hchain --list-outputs | sed -n 's/^step:\([^ ]*\)\.T_end .*/\1/p' | LC_ALL=C sort | tr '\n' ' ')"
expect "step ids" "$(printf '%s\n' start $want | LC_ALL=C sort | tr '\n' ' ' | sed 's/ $//')" heatchain-cli sweep plant.hchain --step ""
[ -n "$want" ] || { echo "no step ids listed for the sample"; failed=1; }
[ "$failed" = 0 ] && echo "   bash completion: verbs, options, models, substances, files and step ids complete"
exit $failed
