// The page: registers the elements and opens the fictional demo study.
import '../../components/index';
import { fictionalStudy } from '../demo/fictionalStudy';

const app = document.querySelector('lurk-app');
if (app) {
  const demo = fictionalStudy();
  app.study = demo.study;
  app.inputs = demo.inputs;
  app.banner = demo.banner;
}
