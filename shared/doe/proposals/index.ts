// Next-build proposals from a fitted response surface.
export {
  proposeBuilds,
  type ProposeInput,
  type Proposal,
  type ProposalGoal,
  type ProposalStrategy,
  type ProposalReasonKind,
  type ProposalConstraints,
  type ProposalKind,
} from './propose';
export { candidateSet, type Candidate, type CandidatePlan } from './candidates';
