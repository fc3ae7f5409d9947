/**
 * The notebook's sections, in page order. To add a section: write a component in
 * `src/lib/ui/sections/` (it takes no props and calls `getNotebook()` for the session, the
 * engine pool and the live verdicts) and add one line here. The notebook gives every section
 * its heading, an anchor in the table of contents and its own notes (`plan.sectionNotes[id]`).
 */
import type { Component } from 'svelte';
import QuestionSection from '../sections/QuestionSection.svelte';
import FactorsSection from '../sections/FactorsSection.svelte';
import ReagentsSection from '../sections/ReagentsSection.svelte';
import ContextsSection from '../sections/ContextsSection.svelte';
import BudgetSection from '../sections/BudgetSection.svelte';
import DesignSection from '../sections/DesignSection.svelte';
import VerdictSection from '../sections/VerdictSection.svelte';
import RevisionsSection from '../sections/RevisionsSection.svelte';
import SimulationSection from '../sections/SimulationSection.svelte';
import SizingSection from '../sections/SizingSection.svelte';
import LayoutSection from '../sections/LayoutSection.svelte';
import PilotSection from '../sections/PilotSection.svelte';
import ReportSection from '../sections/ReportSection.svelte';

export interface NotebookSection {
	/** Anchor and key of the section's notes; letters, digits and "-" only. */
	id: string;
	title: string;
	component: Component;
}

export const sections: NotebookSection[] = [
	{ id: 'question', title: 'Question and notes', component: QuestionSection },
	{ id: 'factors', title: 'Factors', component: FactorsSection },
	{ id: 'reagents', title: 'Reagents', component: ReagentsSection },
	{ id: 'contexts', title: 'Contexts', component: ContextsSection },
	{ id: 'budget', title: 'Budget, noise and goal', component: BudgetSection },
	{ id: 'design', title: 'Design to check', component: DesignSection },
	{ id: 'verdicts', title: 'Verdicts', component: VerdictSection },
	{ id: 'simulation', title: 'Simulation', component: SimulationSection },
	{ id: 'sizing', title: 'Sizing', component: SizingSection },
	{ id: 'layout', title: 'Plate layout', component: LayoutSection },
	{ id: 'pilot', title: 'Pilot', component: PilotSection },
	{ id: 'revisions', title: 'Revisions', component: RevisionsSection },
	{ id: 'report', title: 'Report', component: ReportSection }
];
