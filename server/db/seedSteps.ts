/**
 * Imports every seed step module in the order the steps run. Add one import line for a new step module.
 */
import './seedProduction';
import './seedDemo';
import './seedFamilies';
import './seedDemand';
