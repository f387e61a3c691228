/**
 * Why a hand calculation is checked on one board file, and what to do with an installation instead
 * (`trivar check` and `trivar report --hand-figures` both refuse one).
 */
export const HAND_FIGURES_ON_INSTALLATION =
  "a hand calculation is checked on a single board file, one board and its own loads; this is an installation (boards:), where a board also carries the boards it feeds and the drop of the cables before it, which the hand method's steps do not separate. Check one board at a time: write that board as a board file of its own (its loads, its feeder as the cable from the supply, and the installation's supply), then run `trivar check <that file> <hand figures>` or `trivar report <that file> --hand-figures <hand figures>`; `trivar solve` and `trivar correct --board` on the installation give the board's figures in place";
